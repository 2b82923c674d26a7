using CableFault.Analysis;
using CableFault.Cables;
using CableFault.Networks;
using static CableFault.Tests.Analysis.Locate.LocateFixtures;

namespace CableFault.Tests.Analysis.Locate;

/// <summary>
/// A corroded joint part-way along a 100 Ω pair, then a run that ends in a low resistance, on a long record with a fast
/// edge. At first the joint reflects like a rise to Z₀ + R (ρ = R/(R + 2Z₀), DESIGN.md §2), and "a rise, a drop, and one
/// more step at the end's first echo" fits nearly as well; only the true reading fits the echo between the end and the
/// joint with two events (a series R reflects alike from both sides, a step with opposite signs). The network is the truth.
/// </summary>
public class SeriesResistanceBeforeEndTests
{
    private const double JointAt = 10.906, EndAt = 39.161, PairOhms = 100, PairVelocityFactor = 0.629, RiseSeconds = 0.27e-9;

    [Theory]
    [InlineData(47.6, 35.7, 1)]
    [InlineData(47.6, 35.7, 2)]
    [InlineData(30, 20, 3)]
    public void JointAndResistiveEndAreTwoEvents(double seriesOhms, double endOhms, int seed)
    {
        var pair = new CableMedium(PairOhms, PairVelocityFactor);
        var network = Run(new CableSegment(JointAt, pair), new SeriesResistor(seriesOhms), new CableSegment(EndAt - JointAt, pair),
            RunEnd.Resistor(endOhms));
        // 3 000 rise times of record: the selection works on smoothed data, where the edge's width is barely seen.
        var result = LocateOnCable(network, pair, RiseSeconds, 18000, 0.6e-3, seed);
        string found = Describe(result);

        Assert.True(result.Events.Count == 2, $"expected the joint and the end; found: {found}");
        var joint = result.Events[0];
        Assert.True(joint.Kind == EventKind.SeriesResistance && joint.Value is double r && Math.Abs(r / seriesOhms - 1) < 0.05,
            $"expected a series resistance of {seriesOhms} Ω; found: {found}");
        Assert.InRange(joint.DistanceMeters, JointAt - DistanceTolerance(JointAt), JointAt + DistanceTolerance(JointAt));
        var end = result.Events[1];
        Assert.True(end.Kind == EventKind.Termination && end.Value is double z && Math.Abs(z / endOhms - 1) < 0.05,
            $"expected a termination in {endOhms} Ω; found: {found}");
        Assert.InRange(end.DistanceMeters, EndAt - DistanceTolerance(EndAt), EndAt + DistanceTolerance(EndAt));
    }
}
