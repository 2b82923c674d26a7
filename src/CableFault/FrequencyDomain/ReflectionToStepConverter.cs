using System.Globalization;
using System.Numerics;
using CableFault.Traces;
using MathNet.Numerics.IntegralTransforms;

namespace CableFault.FrequencyDomain;

/// <summary>
/// Turns reflection data Γ(f) into a time-domain trace: a low-pass step response (port voltage, as a step
/// reflectometer would record it) or a band-pass impulse magnitude.
/// </summary>
/// <remarks>
/// <para><b>Low-pass step.</b> The sweep is put on a harmonic grid f_k = k·Δf, k = 0 … K (resampled by spline if needed;
/// bins below the first measured point extrapolated, see <see cref="LowFrequencyExtrapolation"/>). The port voltage for an
/// incident step A into Z_ref with Z_s = Z_ref is V(f) = A·(1 + Γ(f))/(j2πf) (DESIGN.md §2: V_port = V_s·Z_in/(Z_s + Z_in)
/// with V_s = 2A). Its derivative spectrum A·w_k·(1 + Γ_k), windowed by w, is inverted by a real FFT of M points
/// (h_n = (1/M)·Σ_k X_k e^(+j2πkn/M), a sampled impulse of area X₀) and summed (trapezoid rule) to the step.
/// Time zero is the reference plane: the incident edge's 50 % point, since the windowed edge is odd about t = 0.
/// The result is circular with period T = 1/Δf; it is rotated so that a few rise times of pre-trigger come first.
/// Open → 2A, short → 0, matched → A.</para>
/// <para><b>Band-pass impulse.</b> For sweeps that do not reach near DC: |Σ_i w_i Γ_i e^(+j2π iΔf t)| / Σ_i w_i on a uniform
/// grid. Peaks sit at the echo delays with height |ρ|, but the sign is lost — an open and a short look the same.</para>
/// <para><b>Resolution (f_max = K·Δf; measured with <see cref="TransformFigures"/>, see ResolutionFigureTests).</b>
/// 10–90 % step rise × f_max: rectangular 0.446 (= the sine-integral value), Hann 0.970, Kaiser β = 6 0.986,
/// Kaiser β = 2π 1.010, β = 3π 1.242. Impulse full width at half amplitude × f_max (two equal events closer than this
/// merge): 0.603, 1.000, 0.977, 0.997, 1.195 — half the windows' 6 dB bandwidths in Harris (1978), Table 1.
/// Default Kaiser β = 6: highest sidelobe −43.8 dB (measured as in WindowTradeOffTests), so no visible ringing beside a 2 V open, for 2.2× the
/// rectangular rise and 1.6× its impulse width.</para>
/// </remarks>
public static class ReflectionToStepConverter
{
    /// <summary>Fewest frequency points accepted for a transform (8): fewer cannot show a time-domain picture.</summary>
    public const int MinimumPoints = 8;

    /// <summary>Converts. Throws <see cref="InputException"/> if the options are invalid, the data too short, or a low-pass
    /// transform was asked for on a sweep that does not start near DC.</summary>
    /// <param name="data">The reflection data.</param>
    /// <param name="options">Settings; null for the defaults.</param>
    /// <param name="sourceName">Name used in messages.</param>
    public static FrequencyToTimeResult Convert(ReflectionData data, FrequencyToTimeOptions? options = null, string sourceName = "reflection data")
    {
        ArgumentNullException.ThrowIfNull(data);
        options ??= new FrequencyToTimeOptions();
        var problems = options.Problems();
        if (problems.Count > 0) throw new InputException($"{sourceName}: {string.Join("; ", problems)}; correct the option.");
        if (data.Count < MinimumPoints)
            throw new InputException($"{sourceName}: only {data.Count} frequency points; a time-domain view needs at least {MinimumPoints}, so measure a longer sweep.");

        var warnings = new List<string>();
        var plan = LowPassPlan.Make(data);
        bool lowPassPossible = plan.FirstBin <= options.MaximumExtrapolatedBins;
        var mode = options.Mode;
        if (mode == TransformMode.Automatic)
        {
            mode = lowPassPossible ? TransformMode.LowPassStep : TransformMode.BandPassImpulse;
            if (!lowPassPossible)
                warnings.Add($"{sourceName}: the sweep starts {plan.FirstBin} frequency steps above DC, too far to extrapolate; shown as band-pass impulse magnitude, which cannot tell an open from a short.");
        }
        else if (mode == TransformMode.LowPassStep && !lowPassPossible)
        {
            throw new InputException(
                $"{sourceName}: the sweep starts at {Format(data.FrequenciesHz[0])} Hz, {plan.FirstBin} steps of {Format(plan.StepHz)} Hz above DC (at most {options.MaximumExtrapolatedBins} can be extrapolated); " +
                "use band-pass mode, or measure again with the start frequency equal to the step.");
        }

        return mode == TransformMode.LowPassStep
            ? LowPass(data, plan, options, warnings, sourceName)
            : BandPass(data, options, warnings, sourceName);
    }

