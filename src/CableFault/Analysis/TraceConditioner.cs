using System.Globalization;
using CableFault.Traces;

namespace CableFault.Analysis;

/// <summary>
/// Finds the incident edge, state levels, rise time, noise and clipping of a raw step-response trace, and aligns
/// the trace on the reference plane. Hopeless input throws <see cref="InputException"/>; doubtful input warns.
/// </summary>
/// <remarks>
/// Definitions follow IEEE Std 181-2011 ("Transitions, pulses and related waveforms"): state levels by the
/// histogram mode method (5.2.1.3), reference level instants by linear interpolation between samples (5.3.3),
/// transition duration between the 10 % and 90 % reference levels (5.3.4).
/// </remarks>
public static class TraceConditioner
{
    /// <summary>How the warning begins that the level still moves at the record's end (see
    /// <see cref="LocateResult.LevelStillMovingAtEnd"/>).</summary>
    internal const string StillMovingWarningLead = "the level is still changing at the end of the record";

    /// <summary>Fewest samples a trace must have to be characterised.</summary>
    public const int MinimumSampleCount = 32;

    /// <summary>Fewest pre-edge samples accepted at all (a level needs a few samples).</summary>
    public const int MinimumBaselineSamples = 4;

    /// <summary>Pre-edge samples below which a warning is given (the baseline level is less certain; common practice).</summary>
    public const int RecommendedBaselineSamples = 16;

    /// <summary>Pre-edge samples needed to estimate the noise there; with fewer, the first differences of the whole
    /// record are used (more samples, slightly biased upward by the echoes' slopes). 128 samples give a relative
    /// standard error near √(1.36/128) ≈ 10 % (see <see cref="NoiseEstimator"/>).</summary>
    public const int NoiseBaselineSamples = 128;

    /// <summary>The step must exceed this many noise σ to count as an incident edge (a chance excursion of 10σ in
    /// 10⁶ Gaussian samples has probability below 10⁻¹⁶).</summary>
    public const double MinimumEdgeSignalToNoise = 10;

    /// <summary>Noise above this fraction of the step earns an "average more sweeps" warning (1 %: a 5σ detection
    /// threshold then misses faults with |Δρ| below 0.05).</summary>
    public const double HeavyNoiseFraction = 0.01;

    /// <summary>A run of at least this many identical samples at the record's extreme value is taken as clipping.</summary>
    public const int ClipRunSamples = 8;

    private const int SmoothingWidth = 5;

