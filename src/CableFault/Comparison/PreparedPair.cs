using CableFault.Traces;

namespace CableFault.Comparison;

/// <summary>Two traces made comparable: aligned, normalised, on one grid, optionally rise-matched. The amplitudes are the
/// incident steps as recorded, in volts, before normalising.</summary>
internal sealed record PreparedPair(Trace Baseline, Trace Current, double BaselineNoiseRelative, double CurrentNoiseRelative,
    double BaselineRiseSeconds, double CurrentRiseSeconds, bool RiseMatched, IReadOnlyList<string> Warnings,
    double BaselineAmplitudeVolts, double CurrentAmplitudeVolts);
