using System.Numerics;
using CableFault.Cables;
using CableFault.FrequencyDomain;
using CableFault.Networks;
using CableFault.Simulation;
using CableFault.Traces;

namespace CableFault.Tests.FrequencyDomain;

/// <summary>Frequency-to-time conversion checked against closed forms and against the time-domain forward model.</summary>
public class ReflectionToStepConverterTests
{
    private const double VelocityFactor = 0.7;
    private static readonly double Velocity = VelocityFactor * PhysicalConstants.SpeedOfLightMetersPerSecond;

    /// <summary>Γ of a lossless line of length l ending in ±1: ρ·e^(−2jβl), β = 2πf/v (Pozar, Microwave Engineering, 4th ed., §2.3).</summary>
    private static ReflectionData LineEndingIn(double endReflection, double lengthMeters, double stepHz, int firstBin, int topBin)
    {
        var f = Enumerable.Range(firstBin, topBin - firstBin + 1).Select(k => k * stepHz).ToArray();
        var g = f.Select(x => endReflection * Complex.FromPolarCoordinates(1, -2 * 2 * Math.PI * x / Velocity * lengthMeters)).ToArray();
        return new ReflectionData(f, g, 50);
    }

    /// <summary>Time where the trace first crosses <paramref name="level"/> after <paramref name="fromSeconds"/>, linearly interpolated.</summary>
    internal static double Crossing(Trace trace, double level, double fromSeconds)
    {
        var v = trace.SamplesVolts;
        int i = Math.Max(1, (int)Math.Ceiling((fromSeconds - trace.StartTimeSeconds) / trace.SampleIntervalSeconds));
        for (; i < v.Length; i++)
            if ((v[i - 1] - level) * (v[i] - level) <= 0 && v[i] != v[i - 1])
                return trace.TimeAt(i - 1) + (level - v[i - 1]) / (v[i] - v[i - 1]) * trace.SampleIntervalSeconds;
        throw new InvalidOperationException($"no crossing of {level}");
    }

    private static double At(Trace trace, double timeSeconds) =>
        trace.SamplesVolts[(int)Math.Round((timeSeconds - trace.StartTimeSeconds) / trace.SampleIntervalSeconds)];

    /// <summary>
    /// The 50 % point of the windowed edge is exactly at the echo delay (the edge is odd about its centre), so the only
    /// error is linear interpolation between samples: allow 5 % of the two-event resolution v·t_rise/2.
    /// </summary>
    private const double DistanceToleranceResolutions = 0.05;

    /// <summary>Plateau levels: windowed ripple at 5 rise times from an edge is below 0.2 % of its height for these windows
    /// (Kaiser β = 6 sidelobes −44 dB; Hann's fall off fast); allow 0.5 % of the 1 V edge.</summary>
    private const double PlateauToleranceVolts = 0.005;

    [Theory]
    [InlineData(SpectralWindow.Kaiser, 6.0, 1, +1.0)]
    [InlineData(SpectralWindow.Kaiser, 6.0, 3, +1.0)]
    [InlineData(SpectralWindow.Hann, 0.0, 1, -1.0)]
    [InlineData(SpectralWindow.Kaiser, 9.42, 2, -1.0)]
    public void Open_or_short_line_end_appears_at_its_distance_with_the_right_levels(SpectralWindow window, double beta, int firstBin, double endReflection)
    {
        const double length = 12.0, step = 2e6;
        var data = LineEndingIn(endReflection, length, step, firstBin, 1000);
        var result = ReflectionToStepConverter.Convert(data, new FrequencyToTimeOptions { Window = window, KaiserBeta = beta });
        var trace = result.Trace;
        Assert.Equal(TransformMode.LowPassStep, result.Mode);
        Assert.True(result.KindsDistinguishable);

        double roundTrip = 2 * length / Velocity;
        double rise = result.RiseTimeSeconds;
        // DESIGN.md §2 with Z_s = Z0 and 1 V incident: 0 before the edge, 1 V on the line, 1 + ρ after the echo.
        Assert.True(Math.Abs(At(trace, -5 * rise)) < PlateauToleranceVolts);
        Assert.True(Math.Abs(At(trace, roundTrip / 2) - 1) < PlateauToleranceVolts);
        Assert.True(Math.Abs(At(trace, roundTrip + 5 * rise) - (1 + endReflection)) < PlateauToleranceVolts);
        Assert.True(Math.Abs(At(trace, 0.8 / step) - (1 + endReflection)) < PlateauToleranceVolts);

        double t50 = Crossing(trace, 1 + endReflection / 2, roundTrip / 2);
        double distance = Velocity * t50 / 2;
        double resolution = Velocity * rise / 2;
        Assert.True(Math.Abs(distance - length) < DistanceToleranceResolutions * resolution,
            $"end at {distance:F4} m, expected {length} m (resolution {resolution:F4} m)");
        Assert.Equal(0.0, Crossing(trace, 0.5, -10 * rise), 0.05 * rise);
        Assert.Equal(endReflection, result.DcReflection!.Value, 6);
    }

