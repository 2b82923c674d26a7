using System.Numerics;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;
using CableFault.Networks;
using CableFault.Traces;

namespace CableFault.Simulation;

/// <summary>
/// The forward model: a cable network plus an instrument gives the trace the instrument would record.
/// Pure functions of their arguments.
/// </summary>
/// <remarks>
/// <para>The port voltage is the divider V_port(s) = V_s(s)·Z_in(s)/(Z_s + Z_in(s)) (DESIGN.md §2), with the stimulus
/// V_s(s) = 2·A·E(s)·e^(−s·t_c)/s: a step of incident amplitude A whose edge has derivative spectrum E(s) and is centred at t_c.</para>
/// <para>The inverse transform runs on the damped contour s = σ + jω (numerical inverse Laplace transform by FFT; e.g.
/// Wilcox, "Numerical Laplace transformation and inversion", Int. J. Elec. Eng. Educ. 15, 1978). The sampled inverse
/// equals Σ_m y(t + mT)·e^(−σmT): choosing e^(−σT) = 10⁻¹² makes wrap-around of the non-periodic step and of long tails
/// negligible without integrating a derivative, and makes the 1/s of the step harmless (no pole on the contour).</para>
/// </remarks>
public static class ForwardModel
{
    /// <summary>Largest relative error allowed from wrap-around or from rounding amplified by the damping.</summary>
    private const double BalancedError = 1e-8;

    /// <summary>
    /// Largest factor e^(σ·t_rec) by which a fit's simulations let the undamping multiply rounding at the record's end.
    /// A finite-difference Jacobian divides that rounding by its step (10⁻³); with a transform barely longer than the
    /// record the balanced σ reaches 10⁸, and fits went astray on it. The price is wrap-around: the waveform one period
    /// later, times e^(−σT) ≤ 10⁻⁴ when T = t_rec (far less when T is longer). It is smooth, and mostly the run's final
    /// level, which the fit's level offset takes up; plain simulations keep the balanced 10⁻⁸. Chosen on the accuracy
    /// benchmark (200 runs): caps of 10⁴, 10⁵ and 10⁷ all met its targets, 10⁴ with the fewest false events (55, against
    /// 61 and 73); 10⁴ and 10⁷ read the lossy feeder speed trace right in both the JIT and the native build.
    /// </summary>
    internal const double FitMaximumUndamping = 1e4;

    /// <summary>Simulates the trace. Throws <see cref="ArgumentException"/> listing every problem if the network or settings are invalid.</summary>
    public static Trace Simulate(CableNetwork network, InstrumentSettings settings)
    {
        var problems = network.Problems().Concat(settings.Problems()).ToList();
        if (problems.Count > 0) throw new ArgumentException(string.Join("; ", problems));

        double[] samples = SimulateSamples(new CompiledNetwork(network), settings);
        if (settings.NoiseRmsVolts > 0) AddNoise(samples, settings.NoiseRmsVolts, settings.NoiseSeed);

        var first = network.Run.Elements.OfType<CableSegment>().FirstOrDefault();
        var metadata = new Dictionary<string, string>
        {
            ["source"] = "cablefault simulate",
            ["rise_s"] = settings.RiseTimeSeconds.ToString("R", System.Globalization.CultureInfo.InvariantCulture),
            ["source_ohms"] = settings.SourceImpedanceOhms.ToString("R", System.Globalization.CultureInfo.InvariantCulture),
        };
        if (!string.IsNullOrWhiteSpace(network.Name)) metadata["run"] = network.Name;
        if (first is not null)
        {
            metadata["vf"] = first.Medium.VelocityFactor.ToString("R", System.Globalization.CultureInfo.InvariantCulture);
            metadata["z0"] = first.Medium.ImpedanceOhms.ToString("R", System.Globalization.CultureInfo.InvariantCulture);
            if (first.CableDesignation is not null) metadata["cable"] = first.CableDesignation;
        }
        return new Trace(-settings.PreTriggerSeconds, settings.SampleIntervalSeconds, samples, metadata);
    }

    /// <summary>Input impedance Z_in(jω) of the network at a real frequency f ≥ 0, Ω. An open input returns +∞.</summary>
    public static Complex InputImpedanceOhms(CableNetwork network, double frequencyHz)
    {
        var (n, d) = InputImpedancePair(network, new Complex(0, 2 * Math.PI * frequencyHz));
        return d == Complex.Zero ? new Complex(double.PositiveInfinity, 0) : n / d;
    }