    /// <summary>The harmonic grid a low-pass transform of the reflection data would use.</summary>
    private sealed record LowPassPlan(double StepHz, int FirstBin, int TopBin, bool Resampled)
    {
        internal static LowPassPlan Make(ReflectionData data)
        {
            var f = data.FrequenciesHz;
            if (FrequencyGrid.TryHarmonic(f, out double step, out int first))
                return new LowPassPlan(step, first, first + f.Length - 1, false);
            double median = FrequencyGrid.MedianStepHz(f);
            int top = (int)Math.Min(int.MaxValue / 4, Math.Ceiling(f[^1] / median - 1e-9));
            double df = f[^1] / top;
            int firstBin = (int)Math.Ceiling(f[0] / df - FrequencyGrid.SnapToleranceSteps);
            return new LowPassPlan(df, firstBin, top, true);
        }
    }

    private static FrequencyToTimeResult LowPass(ReflectionData data, LowPassPlan plan, FrequencyToTimeOptions options,
        List<string> warnings, string sourceName)
    {
        int top = plan.TopBin;
        int m = TransformLength(2L * top * options.TimeOversampling, sourceName);
        var gamma = new Complex[top + 1];
        Complex[] measured;
        if (plan.Resampled)
        {
            var targets = Enumerable.Range(plan.FirstBin, top - plan.FirstBin + 1).Select(k => k * plan.StepHz).ToArray();
            measured = FrequencyGrid.Resample(data.FrequenciesHz, data.ReflectionCoefficients, targets);
            warnings.Add($"{sourceName}: the sweep is not on a harmonic grid (f = k·Δf); resampled by cubic spline to {targets.Length} points, Δf = {Format(plan.StepHz)} Hz.");
        }
        else measured = data.ReflectionCoefficients.ToArray();
        Array.Copy(measured, 0, gamma, plan.FirstBin, measured.Length);

        var (missing, dc, clipped) = LowFrequencyExtrapolation.Extrapolate(measured, plan.FirstBin, plan.StepHz);
        Array.Copy(missing, gamma, missing.Length);
        gamma[0] = dc;
        if (plan.FirstBin > 0)
            warnings.Add($"{sourceName}: Γ at DC{(plan.FirstBin > 1 ? $" and {plan.FirstBin - 1} more low bins" : "")} extrapolated from the lowest points: Γ(0) ≈ {dc.ToString("F3", CultureInfo.InvariantCulture)}; late step levels depend on it.");
        if (clipped) warnings.Add($"{sourceName}: the estimate of Γ(0) fell outside [−1, 1] and was clipped; check the calibration.");

        var half = SpectralWindowFunctions.LowPassHalf(options.Window, top, options.KaiserBeta);
        double amplitude = options.IncidentAmplitudeVolts;
        var packed = new double[m + 2];
        for (int k = 0; k <= top; k++)
        {
            Complex x = amplitude * half[k] * (1 + gamma[k]);
            packed[2 * k] = x.Real;
            packed[2 * k + 1] = k == 0 ? 0 : x.Imaginary;
        }
        // With NoScaling, InverseReal gives x_n = Σ_k X_k e^(+2πikn/M) over all M bins (checked by a test against a direct sum).
        Fourier.InverseReal(packed, m, FourierOptions.NoScaling);

        double dt = 1.0 / (m * plan.StepHz);
        double rise = TransformFigures.StepRiseSeconds(half, plan.StepHz);
        double width = TransformFigures.LowPassImpulseWidthSeconds(half, plan.StepHz);
        int pre = PreTriggerSamples(options.PreTriggerRiseTimes * rise, dt, m);
        var samples = new double[m];
        double running = 0, previous = 0;
        for (int i = 0; i < m; i++)
        {
            int n = ((i - pre) % m + m) % m;
            double h = packed[n] / m;
            running += i == 0 ? h / 2 : (previous + h) / 2; // trapezoid: puts the 50 % point of a symmetric edge on t = 0
            samples[i] = running;
            previous = h;
        }

        var metadata = Metadata(data, options, "lowpass_step", rise, width, plan.StepHz, top * plan.StepHz, kindsResolved: true);
        metadata["gamma_dc"] = dc.ToString("R", CultureInfo.InvariantCulture);
        metadata["units"] = "volts";
        return new FrequencyToTimeResult
        {
            Trace = new Trace(-pre * dt, dt, samples, metadata),
            Mode = TransformMode.LowPassStep,
            KindsDistinguishable = true,
            RiseTimeSeconds = rise,
            ImpulseWidthSeconds = width,
            AliasFreeRoundTripSeconds = 1.0 / plan.StepHz,
            FrequencyStepHz = plan.StepHz,
            MaximumFrequencyHz = top * plan.StepHz,
            DcReflection = dc,
            Resampled = plan.Resampled,
            Window = options.Window,
            Warnings = warnings,
        };
    }