    /// <summary>
    /// The step of an unwindowed band to f_max is s(t) = 1/2 + Si(2πf_max t)/π (Papoulis, The Fourier Integral and its
    /// Applications, 1962, ch. 2), so its 10–90 % rise is x/(π f_max) with Si(x) = 0.4π. The discrete sum over K = 1000
    /// harmonics differs from the integral by O(1/K): allow 1 %.
    /// </summary>
    [Fact]
    public void Unwindowed_rise_time_matches_the_sine_integral()
    {
        const double step = 1e6;
        const int top = 1000;
        var data = LineEndingIn(1, 10, step, 1, top);
        var result = ReflectionToStepConverter.Convert(data, new FrequencyToTimeOptions { Window = SpectralWindow.Rectangular });
        double x = SolveSineIntegral(0.4 * Math.PI);
        double expected = x / (Math.PI * top * step);
        Assert.True(Math.Abs(result.RiseTimeSeconds / expected - 1) < 0.01, $"{result.RiseTimeSeconds} vs {expected}");
    }

    private static double SolveSineIntegral(double target)
    {
        // Si(x) = ∫₀ˣ sin t / t dt by composite Simpson, then bisection on (0, π) where Si rises monotonically.
        static double Si(double x)
        {
            const int n = 2000;
            double h = x / n, sum = 1 + Math.Sin(x) / x;
            for (int i = 1; i < n; i++) { double t = i * h; sum += (i % 2 == 1 ? 4 : 2) * Math.Sin(t) / t; }
            return sum * h / 3;
        }
        double lo = 0.001, hi = Math.PI;
        for (int i = 0; i < 60; i++) { double mid = (lo + hi) / 2; if (Si(mid) < target) lo = mid; else hi = mid; }
        return (lo + hi) / 2;
    }

    /// <summary>
    /// The stated rise time is measured on the converted step of an open and of a short at the port. The edge spans
    /// 8 or more samples at oversampling 16, so linear interpolation of the 10 % and 90 % points is good to 2 %.
    /// </summary>
    [Theory]
    [InlineData(SpectralWindow.Rectangular)]
    [InlineData(SpectralWindow.Hann)]
    [InlineData(SpectralWindow.Kaiser)]
    public void Stated_rise_time_is_the_measured_edge_of_an_open_at_the_port(SpectralWindow window)
    {
        const double step = 5e6;
        var f = Enumerable.Range(1, 400).Select(k => k * step).ToArray();
        var open = new ReflectionData(f, f.Select(_ => Complex.One).ToArray(), 50);
        var options = new FrequencyToTimeOptions { Window = window, TimeOversampling = 16 };
        var result = ReflectionToStepConverter.Convert(open, options);
        double t10 = Crossing(result.Trace, 0.2, -10 * result.RiseTimeSeconds);
        double t90 = Crossing(result.Trace, 1.8, t10);
        Assert.True(Math.Abs((t90 - t10) / result.RiseTimeSeconds - 1) < 0.02, $"measured {t90 - t10}, stated {result.RiseTimeSeconds}");
        Assert.True(Math.Abs(At(result.Trace, 0.5 / step) - 2) < PlateauToleranceVolts);

        var shorted = new ReflectionData(f, f.Select(_ => -Complex.One).ToArray(), 50);
        var s = ReflectionToStepConverter.Convert(shorted, options).Trace;
        Assert.True(s.SamplesVolts.All(v => Math.Abs(v) < 1e-9), "a short at the port keeps the port at 0 V");
    }