    /// <summary>Reflection coefficient Γ = (Z_in − Z_ref)/(Z_in + Z_ref) at a real frequency, exact for opens and shorts.</summary>
    public static Complex ReflectionCoefficient(CableNetwork network, double frequencyHz, double referenceOhms)
    {
        var (n, d) = InputImpedancePair(network, new Complex(0, 2 * Math.PI * frequencyHz));
        return (n - referenceOhms * d) / (n + referenceOhms * d);
    }

    /// <summary>Reflection coefficients at many real frequencies (one compilation, many evaluations).</summary>
    public static Complex[] ReflectionCoefficients(CableNetwork network, IReadOnlyList<double> frequenciesHz, double referenceOhms)
    {
        var problems = network.Problems();
        if (problems.Count > 0) throw new ArgumentException(string.Join("; ", problems));
        var evaluator = new NetworkEvaluator(new CompiledNetwork(network));
        var result = new Complex[frequenciesHz.Count];
        for (int i = 0; i < result.Length; i++)
        {
            var (n, d) = evaluator.Evaluate(new Complex(0, 2 * Math.PI * frequenciesHz[i]));
            result[i] = (n - referenceOhms * d) / (n + referenceOhms * d);
        }
        return result;
    }

    private static (Complex N, Complex D) InputImpedancePair(CableNetwork network, Complex s)
    {
        var problems = network.Problems();
        if (problems.Count > 0) throw new ArgumentException(string.Join("; ", problems));
        return new NetworkEvaluator(new CompiledNetwork(network)).Evaluate(s);
    }

    /// <summary>The noiseless samples, computed on an internal grid fine enough for the edge and then decimated.</summary>
    internal static double[] SimulateSamples(CompiledNetwork network, InstrumentSettings settings) =>
        SimulateSamples(network, settings, null);

    /// <summary>As <see cref="SimulateSamples(CompiledNetwork, InstrumentSettings)"/>, reusing per-bin quantities from
    /// <paramref name="cache"/> when given (a fit's repeated evaluations of one run with small changes).</summary>
    /// <param name="network">The compiled run.</param>
    /// <param name="settings">The instrument and record.</param>
    /// <param name="cache">Per-bin quantities shared by a fit's runs, or null.</param>
    /// <param name="maximumUndamping">Cap on e^(σ·t_rec) (see <see cref="FitMaximumUndamping"/>); none by default.</param>
    /// <param name="resumeFrom">The same run's pairs at a fit's base point, or null: a run that differs from the base only
    /// from some operation on starts there (the pairs before it are the base's, bit for bit).</param>
    internal static double[] SimulateSamples(CompiledNetwork network, InstrumentSettings settings, SweepCache? cache,
        double maximumUndamping = double.PositiveInfinity, SweepSnapshots? resumeFrom = null)
    {
        var (oversample, dt, shift, edgeCentre, m, sigma, dOmega) = PlanContour(settings, maximumUndamping);
        double rise = settings.RiseTimeSeconds, period = m * dt;
        double zs = settings.SourceImpedanceOhms, amplitude = settings.IncidentAmplitudeVolts;
        double[] transformed;
        double[]? pooled = null;
        if (cache is not null)
        {
            var grid = CachedGrid(settings, m, sigma, dOmega);
            int bins = grid.BinCount;
            var (edge, delays) = cache.Stimulus(grid, settings.EdgeShape, rise, edgeCentre, settings.SettlingFraction,
                settings.SettlingTimeConstantSeconds);
            using var sweep = new BinSweep(network, cache, grid, resumeFrom is { } snapshots && snapshots.Grid == grid ? snapshots : null);
            // The spectrum overwrites N bin by bin (each bin reads only its own N and D), range by range: a serial fit's
            // run spreads its bins over the idle cores (BinSplitting), each bin getting the operations of one pass.
            Complex[] ns = sweep.N, ds = sweep.D, ys = ns;
            BinSplitting.ForHalves(bins, (from, to) =>
            {
                sweep.Run(from, to);
                // The same operations in the same order as the uncached loop below, on [re, im] vectors (ComplexMath).
                var nv = MemoryMarshal.Cast<Complex, Vector128<double>>(ns.AsSpan(0, to));
                var dv = MemoryMarshal.Cast<Complex, Vector128<double>>(ds.AsSpan(0, to));
                var edgeV = MemoryMarshal.Cast<Complex, Vector128<double>>(edge.AsSpan(0, to));
                var delayV = MemoryMarshal.Cast<Complex, Vector128<double>>(delays.AsSpan(0, to));
                Vector128<double> sourceOhms = Vector128.Create(zs), two = Vector128.Create(2.0), amplitudeV = Vector128.Create(amplitude);
                for (int k = from; k < to; k++)
                {
                    var n = nv[k];
                    var h = ComplexMath.Divide(n, dv[k] * sourceOhms + n);
                    var y = ComplexMath.Divide(ComplexMath.Multiply(ComplexMath.Multiply(h * two * amplitudeV, edgeV[k]), delayV[k]),
                        Vector128.Create(sigma, k * dOmega));
                    if (k == m / 2) y = y.WithElement(1, 0.0);
                    nv[k] = y;
                }
            });
            pooled = SweepBuffers<double>.Rent(m);
            InverseFft.Real(ys.AsSpan(0, bins), m, pooled);
            SweepBuffers<Complex>.Return(ns);
            SweepBuffers<Complex>.Return(ds);
            transformed = pooled;
        }
        else
        {
            var spectrum = new Complex[m / 2 + 1];
            var evaluator = new NetworkEvaluator(network);
            // e^(−s·t_c) along the contour is e^(−σt_c) times a phasor that turns by e^(−jΔω·t_c) per bin: a recurrence,
            // refreshed exactly every 256 bins so rounding cannot accumulate.
            Complex delayStep = Complex.FromPolarCoordinates(1, -dOmega * edgeCentre);
            Complex delay = Complex.One;
            for (int k = 0; k <= m / 2; k++)
            {
                var s = new Complex(sigma, k * dOmega);
                if (StimulusSpectrum.IsNegligible(settings.EdgeShape, rise, s)) break;
                if ((k & 255) == 0) delay = Complex.Exp(-s * edgeCentre);
                else delay *= delayStep;
                var (n, d) = evaluator.Evaluate(s);
                Complex h = n / (zs * d + n);
                Complex edge = StimulusSpectrum.Evaluate(settings.EdgeShape, rise, s);
                if (settings.SettlingFraction != 0)
                    edge *= StimulusSpectrum.Settling(settings.SettlingFraction, settings.SettlingTimeConstantSeconds, s);
                Complex y = h * 2 * amplitude * edge * delay / s;
                if (k == m / 2) y = new Complex(y.Real, 0);
                spectrum[k] = y;
            }

            // Inverse real FFT without scaling, x_n = Σ_k Y_k e^{+2πikn/M} over all k (bins not reached are zero). Not
            // MathNet's: for lengths that are not powers of two it takes Bluestein's algorithm, whose rounding (~1e-10
            // relative) the damped contour's e^(σt) would multiply into the samples.
            transformed = InverseFft.Real(spectrum, m);
        }
        var samples = new double[settings.SampleCount];
        if (cache is not null)
        {
            double[] undamping = cache.Undamping(sigma, dt, shift, oversample, samples.Length);
            for (int i = 0; i < samples.Length; i++) samples[i] = undamping[i] * transformed[shift + i * oversample] / period;
        }
        else
            for (int i = 0; i < samples.Length; i++)
            {
                int index = shift + i * oversample;
                double t = index * dt;
                samples[i] = Math.Exp(sigma * t) * transformed[index] / period;
            }
        if (pooled is not null) SweepBuffers<double>.Return(pooled);
        return samples;
    }

