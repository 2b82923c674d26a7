using CableFault.Analysis;
using CableFault.Networks;
using static CableFault.Tests.Analysis.Locate.LocateFixtures;

namespace CableFault.Tests.Analysis.Locate;

/// <summary>
/// Long records are fitted first on smoothed data (cheap), where a short section and a lumped C or L look alike; the
/// sharper second look must still name a section that the instrument's own edge resolves. The network is the truth.
/// </summary>
public class LongRecordResolutionTests
{
    [Fact]
    public void ShortLowImpedanceSectionFarOutIsADropAndARiseNotACapacitance()
    {
        // 1 m of 30 Ω at 120 m of a 201 m run: ten resolution units v·t_r/2 (0.099 m at 1 ns, VF 0.66) long, but shorter
        // than the smoothed first look's resolution on a record of some 5 µs.
        var network = Run(Segment(120), Segment(1.0, 30), Segment(80), RunEnd.Open);
        var result = Locator.Locate(Simulate(network, seed: 21), Options());
        string all = string.Join("; ", result.Events.Select(e => $"{e.Kind} at {e.DistanceMeters:0.###} m"));

        var drop = Near(result, 120);
        Assert.True(drop.Kind == EventKind.ImpedanceDrop, $"expected an impedance drop at 120 m; found: {all}");
        Assert.InRange(drop.DistanceMeters, 120 - DistanceTolerance(120), 120 + DistanceTolerance(120));
        // ρ = (30 − 50)/(30 + 50) = −0.25 (Pozar, Microwave Engineering, 4th ed., eq. 2.35).
        Assert.InRange(drop.Reflection, -0.30, -0.20);
        var rise = Near(result, 121);
        Assert.True(rise.Kind == EventKind.ImpedanceRise, $"expected an impedance rise at 121 m; found: {all}");
        Assert.InRange(rise.DistanceMeters, 121 - DistanceTolerance(121), 121 + DistanceTolerance(121));
        var open = Near(result, 201);
        Assert.Equal(EventKind.Open, open.Kind);
        Assert.True(result.Events.Count == 3, $"expected exactly three events; found: {all}");
    }
}