    private static FrequencyToTimeResult BandPass(ReflectionData data, FrequencyToTimeOptions options, List<string> warnings, string sourceName)
    {
        var f = data.FrequenciesHz;
        Complex[] values;
        double step;
        bool resampled = false;
        if (FrequencyGrid.IsUniform(f, out step)) values = data.ReflectionCoefficients.ToArray();
        else
        {
            double median = FrequencyGrid.MedianStepHz(f);
            long count = (long)Math.Ceiling((f[^1] - f[0]) / median - 1e-9) + 1;
            if (count > FrequencyToTimeOptions.MaximumTransformLength)
                throw new InputException($"{sourceName}: resampling this sweep needs {count} points; thin the sweep or measure on a uniform grid.");
            step = (f[^1] - f[0]) / (count - 1);
            var targets = Enumerable.Range(0, (int)count).Select(i => f[0] + i * step).ToArray();
            values = FrequencyGrid.Resample(f, data.ReflectionCoefficients, targets);
            resampled = true;
            warnings.Add($"{sourceName}: the sweep is not uniform; resampled by cubic spline to {count} points, Δf = {Format(step)} Hz.");
        }

        int points = values.Length;
        int m = TransformLength(2L * points * options.TimeOversampling, sourceName);
        var w = SpectralWindowFunctions.Symmetric(options.Window, points, options.KaiserBeta);
        double weightSum = w.Sum();
        var spectrum = new Complex[m];
        for (int i = 0; i < points; i++) spectrum[i] = w[i] * values[i];
        // With NoScaling, Inverse gives x_n = Σ_i X_i e^(+2πi·in/M) (checked by a test against a direct sum).
        Fourier.Inverse(spectrum, FourierOptions.NoScaling);

        double dt = 1.0 / (m * step);
        double width = TransformFigures.BandPassImpulseWidthSeconds(w, step);
        int pre = PreTriggerSamples(options.PreTriggerRiseTimes * width, dt, m);
        var samples = new double[m];
        double scale = Math.Abs(options.IncidentAmplitudeVolts) / weightSum;
        for (int i = 0; i < m; i++)
            samples[i] = spectrum[((i - pre) % m + m) % m].Magnitude * scale;

        warnings.Add($"{sourceName}: band-pass impulse mode shows where reflections are, not what they are (an open and a short look alike).");
        var metadata = Metadata(data, options, "bandpass_impulse", width, width, step, f[^1], kindsResolved: false);
        metadata["f_min_hz"] = f[0].ToString("R", CultureInfo.InvariantCulture);
        metadata["units"] = "reflection_magnitude";
        return new FrequencyToTimeResult
        {
            Trace = new Trace(-pre * dt, dt, samples, metadata),
            Mode = TransformMode.BandPassImpulse,
            KindsDistinguishable = false,
            RiseTimeSeconds = width,
            ImpulseWidthSeconds = width,
            AliasFreeRoundTripSeconds = 1.0 / step,
            FrequencyStepHz = step,
            MaximumFrequencyHz = f[^1],
            Resampled = resampled,
            Window = options.Window,
            Warnings = warnings,
        };
    }

    private static int TransformLength(long needed, string sourceName)
    {
        long m = 2;
        while (m < needed) m <<= 1;
        if (m > FrequencyToTimeOptions.MaximumTransformLength)
            throw new InputException($"{sourceName}: the transform needs {m} points (over {FrequencyToTimeOptions.MaximumTransformLength}); lower the time oversampling or thin the sweep.");
        return (int)m;
    }

    private static int PreTriggerSamples(double seconds, double dt, int m) =>
        (int)Math.Min(m / 4, Math.Ceiling(seconds / dt));

    private static Dictionary<string, string> Metadata(ReflectionData data, FrequencyToTimeOptions options, string transform,
        double rise, double width, double step, double fMax, bool kindsResolved)
    {
        var inv = CultureInfo.InvariantCulture;
        var metadata = new Dictionary<string, string>
        {
            ["source"] = "touchstone",
            ["transform"] = transform,
            ["window"] = SpectralWindowFunctions.Name(options.Window),
            ["rise_s"] = rise.ToString("R", inv),
            ["impulse_width_s"] = width.ToString("R", inv),
            ["alias_free_s"] = (1.0 / step).ToString("R", inv),
            ["z0"] = data.ReferenceImpedanceOhms.ToString("R", inv),
            ["kinds_resolved"] = kindsResolved ? "true" : "false",
            ["f_step_hz"] = step.ToString("R", inv),
            ["f_max_hz"] = fMax.ToString("R", inv),
        };
        if (options.Window == SpectralWindow.Kaiser) metadata["window_beta"] = options.KaiserBeta.ToString("R", inv);
        return metadata;
    }

    private static string Format(double value) => value.ToString("G6", CultureInfo.InvariantCulture);
}