    [Fact]
    public void Band_pass_mode_finds_the_echo_but_not_its_kind()
    {
        const double length = 12.0, step = 2e6;
        var open = LineEndingIn(+1, length, step, 250, 1250);
        var shorted = LineEndingIn(-1, length, step, 250, 1250);
        var a = ReflectionToStepConverter.Convert(open);
        var b = ReflectionToStepConverter.Convert(shorted);
        Assert.Equal(TransformMode.BandPassImpulse, a.Mode);
        Assert.False(a.KindsDistinguishable);
        Assert.Equal("false", a.Trace.MetadataOrNull("kinds_resolved"));
        Assert.Contains(a.Warnings, w => w.Contains("band-pass"));
        for (int i = 0; i < a.Trace.Length; i++) Assert.Equal(a.Trace.SamplesVolts[i], b.Trace.SamplesVolts[i], 9);

        int peak = Enumerable.Range(0, a.Trace.Length).MaxBy(i => a.Trace.SamplesVolts[i]);
        double roundTrip = 2 * length / Velocity;
        // Peak height |ρ| = 1 within 2 % (sampling the lobe top at oversampling 4), place within half a sample plus 1 % of the width.
        Assert.True(Math.Abs(a.Trace.SamplesVolts[peak] - 1) < 0.02);
        Assert.True(Math.Abs(a.Trace.TimeAt(peak) - roundTrip) < a.Trace.SampleIntervalSeconds / 2 + 0.01 * a.ImpulseWidthSeconds);
        Assert.Throws<InputException>(() => ReflectionToStepConverter.Convert(open, new FrequencyToTimeOptions { Mode = TransformMode.LowPassStep }));
    }

    [Fact]
    public void A_sweep_off_the_harmonic_grid_is_resampled_and_still_places_the_end()
    {
        // Start 0.3 MHz, step 0.5 MHz: not of the form k·Δf. Fine steps keep spline error below 1e-4.
        const double length = 12.0;
        var f = Enumerable.Range(0, 4000).Select(i => 0.3e6 + i * 0.5e6).ToArray();
        var g = f.Select(x => Complex.FromPolarCoordinates(1, -4 * Math.PI * x / Velocity * length)).ToArray();
        var result = ReflectionToStepConverter.Convert(new ReflectionData(f, g, 50));
        Assert.True(result.Resampled);
        Assert.Contains(result.Warnings, w => w.Contains("resampled"));
        double t50 = Crossing(result.Trace, 1.5, length / Velocity);
        Assert.True(Math.Abs(Velocity * t50 / 2 - length) < DistanceToleranceResolutions * Velocity * result.RiseTimeSeconds / 2);
        Assert.True(Math.Abs(At(result.Trace, 2 * length / Velocity + 5 * result.RiseTimeSeconds) - 2) < PlateauToleranceVolts);
    }

    [Fact]
    public void Invalid_options_and_short_sweeps_are_refused_in_one_line()
    {
        var data = LineEndingIn(1, 5, 1e6, 1, 100);
        var ex = Assert.Throws<InputException>(() => ReflectionToStepConverter.Convert(data, new FrequencyToTimeOptions { KaiserBeta = -1, TimeOversampling = 0 }));
        Assert.Contains("Kaiser", ex.Message);
        Assert.Contains("oversampling", ex.Message);
        Assert.Throws<InputException>(() => ReflectionToStepConverter.Convert(LineEndingIn(1, 5, 1e6, 1, 4)));
    }
}
