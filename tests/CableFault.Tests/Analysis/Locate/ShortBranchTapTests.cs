using CableFault.Analysis;
using CableFault.Networks;
using static CableFault.Tests.Analysis.Locate.LocateFixtures;

namespace CableFault.Tests.Analysis.Locate;

/// <summary>
/// A tap whose open branch is only a few resolution units long: the junction's drop and the branch end's echo come so
/// close that a first fit reads them as a short low-impedance stretch or a string of small spots. It is still a tap, and
/// the main line's far end stays where it is. The network is the truth.
/// </summary>
public class ShortBranchTapTests
{
    [Theory]
    // 0.5 m and 0.8 m are about five and eight resolution units v·t_r/2 (0.099 m at 1 ns, VF 0.66).
    [InlineData(0.3)][InlineData(0.4)][InlineData(1.3)][InlineData(2.0)]
    [InlineData(0.8)]
    public void ShortOpenBranchIsATap(double branchMeters)
    {
        const double junction = 9, end = 21;
        var network = Run(Segment(junction), new Junction([
            new NetworkBranch(Segment(end - junction), RunEnd.Open),
            new NetworkBranch(Segment(branchMeters), RunEnd.Open)]));
        var result = Locator.Locate(Simulate(network, noiseVolts: 2e-3, seed: 3), Options());
        string all = string.Join("; ", result.Events.Select(e => $"{e.Kind} at {e.DistanceMeters:0.###} m"));

        var tap = Near(result, junction);
        Assert.True(tap.Kind == EventKind.Tap, $"expected a tap at {junction} m; found: {all}");
        Assert.InRange(tap.DistanceMeters, junction - DistanceTolerance(junction), junction + DistanceTolerance(junction));
        // The main line's open end, and the branch's (reported at the junction plus the branch length).
        Assert.Contains(result.Events, e => e.Kind == EventKind.Open && Math.Abs(e.DistanceMeters - end) <= DistanceTolerance(end));
        double branchEnd = junction + branchMeters;
        Assert.Contains(result.Events, e => e.Kind == EventKind.Open && Math.Abs(e.DistanceMeters - branchEnd) <= DistanceTolerance(branchEnd));
        Assert.True(result.Events.Count == 3, $"expected the tap and two open ends; found: {all}");
    }
}
