using CableFault.Analysis;
using CableFault.Networks;
using static CableFault.Tests.Analysis.Locate.LocateFixtures;

namespace CableFault.Tests.Analysis.Locate;

/// <summary>
/// A leak (shunt R) and an impedance drop reflect alike from the front, but with opposite signs from behind: the far
/// end's echo bounced between the end and a leak comes back inverted. A locate that reads the leak as a drop has to invent
/// an event at that echo; read right, the run has two events. The network is the truth.
/// </summary>
public class LeakBeforeEndTests
{
    [Fact]
    public void LeakFarFromAResistiveEndIsAPartialShortWithoutAnEchoEvent()
    {
        // 30 Ω across the line at 50 m; the run ends in 10 Ω at 180 m.
        var network = Run(Segment(50), new ShuntResistor(30), Segment(130), RunEnd.Resistor(10));
        var result = Locator.Locate(Simulate(network, seed: 8), Options());
        string all = string.Join("; ", result.Events.Select(e => $"{e.Kind} at {e.DistanceMeters:0.###} m"));

        var leak = Near(result, 50);
        Assert.True(leak.Kind == EventKind.PartialShort, $"expected a partial short at 50 m; found: {all}");
        // ρ = −Z/(2R + Z) = −50/110 (DESIGN.md §2); the size within 5 % (the fit's resistance at this noise).
        Assert.InRange(leak.Value!.Value, 30 * 0.95, 30 * 1.05);
        Assert.InRange(leak.DistanceMeters, 50 - DistanceTolerance(50), 50 + DistanceTolerance(50));
        var end = Near(result, 180);
        Assert.True(end.Kind == EventKind.Termination, $"expected a termination at 180 m; found: {all}");
        Assert.True(result.Events.Count == 2, $"expected the leak and the end only; found: {all}");
    }
}
