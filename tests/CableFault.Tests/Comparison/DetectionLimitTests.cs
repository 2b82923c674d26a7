using CableFault.Comparison;
using CableFault.Networks;
using CableFault.Simulation;
using CableFault.Traces;
using Xunit.Abstractions;
using static CableFault.Tests.Comparison.CompareFixtures;

namespace CableFault.Tests.Comparison;

/// <summary>
/// The smallest splice bump the repair check finds reliably: a series L on a matched line, 1 mV noise on a 1 V step,
/// 0.5 ns rise, 20 seeds. The bump's size is its peak reflection, read from the noiseless forward model.
/// </summary>
public class DetectionLimitTests(ITestOutputHelper output)
{
    private const int Seeds = 20;
    /// <summary>Detected in at least 19 of 20 seeds (95 %).</summary>
    private const int RequiredDetections = 19;
    private const double NoiseVolts = 1e-3;
    private const double BumpMeters = 6;

    private static CableNetwork Line(double henries) => henries > 0
        ? Run(Segment(BumpMeters), new SeriesInductor(henries), Segment(6), RunEnd.Matched)
        : Run(Segment(BumpMeters), Segment(6), RunEnd.Matched);

    private static Trace Shot(double henries, double noise, int seed) =>
        ForwardModel.Simulate(Line(henries), Settings(noise, seed, recordSeconds: 100e-9)).WithMetadata("vf", "0.66").WithMetadata("z0", "50");

    /// <summary>Peak reflection of the bump: the largest noiseless difference over the incident step (1 V).</summary>
    private static double PeakReflection(double henries)
    {
        var with = Shot(henries, 0, 1);
        var without = Shot(0, 0, 1);
        return with.SamplesVolts.Zip(without.SamplesVolts, (a, b) => Math.Abs(a - b)).Max();
    }

    private static int Detections(double henries, double toleranceReflection)
    {
        int found = 0;
        var options = new RepairCheckOptions { Tolerances = new CompareTolerances { Reflection = toleranceReflection } };
        for (int seed = 1; seed <= Seeds; seed++)
        {
            var result = RepairCheck.Compare(Shot(0, NoiseVolts, 1000 + seed), Shot(henries, NoiseVolts, 2000 + seed), options);
            if (!result.Pass && result.Events.Any(e => e.ExceedsTolerance && Math.Abs(e.DistanceMeters - BumpMeters) < CompareTolerances.DefaultDistanceMeters))
                found++;
        }
        return found;
    }

    [Fact]
    public void BumpAboveTheDefaultToleranceIsFoundInNineteenOfTwenty()
    {
        // 1.75 nH: τ = L/2Z₀ = 17.5 ps, a peak of about 0.035 with a 0.5 ns edge: the smallest size found in at
        // least 19 of 20 seeds at the default tolerance (see Tabulate).
        const double henries = 1.75e-9;
        double peak = PeakReflection(henries);
        int found = Detections(henries, CompareTolerances.DefaultReflection);
        output.WriteLine($"{henries * 1e9} nH: peak {peak:P2}, found {found}/{Seeds}");
        Assert.True(peak > CompareTolerances.DefaultReflection);
        Assert.True(found >= RequiredDetections, $"found {found}/{Seeds}");
    }

    [Fact]
    public void BumpNearTheNoiseIsFoundWithATightTolerance()
    {
        // 0.6 nH (peak about 0.012) against a tolerance of 0.01, just above the combined 1 mV noise band (0.0071).
        const double henries = 0.6e-9;
        int found = Detections(henries, 0.01);
        Assert.True(found >= RequiredDetections, $"found {found}/{Seeds}");
    }

    /// <summary>
    /// Measured (20 seeds each): default tolerance 0.03 — 1.5 nH (3.0 % peak) 15/20, 1.75 nH (3.5 %) 20/20,
    /// 2 nH (4.1 %) 20/20; tolerance 0.01, just above the 1 mV combined band of 0.0071 — 0.4 nH (0.8 %) 2/20,
    /// 0.5 nH (1.0 %) 12/20, 0.6 nH (1.2 %) 20/20.
    /// </summary>
    [Fact(Skip = "measurement: run by hand to tabulate the detection limit (about a minute per row)")]
    public void Tabulate()
    {
        foreach (double nh in new[] { 0.4, 0.5, 0.6, 0.75, 1.0, 1.5, 1.75, 2.0 })
        {
            double peak = PeakReflection(nh * 1e-9);
            output.WriteLine($"{nh} nH: peak {peak:P2}; default tolerance {Detections(nh * 1e-9, CompareTolerances.DefaultReflection)}/{Seeds}; tolerance 0.01 {Detections(nh * 1e-9, 0.01)}/{Seeds}");
        }
    }
}