    /// <summary>Characterises a raw trace. Throws <see cref="InputException"/> when no usable incident edge exists.</summary>
    public static TraceCharacteristics Characterise(Trace raw)
    {
        ArgumentNullException.ThrowIfNull(raw);
        string where = Where(raw);
        double[] x = raw.SamplesVolts.ToArray();
        int n = x.Length;
        double dt = raw.SampleIntervalSeconds;
        if (n < MinimumSampleCount)
            throw new InputException($"{where}: only {n} samples; need at least {MinimumSampleCount} to find the incident edge — record a longer trace.");

        var warnings = new List<string>();
        double sigmaAll = NoiseEstimator.FromDifferences(x);
        double[] xs = MovingAverage(x, SmoothingWidth);

        // 1. Coarse: the first sample that departs from the opening level by a quarter of the largest excursion.
        double startLevel = NoiseEstimator.Median(x[..Math.Min(16, n)]);
        double excursion = 0;
        for (int i = 0; i < n; i++) excursion = Math.Max(excursion, Math.Abs(xs[i] - startLevel));
        double threshold = Math.Max(0.25 * excursion, 6 * sigmaAll);
        int ic = -1;
        for (int i = 0; i < n; i++) if (Math.Abs(xs[i] - startLevel) > threshold && excursion > 0) { ic = i; break; }
        if (ic < 0) throw NoEdge(where, sigmaAll);
        int sign = xs[ic] > startLevel ? 1 : -1;

        // 2. Edge extent from the smoothed slope: peak after the coarse crossing, edges where it falls to 2 % of peak.
        double[] g = new double[n];
        for (int i = 1; i < n - 1; i++) g[i] = sign * (xs[i + 1] - xs[i - 1]);
        int ip = ic;
        while (ip + 1 < n - 1 && g[ip + 1] >= g[ip]) ip++;
        double gNoise = 2 * sigmaAll / SmoothingWidth;
        double gThreshold = Math.Max(0.02 * g[ip], 3 * gNoise);
        int ia = ip, ib = ip;
        while (ia > 1 && g[ia - 1] > gThreshold) ia--;
        while (ib < n - 2 && g[ib + 1] > gThreshold) ib++;
        int width = Math.Max(1, ib - ia);
        int preEnd = ia - Math.Max(2, width / 2) - SmoothingWidth / 2;
        int plateauStart = ib + Math.Max(2, width / 2) + SmoothingWidth / 2;
        if (preEnd < MinimumBaselineSamples)
            throw new InputException($"{where}: the incident edge starts at sample {ia}, leaving {Math.Max(0, preEnd)} samples of baseline before it; need at least {MinimumBaselineSamples} — set a longer pre-trigger delay.");
        if (plateauStart >= n - 2)
            throw new InputException($"{where}: the record ends during the incident edge — record a longer time window.");

        // 3. The plateau right after the edge lasts until the first echo moves the level.
        int plateauEnd = PlateauEnd(xs, plateauStart, startLevel, sigmaAll);
        if (plateauEnd - plateauStart < 3)
        {
            plateauEnd = Math.Min(n, plateauStart + 3);
            warnings.Add("an echo follows the incident edge within about a rise time; the incident level and near-end events are less certain.");
        }

        // 4. State levels (IEEE 181 histogram mode) and noise.
        double baseline = StateLevelEstimator.HistogramMode(x.AsSpan(0, preEnd));
        double top = StateLevelEstimator.HistogramMode(x.AsSpan(plateauStart, plateauEnd - plateauStart));
        double amplitude = top - baseline;
        double noise;
        noise = preEnd >= NoiseBaselineSamples
            ? Math.Max(NoiseEstimator.FromDifferences(x.AsSpan(0, preEnd)), NoiseEstimator.FromDetrended(x.AsSpan(0, preEnd)))
            : sigmaAll > 0 ? sigmaAll : NoiseEstimator.FromDifferences(x.AsSpan(0, preEnd));
        if (preEnd < RecommendedBaselineSamples)
        {
            warnings.Add($"only {preEnd} samples of baseline before the incident edge (recommended ≥ {RecommendedBaselineSamples}); the baseline level is less certain — set a longer pre-trigger delay.");
        }
        if (!(Math.Abs(amplitude) >= MinimumEdgeSignalToNoise * noise) || Math.Abs(amplitude) < 0.2 * excursion || amplitude * sign <= 0)
            throw NoEdge(where, noise);
        bool inverted = amplitude < 0;

        // 5. Reference level instants. A noisy edge is read on the lightly smoothed copy (symmetric, so the 50 % instant
        //    of a symmetric edge does not move); the box's own 10–90 % (0.8·w samples) is then removed in quadrature.
        bool noisy = noise > 0.02 * Math.Abs(amplitude);
        double[] edge = noisy ? xs : x;
        double mid = RiseTimeMeter.CrossingIndex(edge, baseline + 0.5 * amplitude, sign, ia - 2, ib + 2);
        if (double.IsNaN(mid)) mid = ip;
        double riseSamples = RiseTimeMeter.TransitionDurationSamples(edge, baseline, top, mid);
        if (noisy && double.IsFinite(riseSamples))
        {
            double box = 0.8 * SmoothingWidth;
            riseSamples = riseSamples > box ? Math.Sqrt(riseSamples * riseSamples - box * box) : riseSamples;
        }
        if (!double.IsFinite(riseSamples) || riseSamples <= 0)
        {
            riseSamples = Math.Max(1, 0.6 * width);
            warnings.Add("the 10–90 % rise time could not be read cleanly; an estimate from the edge width is used.");
        }

        // 6. Clipping, noise and the end of the record.
        // A clipped record has long runs of identical samples, which pull a whole-record MAD to zero: judge the
        // clipping against the pre-edge noise as well.
        double clipNoise = Math.Max(noise, NoiseEstimator.FromDifferences(x.AsSpan(0, preEnd)));
        bool clipped = DetectClipping(x, clipNoise, out double clipLevel, out int clipStart);
        if (clipped)
        {
            if (plateauStart <= clipStart + ClipRunSamples && clipStart < plateauEnd || Math.Abs(top - clipLevel) < 3 * noise + 1e-12 * Math.Abs(top))
                throw new InputException($"{where}: the incident step is clipped at {Fmt(clipLevel)} V, so its height is unknown — reduce the input range's sensitivity or attenuate the signal.");
            warnings.Add($"the trace is clipped at {Fmt(clipLevel)} V from {Fmt(raw.TimeAt(clipStart))} s; echoes there are cut off and their sizes are under-read — widen the input range.");
        }
        if (noise > HeavyNoiseFraction * Math.Abs(amplitude))
            warnings.Add($"heavy noise: {Fmt(100 * noise / Math.Abs(amplitude))} % of the step; faults smaller than |Δρ| ≈ {Fmt(5 * noise / Math.Abs(amplitude))} cannot be seen — average more sweeps (noise falls as 1/√N).");
        if (StillMovingAtEnd(xs, noise, Math.Abs(amplitude)))
            warnings.Add(StillMovingWarningLead + "; the far end may lie beyond it — record a longer time window.");
        if (inverted)
            warnings.Add("the incident edge falls (inverted polarity); the trace is inverted before analysis.");

        double timeZero = raw.StartTimeSeconds + mid * dt;
        return new TraceCharacteristics(timeZero, baseline, Math.Abs(amplitude), riseSamples * dt, noise, inverted, clipped, warnings);
    }