    /// <summary>The pairs of <paramref name="network"/> after each of its operations on the contour a cached
    /// <see cref="SimulateSamples(CompiledNetwork, InstrumentSettings, SweepCache?, double, SweepSnapshots?)"/> with these
    /// arguments would use: the base point of a fit's Jacobian, from which each column's run resumes. The caller disposes it.</summary>
    internal static SweepSnapshots Snapshot(CompiledNetwork network, InstrumentSettings settings, SweepCache cache, double maximumUndamping)
    {
        var (_, _, _, _, m, sigma, dOmega) = PlanContour(settings, maximumUndamping);
        var grid = CachedGrid(settings, m, sigma, dOmega);
        var snapshots = new SweepSnapshots(network, grid);
        var (ns, ds) = NetworkEvaluator.EvaluateSweep(network, cache, grid, record: snapshots);
        SweepBuffers<Complex>.Return(ns);
        SweepBuffers<Complex>.Return(ds);
        return snapshots;
    }

    /// <summary>The bins a cached run evaluates on its contour: one definition for runs and snapshots, whose grids must
    /// be equal for a run to resume from a snapshot.</summary>
    private static SweepCache.Grid CachedGrid(InstrumentSettings settings, int m, double sigma, double dOmega) =>
        new(m, sigma, dOmega, CountBins(settings.EdgeShape, settings.RiseTimeSeconds, sigma, dOmega, m / 2));

