using CableFault.Analysis;
using CableFault.Networks;
using static CableFault.Tests.Analysis.Locate.LocateFixtures;

namespace CableFault.Tests.Analysis.Locate;

/// <summary>
/// Two strong reflectors a few metres apart ring between them: every echo of the later one returns off the earlier one
/// (round trip t₂ + k·(t₂ − t₁)), and the detector reports that ladder as a row of steps. The fit must make those echoes
/// itself from the right elements, not keep the row. A shunt R reflects from the front like a drop to R‖Z₀ but from behind
/// with the same sign, where a drop reflects with the opposite one (ρ = (Z₂ − Z₁)/(Z₂ + Z₁) each way, Pozar, 4th ed.,
/// eq. 2.35), so the ladder tells them apart. The network is the truth.
/// </summary>
public class EchoLadderTests
{
    [Theory]
    [InlineData(47, 94, 2.5)]
    [InlineData(35, 60, 1.5)]
    public void LeakThenSeriesResistanceThenOpenIsThreeEventsAndNothingElse(double leakOhms, double seriesOhms, double gapMeters)
    {
        const double leakAt = 30;
        double resistorAt = leakAt + gapMeters, openAt = resistorAt + 13;
        var network = Run(Segment(leakAt), new ShuntResistor(leakOhms), Segment(gapMeters), new SeriesResistor(seriesOhms),
            Segment(openAt - resistorAt), RunEnd.Open);
        var result = Locator.Locate(Simulate(network, seed: 9), Options());
        string found = string.Join("; ", result.Events.Select(e => $"{e.Kind} {e.DistanceMeters:0.###} m"));
        Assert.True(result.Events.Count == 3, $"expected a leak, a series resistance and an open; found: {found}");
        Assert.True(result.Events[0].Kind == EventKind.PartialShort, $"found: {found}");
        Assert.True(result.Events[1].Kind == EventKind.SeriesResistance, $"found: {found}");
        Assert.True(result.Events[2].Kind == EventKind.Open, $"found: {found}");
        Assert.InRange(result.Events[0].DistanceMeters, leakAt - DistanceTolerance(leakAt), leakAt + DistanceTolerance(leakAt));
        Assert.InRange(result.Events[2].DistanceMeters, openAt - DistanceTolerance(openAt), openAt + DistanceTolerance(openAt));
    }
}
