namespace CableFault.Analysis;

/// <summary>
/// What the trace tells before any model: its reference plane, levels, edge and noise.
/// Produced by <see cref="TraceConditioner.Characterise"/>.
/// </summary>
/// <param name="TimeZeroSeconds">Time of the 50 % reference level crossing of the incident edge, in seconds on the
/// raw trace's time axis (IEEE Std 181-2011, 5.3.3 reference level instant; linear interpolation between samples).</param>
/// <param name="BaselineVolts">Low state level before the edge, in volts (IEEE Std 181-2011, 5.2.1 histogram mode).</param>
/// <param name="IncidentAmplitudeVolts">Incident step height, in volts, always &gt; 0 (after polarity correction):
/// the state level of the plateau right after the edge minus the baseline, times −1 when inverted.</param>
/// <param name="RiseTimeSeconds">10 %–90 % transition duration, in seconds (IEEE Std 181-2011, 5.3.4).</param>
/// <param name="NoiseRmsVolts">Robust RMS noise estimate, in volts (1.4826 × MAD, see <see cref="NoiseEstimator"/>).</param>
/// <param name="PolarityInverted">True when the incident edge falls (the instrument or leads invert the step).</param>
/// <param name="Clipped">True when flat runs at the extreme sample values show the digitiser saturated.</param>
/// <param name="Warnings">One-line, user-facing warnings about the trace's quality.</param>
public sealed record TraceCharacteristics(
    double TimeZeroSeconds,
    double BaselineVolts,
    double IncidentAmplitudeVolts,
    double RiseTimeSeconds,
    double NoiseRmsVolts,
    bool PolarityInverted,
    bool Clipped,
    IReadOnlyList<string> Warnings)
{
    /// <summary>Polarity sign: +1 for a rising incident edge, −1 for an inverted one.</summary>
    public double PolaritySign => PolarityInverted ? -1.0 : 1.0;

    /// <summary>Noise relative to the incident step (dimensionless): <c>NoiseRmsVolts / IncidentAmplitudeVolts</c>.
    /// One sample of noise in reflection-coefficient units.</summary>
    public double NoiseRelative => IncidentAmplitudeVolts > 0 ? NoiseRmsVolts / IncidentAmplitudeVolts : double.PositiveInfinity;
}