    /// <summary>The internal grid and the contour of a simulation: oversampling of the record, internal interval, the
    /// edge's shift into the transform, its centre, the transform length, the contour's σ and the bin spacing.</summary>
    private static (int Oversample, double Dt, int Shift, double EdgeCentre, int M, double Sigma, double DOmega) PlanContour(
        InstrumentSettings settings, double maximumUndamping)
    {
        var (oversample, dt, shift, needed) = PlanGrid(settings);
        double edgeCentre = settings.PreTriggerSeconds + shift * dt;
        if (!(maximumUndamping > 1)) throw new ArgumentOutOfRangeException(nameof(maximumUndamping), maximumUndamping, "The undamping cap must exceed 1.");
        long fftLength = FastLengthFor(needed);
        if (fftLength > (1L << 27))
            throw new InputException($"simulate settings: the record needs an internal FFT of {fftLength} points, over the {1L << 27} limit; shorten the record (--duration-ns, --samples) or lengthen --rise-time-ns");
        int m = (int)fftLength;
        double period = m * dt;
        // Wrap-around is suppressed by e^(−σT) while rounding errors grow by e^(σ·t) up to the record's end t_rec;
        // σ = ln(1/ε²)/(T + t_rec) makes both ≤ ε = 1e-8 relative even when T = t_rec, and far smaller when T > t_rec.
        // A fit caps the growth (see FitMaximumUndamping).
        double recordSpan = (needed - 1) * dt;
        double sigma = Math.Min(-2 * Math.Log(BalancedError) / (period + recordSpan), Math.Log(maximumUndamping) / recordSpan);
        return (oversample, dt, (int)shift, edgeCentre, m, sigma, 2 * Math.PI / period);
    }

    /// <summary>The internal grid of a simulation: oversampling of the record, internal interval, the edge's shift into
    /// the transform and the internal samples the record needs.</summary>
    private static (int Oversample, double Dt, long Shift, long Needed) PlanGrid(InstrumentSettings settings)
    {
        double rise = settings.RiseTimeSeconds;
        double oversampling = Math.Ceiling(settings.SampleIntervalSeconds / StimulusSpectrum.MaximumInternalIntervalSeconds(settings.EdgeShape, rise) - 1e-9);
        // Clamped before the conversion: an absurd rise (a fit's far trial step) must come out as a huge length, not wrap.
        int oversample = (int)Math.Clamp(oversampling, 1, 1 << 28);
        double dt = settings.SampleIntervalSeconds / oversample;
        // Put the edge centre far enough after internal t = 0 that its leading tail is negligible.
        double leadIn = StimulusSpectrum.LeadInSeconds(settings.EdgeShape, rise);
        long shift = (long)Math.Clamp(Math.Ceiling((leadIn - settings.PreTriggerSeconds) / dt), 0, 1L << 40);
        long needed = shift + (long)(settings.SampleCount - 1) * oversample + 1;
        return (oversample, dt, shift, needed);
    }

    /// <summary>The shortest fast length that holds <paramref name="needed"/> samples (the cost of a run grows with the
    /// transform's bins); lengths beyond the simulator's limit are returned as they are.</summary>
    private static long FastLengthFor(long needed) => needed > 1L << 27 ? needed : InverseFft.FastLength(needed);

    /// <summary>The internal transform length a simulation with <paramref name="settings"/> needs: its time and memory
    /// grow with it.</summary>
    internal static long TransformLength(InstrumentSettings settings) => FastLengthFor(PlanGrid(settings).Needed);

    /// <summary>
    /// The bins before the first negligible one (see <see cref="StimulusSpectrum.IsNegligible"/>), at most
    /// <paramref name="lastBin"/> + 1. Negligibility only grows with the bin, so the count is found by stepping from an
    /// estimate (|E| = e^−37 where σ_b²(ω² − σ²)/2 = 37) rather than from bin 0: the same answer for a few tests instead of
    /// thousands per model run.
    /// </summary>
    internal static int CountBins(EdgeShape shape, double rise, double sigma, double dOmega, int lastBin)
    {
        bool Negligible(int k) => StimulusSpectrum.IsNegligible(shape, rise, new Complex(sigma, k * dOmega));
        double estimate = StimulusSpectrum.NegligibleAboveRadiansPerSecond(shape, rise, sigma) / dOmega;
        int bins = double.IsFinite(estimate) ? (int)Math.Clamp(Math.Floor(estimate), 0, lastBin + 1) : lastBin + 1;
        while (bins > 0 && Negligible(bins - 1)) bins--;
        while (bins <= lastBin && !Negligible(bins)) bins++;
        return bins;
    }

    private static void AddNoise(double[] samples, double rmsVolts, int seed)
    {
        var normal = new MathNet.Numerics.Distributions.Normal(0, rmsVolts, new Random(seed));
        for (int i = 0; i < samples.Length; i++) samples[i] += normal.Sample();
    }
}
