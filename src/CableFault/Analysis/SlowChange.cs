using CableFault.Traces;

namespace CableFault.Analysis;

/// <summary>
/// How far the level strays from the incident step's plateau when no event stands out. A uniform, matched run keeps
/// the plateau; a slow, smeared echo (a fault far down a very lossy cable) can move the level a long way while escaping
/// the detector's box of one rise time, and an empty list must not then read as a sound run.
/// </summary>
internal static class SlowChange
{
    /// <summary>How the warning begins (see <see cref="LocateResult.LevelMovesWithoutEvent"/>).</summary>
    internal const string WarningLead = "the level moves";

    /// <summary>Smallest departure worth the warning, as a share of the step: well above a cable's own impedance
    /// wander (±2 Ω on 50 Ω moves the level by 2 %; common practice).</summary>
    internal const double MinimumStepShare = 0.05;

    /// <summary>And in noise standard deviations of a one-rise-time mean (never from noise alone).</summary>
    internal const double MinimumNoiseMultiples = 10;

    /// <summary>The warning for an empty event list, or null when the level stays on the plateau.</summary>
    /// <param name="aligned">The trace with time zero at the incident edge and its baseline removed.</param>
    /// <param name="characteristics">Its step, rise and noise.</param>
    /// <param name="afterSeconds">Where the run can be read: the end of the blind zone, s.</param>
    internal static string? Warning(Trace aligned, TraceCharacteristics characteristics, double afterSeconds)
    {
        double step = characteristics.IncidentAmplitudeVolts, dt = aligned.SampleIntervalSeconds;
        int block = Math.Max(1, (int)Math.Round(characteristics.RiseTimeSeconds / dt));
        int start = Math.Max(0, (int)Math.Ceiling((afterSeconds + 2 * characteristics.RiseTimeSeconds - aligned.StartTimeSeconds) / dt));
        var samples = aligned.SamplesVolts;
        double worst = 0;
        for (int i = start; i + block <= samples.Length; i += block)
        {
            double sum = 0;
            for (int j = i; j < i + block; j++) sum += samples[j];
            worst = Math.Max(worst, Math.Abs(sum / block - step));
        }
        double floor = Math.Max(MinimumStepShare * step, MinimumNoiseMultiples * characteristics.NoiseRmsVolts / Math.Sqrt(block));
        if (!(worst > floor)) return null;
        return string.Create(System.Globalization.CultureInfo.InvariantCulture,
            $"{WarningLead} by up to {100 * worst / step:0} % of the step over the record, yet no single event stands out: a slow change (a fault far down a very lossy cable, whose echo is smeared) can escape the detector, so this is no sign of a sound run; give the cable type for its loss, and look at the trace.");
    }
}