    /// <summary>Time zero at the reference plane, baseline removed, polarity corrected (amplitude not normalised).</summary>
    public static Trace Align(Trace raw, TraceCharacteristics characteristics)
    {
        ArgumentNullException.ThrowIfNull(raw);
        ArgumentNullException.ThrowIfNull(characteristics);
        double s = characteristics.PolaritySign, b = characteristics.BaselineVolts;
        var samples = new double[raw.Length];
        for (int i = 0; i < samples.Length; i++) samples[i] = s * (raw.SamplesVolts[i] - b);
        return new Trace(raw.StartTimeSeconds - characteristics.TimeZeroSeconds, raw.SampleIntervalSeconds, samples, raw.Metadata);
    }

    private static int PlateauEnd(double[] xs, int start, double startLevel, double sigma)
    {
        int n = xs.Length;
        double reference = NoiseEstimator.Median(xs[start..Math.Min(n, start + 3)]);
        double tolerance = Math.Max(5 * sigma, 0.03 * Math.Abs(reference - startLevel));
        int j = start;
        while (j < n && Math.Abs(xs[j] - reference) < tolerance) j++;
        return j;
    }

    private static bool DetectClipping(double[] x, double noise, out double level, out int start)
    {
        level = 0; start = -1;
        double max = x.Max(), min = x.Min();
        // Identical samples are expected when the quantisation step exceeds the noise, so clipping is only claimed
        // when the record elsewhere moves by less than the noise between samples (noise ≥ half the smallest step).
        double smallestStep = double.PositiveInfinity;
        for (int i = 1; i < x.Length; i++) { double d = Math.Abs(x[i] - x[i - 1]); if (d > 0 && d < smallestStep) smallestStep = d; }
        // A noiseless (computed) record may hold its final level exactly; without visible noise clipping cannot be told.
        if (!(noise > 0.5 * smallestStep) || !(noise > 1e-6 * (max - min))) return false;
        foreach (double extreme in new[] { max, min })
        {
            int run = 0;
            for (int i = 0; i < x.Length; i++)
            {
                run = x[i] == extreme ? run + 1 : 0;
                if (run >= ClipRunSamples) { level = extreme; start = i - run + 1; return true; }
            }
        }
        return false;
    }

    private static bool StillMovingAtEnd(double[] xs, double noise, double amplitude)
    {
        int n = xs.Length, m = Math.Max(16, n / 20);
        if (m * 4 > n) return false;
        int s0 = n - m;
        double mx = (m - 1) / 2.0, my = 0;
        for (int i = 0; i < m; i++) my += xs[s0 + i];
        my /= m;
        double sxy = 0, sxx = 0;
        for (int i = 0; i < m; i++) { sxy += (i - mx) * (xs[s0 + i] - my); sxx += (i - mx) * (i - mx); }
        double change = Math.Abs(sxy / sxx * m);
        // Standard error of the fitted change over m samples of white noise is σ·√(12/m); 6 of them and 0.5 % of the step.
        return change > Math.Max(6 * noise * Math.Sqrt(12.0 / m), 0.005 * amplitude);
    }

    private static double[] MovingAverage(double[] x, int w)
    {
        int n = x.Length, h = w / 2;
        var y = new double[n];
        double sum = 0; int count = 0;
        int lo = 0, hi = -1;
        for (int i = 0; i < n; i++)
        {
            int a = Math.Max(0, i - h), b = Math.Min(n - 1, i + h);
            while (hi < b) { hi++; sum += x[hi]; count++; }
            while (lo < a) { sum -= x[lo]; lo++; count--; }
            y[i] = sum / count;
        }
        return y;
    }

    private static InputException NoEdge(string where, double noise) =>
        new($"{where}: no incident edge found (the trace is flat or noise only, noise ≈ {Fmt(noise)} V RMS) — check the connection and the instrument's step output.");

    private static string Where(Trace raw) =>
        (raw.MetadataOrNull("file") ?? raw.MetadataOrNull("run")) is { } name ? $"trace '{name}'" : "trace";

    private static string Fmt(double v) => v.ToString("G3", CultureInfo.InvariantCulture);
}
