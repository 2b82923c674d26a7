using CableFault.Cables;
using CableFault.FrequencyDomain;
using CableFault.Networks;
using CableFault.Simulation;
using CableFault.Traces;

namespace CableFault.Tests.FrequencyDomain;

/// <summary>
/// S11 of a small network from the forward model, written as Touchstone, read back and converted, against the forward
/// model's own time-domain simulation with a Gaussian edge of the same 10–90 % rise. Two independent routes: the
/// converter sums a windowed real FFT on the jω axis; the simulator inverts on a damped Laplace contour.
/// </summary>
public class ForwardModelRoundTripTests
{
    /// <summary>
    /// Plateaus: compared only where the simulated trace is flat (varies by under 1 mV) within ±5 rise times, so that edge
    /// shape (Kaiser-windowed vs Gaussian) does not enter; what is left is window ripple (−44 dB sidelobes, under 0.5 %
    /// of the 1 V incident edge) and the DC extrapolation: 5 mV.
    /// </summary>
    private const double PlateauToleranceVolts = 0.005;

    /// <summary>Edges: both edges are symmetric about their 50 % points, so these agree to interpolation error: 5 % of a rise time.</summary>
    private const double EdgeToleranceRises = 0.05;

    private static readonly CableMedium Fifty = new(50, 0.66);
    private static readonly CableMedium SeventyFive = new(75, 0.66);

    private static CableNetwork Network() => new(new NetworkBranch(
        new CableSegment(6, Fifty), new CableSegment(3, SeventyFive), new CableSegment(5, Fifty), RunEnd.Open), "invented bench run");

    [Fact]
    public void Converted_touchstone_matches_the_simulated_step_response()
    {
        var network = Network();
        const double step = 1e6;
        var f = Enumerable.Range(1, 3000).Select(k => k * step).ToArray();
        var gamma = ForwardModel.ReflectionCoefficients(network, f, 50);
        var text = new StringWriter();
        TouchstoneWriter.Write(new ReflectionData(f, gamma, 50, ["invented bench run"]), text, TouchstoneDataFormat.MagnitudeAngle);

        var loaded = TouchstoneTraceLoader.Load(new StringReader(text.ToString()), "bench.s1p", new FrequencyToTimeOptions());
        var converted = loaded.Trace;
        double rise = loaded.Conversion.RiseTimeSeconds;
        double dt = converted.SampleIntervalSeconds;

        var settings = new InstrumentSettings
        {
            SourceImpedanceOhms = 50,
            RiseTimeSeconds = rise,
            EdgeShape = EdgeShape.Gaussian,
            SampleIntervalSeconds = dt,
            PreTriggerSeconds = -converted.StartTimeSeconds,
            SampleCount = (int)(300e-9 / dt),
        };
        var simulated = ForwardModel.Simulate(network, settings);
        Assert.Equal(simulated.StartTimeSeconds, converted.StartTimeSeconds, 1e-15);

        int window = (int)Math.Ceiling(5 * rise / dt);
        int compared = 0;
        var s = simulated.SamplesVolts;
        for (int i = window; i < s.Length - window; i++)
        {
            double lo = double.MaxValue, hi = double.MinValue;
            for (int j = i - window; j <= i + window; j++) { lo = Math.Min(lo, s[j]); hi = Math.Max(hi, s[j]); }
            if (hi - lo > 1e-3) continue;
            compared++;
            Assert.True(Math.Abs(converted.SamplesVolts[i] - s[i]) < PlateauToleranceVolts,
                $"t = {simulated.TimeAt(i) * 1e9:F3} ns: converted {converted.SamplesVolts[i]:F4} V, simulated {s[i]:F4} V");
        }
        Assert.True(compared > s.Length / 2, $"only {compared} flat samples compared");

        // Edges: the incident edge, the 50→75 Ω step at 6 m (ρ = 0.2) and the 75→50 Ω step at 9 m.
        double v = 0.66 * PhysicalConstants.SpeedOfLightMetersPerSecond;
        foreach (double at in new[] { 0.0, 2 * 6 / v, 2 * 9 / v })
        {
            double before = At(simulated, at - 5 * rise), after = At(simulated, at + 5 * rise);
            double mid = (before + after) / 2;
            double ts = ReflectionToStepConverterTests.Crossing(simulated, mid, at - 3 * rise);
            double tc = ReflectionToStepConverterTests.Crossing(converted, mid, at - 3 * rise);
            Assert.True(Math.Abs(ts - tc) < EdgeToleranceRises * rise, $"edge near {at * 1e9:F2} ns: simulated {ts * 1e9:F4} ns, converted {tc * 1e9:F4} ns");
        }

        Assert.Equal("touchstone", converted.MetadataOrNull("source"));
        Assert.Equal("bench.s1p", converted.MetadataOrNull("file"));
        Assert.Equal(1.0 / step, double.Parse(converted.MetadataOrNull("alias_free_s")!, System.Globalization.CultureInfo.InvariantCulture), 1e-15);
        Assert.Equal("50", converted.MetadataOrNull("z0"));
        Assert.Equal("true", converted.MetadataOrNull("kinds_resolved"));
    }

    private static double At(Trace trace, double timeSeconds) =>
        trace.SamplesVolts[(int)Math.Round((timeSeconds - trace.StartTimeSeconds) / trace.SampleIntervalSeconds)];
}
