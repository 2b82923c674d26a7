using CableFault.Traces;

namespace CableFault.Comparison;

/// <summary>Two traces made comparable: aligned, normalised, on one grid, optionally rise-matched.</summary>
internal sealed record PreparedPair(Trace Baseline, Trace Current, double BaselineNoiseRelative, double CurrentNoiseRelative,
    double BaselineRiseSeconds, double CurrentRiseSeconds, bool RiseMatched, IReadOnlyList<string> Warnings);
