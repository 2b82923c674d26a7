using CableFault.Traces;

namespace CableFault.Analysis;

/// <summary>
/// The samples the model is fitted to: a window of the aligned trace, possibly low-passed by a Gaussian and
/// decimated so that the fit costs the same whatever the record length.
/// </summary>
internal sealed class FitData
{
    /// <summary>Most rise times a window may span before it is smoothed: bounds the forward model's frequency bins
    /// (about 5 per rise time spanned) and so the cost of one model evaluation.</summary>
    internal const double MaximumRiseTimesPerWindow = 200;

    /// <summary>Multiply-adds of a smoothing above which its kept samples are shared among the cores (about a
    /// millisecond of work: well above the cost of handing work to the thread pool).</summary>
    private const long ParallelMinimumWork = 1_000_000;

    /// <summary>Gaussian σ of a 10–90 % rise, in units of the rise: 1/(2√2·erf⁻¹(0.8)).</summary>
    private const double SigmaPerRise = 1 / 2.5631031310892007;

    private FitData(double[] samples, double startTimeSeconds, double intervalSeconds, double filterSigmaSeconds,
        double noiseRmsVolts, double independentFraction)
    {
        Samples = samples;
        StartTimeSeconds = startTimeSeconds;
        IntervalSeconds = intervalSeconds;
        FilterSigmaSeconds = filterSigmaSeconds;
        NoiseRmsVolts = noiseRmsVolts;
        IndependentFraction = independentFraction;
    }

    internal double[] Samples { get; }
    internal double StartTimeSeconds { get; }
    internal double IntervalSeconds { get; }

    /// <summary>Per-bin forward-model quantities shared by every simulation of a run against these data.</summary>
    internal CableFault.Simulation.SweepCache Cache { get; } = new();

    /// <summary>σ of the Gaussian low-pass applied to the data, s (0 when none).</summary>
    internal double FilterSigmaSeconds { get; }

    /// <summary>Noise RMS of one analysed sample, V (after the low-pass).</summary>
    internal double NoiseRmsVolts { get; }

    /// <summary>
    /// Independent samples per analysed sample, (0, 1]: Gaussian-filtered white noise has a correlation time
    /// ∫ρ(τ)dτ = 2√π·σ_g, so n samples spaced Δt carry n·Δt/(2√π·σ_g) independent values.
    /// </summary>
    internal double IndependentFraction { get; }

    internal double TimeAt(int index) => StartTimeSeconds + index * IntervalSeconds;

    /// <summary>10–90 % rise of the model as these data see it, s: the instrument's Gaussian edge and the low-pass add in
    /// quadrature, σ² = σ_rise² + σ_filter².</summary>
    internal double EffectiveRiseSeconds(double riseSeconds) =>
        Math.Sqrt(Math.Pow(riseSeconds * SigmaPerRise, 2) + FilterSigmaSeconds * FilterSigmaSeconds) / SigmaPerRise;

    /// <summary>
    /// Cuts the window [startSeconds, endSeconds] from an aligned trace; when it spans more than
    /// <paramref name="maximumRiseTimesPerWindow"/> rise times, smooths with a Gaussian so that the effective rise is
    /// span/that number and keeps every k-th sample (about two per effective σ).
    /// </summary>
    internal static FitData Prepare(Trace aligned, double startSeconds, double endSeconds, double riseSeconds, double noiseRmsVolts,
        double maximumRiseTimesPerWindow = MaximumRiseTimesPerWindow)
    {
        double dt = aligned.SampleIntervalSeconds;
        int first = Math.Max(0, (int)Math.Ceiling((startSeconds - aligned.StartTimeSeconds) / dt));
        int last = Math.Min(aligned.Length - 1, (int)Math.Floor((endSeconds - aligned.StartTimeSeconds) / dt));
        if (last - first < 8) throw new ArgumentException("The fit window holds fewer than 8 samples.");
        double span = (last - first) * dt;
        double sigmaRise = riseSeconds * SigmaPerRise;
        double sigmaEffective = Math.Max(sigmaRise, span / maximumRiseTimesPerWindow * SigmaPerRise);
        double sigmaFilter = sigmaEffective > sigmaRise * 1.0001 ? Math.Sqrt(sigmaEffective * sigmaEffective - sigmaRise * sigmaRise) : 0;
        int stride = sigmaFilter > 0 ? Math.Max(1, (int)Math.Floor(0.5 * sigmaEffective / dt)) : 1;
        var samples = aligned.SamplesVolts;
        int count = (last - first) / stride + 1;
        var y = new double[count];
        if (sigmaFilter == 0)
        {
            for (int j = 0; j < count; j++) y[j] = samples[first + j * stride];
            return new FitData(y, aligned.TimeAt(first), dt, 0, noiseRmsVolts, 1);
        }
        // Gaussian kernel truncated at ±6σ (weight beyond is 2e-9, so the filter is the Gaussian the model assumes),
        // evaluated only at the kept samples.
        double sigmaSamples = sigmaFilter / dt;
        int half = (int)Math.Ceiling(6 * sigmaSamples);
        var kernel = new double[2 * half + 1];
        double sum = 0;
        for (int m = -half; m <= half; m++) sum += kernel[m + half] = Math.Exp(-0.5 * m * m / (sigmaSamples * sigmaSamples));
        double sumSquares = 0;
        for (int m = 0; m < kernel.Length; m++) { kernel[m] /= sum; sumSquares += kernel[m] * kernel[m]; }
        // The kernel's weights summed in the order the loop below adds them: every kept sample whose kernel lies within
        // the record divides by exactly this, so it is added up once.
        double fullWeight = 0;
        for (int m = 0; m < kernel.Length; m++) fullWeight += kernel[m];
        void Smooth(int from, int to)
        {
            for (int j = from; j < to; j++)
            {
                int centre = first + j * stride;
                double acc = 0;
                if (centre - half >= 0 && centre + half < samples.Length)
                {
                    for (int m = 0; m < kernel.Length; m++) acc += kernel[m] * samples[centre - half + m];
                    y[j] = acc / fullWeight;
                    continue;
                }
                double weight = 0;
                for (int m = -half; m <= half; m++)
                {
                    int i = centre + m;
                    // Beyond the record's ends, hold the end value (the level there is flat to within the noise).
                    acc += kernel[m + half] * samples[Math.Clamp(i, 0, samples.Length - 1)];
                    weight += kernel[m + half];
                }
                y[j] = acc / weight;
            }
        }
        // Each kept sample on its own: a long record's smoothing is shared among the cores (the same sums, so the same bits).
        int ranges = (long)count * kernel.Length < ParallelMinimumWork ? 1 : 4 * Environment.ProcessorCount;
        Simulation.BinSplitting.ForRanges(count, ranges, Smooth);
        double independent = Math.Min(1, stride * dt / (2 * Math.Sqrt(Math.PI) * sigmaFilter));
        return new FitData(y, aligned.TimeAt(first), stride * dt, sigmaFilter, noiseRmsVolts * Math.Sqrt(sumSquares), independent);
    }
}
