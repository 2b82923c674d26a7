using System.Globalization;
using CableFault.Analysis;
using CableFault.Traces;
using MathNet.Numerics.Interpolation;

namespace CableFault.Comparison;

/// <summary>
/// Puts two traces of one run on the same footing: time zero at each one's incident edge, baseline level removed,
/// polarity corrected, divided by its own incident step, resampled onto one grid, and (when asked) the sharper one
/// band-limited to the slower rise time.
/// </summary>
internal static class TracePairPreparation
{
    /// <summary>Fewest common samples for a comparison (the conditioner's own minimum for one trace).</summary>
    private const int MinimumCommonSamples = TraceConditioner.MinimumSampleCount;

    internal static PreparedPair Prepare(Trace baseline, Trace current, bool matchRise)
    {
        var warnings = new List<string>();
        var cb = TraceConditioner.Characterise(baseline);
        var cc = TraceConditioner.Characterise(current);
        foreach (string w in cb.Warnings) warnings.Add($"{Name(baseline, "baseline")}: {w}");
        foreach (string w in cc.Warnings) warnings.Add($"{Name(current, "current")}: {w}");
        var ab = Normalise(TraceConditioner.Align(baseline, cb), cb.IncidentAmplitudeVolts);
        var ac = Normalise(TraceConditioner.Align(current, cc), cc.IncidentAmplitudeVolts);

        // The grid: the coarser interval (the finer record's extra detail has no partner), over the common time span.
        double dt = Math.Max(ab.SampleIntervalSeconds, ac.SampleIntervalSeconds);
        double start = Math.Max(ab.StartTimeSeconds, ac.StartTimeSeconds);
        double end = Math.Min(ab.EndTimeSeconds, ac.EndTimeSeconds);
        int count = end > start ? (int)Math.Floor((end - start) / dt + 1e-9) + 1 : 0;
        if (count < MinimumCommonSamples)
            throw new InputException(string.Create(CultureInfo.InvariantCulture,
                $"{Name(baseline, "baseline")} and {Name(current, "current")}: the two records overlap for only {Math.Max(0, end - start) * 1e9:G3} ns after aligning their incident edges; record both over the same time window."));
        bool differentGrid = Math.Abs(ab.SampleIntervalSeconds - ac.SampleIntervalSeconds) > 1e-6 * dt || ab.Length != ac.Length;
        if (differentGrid)
            warnings.Add(string.Create(CultureInfo.InvariantCulture,
                $"the traces were recorded differently ({ab.SampleIntervalSeconds * 1e12:G4} ps × {ab.Length} vs {ac.SampleIntervalSeconds * 1e12:G4} ps × {ac.Length} samples); both were resampled to {dt * 1e12:G4} ps over their common {(count - 1) * dt * 1e9:G4} ns"));

        double[] b = Resample(ab, start, dt, count), c = Resample(ac, start, dt, count);
        double nb = cb.NoiseRelative, nc = cc.NoiseRelative;
        double rb = cb.RiseTimeSeconds, rc = cc.RiseTimeSeconds;
        bool matched = false;
        double slow = Math.Max(rb, rc), fast = Math.Min(rb, rc);
        if (slow - fast > RepairCheckOptions.RiseMismatchWarningFraction * slow)
        {
            if (matchRise)
            {
                double sigma = GaussianBandLimit.ExtraSigmaSeconds(fast, slow) / dt;
                if (rb < rc) { (b, double f) = GaussianBandLimit.Smooth(b, sigma); nb *= f; }
                else { (c, double f) = GaussianBandLimit.Smooth(c, sigma); nc *= f; }
                matched = true;
                warnings.Add(string.Create(CultureInfo.InvariantCulture,
                    $"rise times differ ({rb * 1e9:G3} ns vs {rc * 1e9:G3} ns); the {(rb < rc ? "baseline" : "current trace")} was smoothed to {slow * 1e9:G3} ns before comparing"));
            }
            else
            {
                warnings.Add(string.Create(CultureInfo.InvariantCulture,
                    $"rise times differ ({rb * 1e9:G3} ns baseline vs {rc * 1e9:G3} ns current): every event will show a false difference of a few % of its reflection; use --match-rise to compare at the slower rise"));
            }
        }

        var tb = new Trace(start, dt, b, baseline.Metadata);
        var tc = new Trace(start, dt, c, current.Metadata);
        return new PreparedPair(tb, tc, nb, nc, rb, rc, matched, warnings, cb.IncidentAmplitudeVolts, cc.IncidentAmplitudeVolts);
    }

    private static Trace Normalise(Trace aligned, double amplitudeVolts) =>
        aligned.WithSamples(aligned.SamplesVolts.Select(v => v / amplitudeVolts));

    /// <summary>Natural cubic spline through the samples (MathNet), read on the common grid. The traces are sampled
    /// well above their edges' bandwidth, where a cubic spline's error is a small fraction of the noise.</summary>
    private static double[] Resample(Trace trace, double start, double dt, int count)
    {
        var spline = CubicSpline.InterpolateNaturalSorted(trace.TimesSeconds(), trace.SamplesVolts.ToArray());
        var y = new double[count];
        for (int k = 0; k < count; k++) y[k] = spline.Interpolate(start + k * dt);
        return y;
    }

    internal static string Name(Trace trace, string role) =>
        (trace.MetadataOrNull("file") ?? trace.MetadataOrNull("run")) is { } name ? $"{role} '{name}'" : role;
}
