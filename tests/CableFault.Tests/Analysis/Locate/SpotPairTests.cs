using CableFault.Analysis;
using CableFault.Cables;
using CableFault.Networks;
using static CableFault.Tests.Analysis.Locate.LocateFixtures;

namespace CableFault.Tests.Analysis.Locate;

/// <summary>
/// Two equal inductive spots (the two connectors of a patch lead, two kinks) a couple of rise times apart on a long
/// record: on smoothed data their decaying tails blur into a rise and a fall that reads as a section of higher impedance;
/// on the unsmoothed samples each spot's own exponential, of time constant L/2Z₀ (Pozar, <i>Microwave Engineering</i>,
/// 4th ed., §2.3), is plain. The network is the truth.
/// </summary>
public class SpotPairTests
{
    private const double PairOhms = 75, PairVelocityFactor = 0.805, RiseSeconds = 1.645e-9;

    [Fact]
    public void TwoEqualInductancesTwoRiseTimesApartAreTwoSpots()
    {
        const double firstAt = 136.685, secondAt = 137.117, inductanceHenries = 278.9e-9, endAt = 264.4;
        var cable = new CableMedium(PairOhms, PairVelocityFactor);
        var network = Run(new CableSegment(firstAt, cable), new SeriesInductor(inductanceHenries), new CableSegment(secondAt - firstAt, cable),
            new SeriesInductor(inductanceHenries), new CableSegment(endAt - secondAt, cable), RunEnd.Open);
        var result = LocateOnCable(network, cable, RiseSeconds, 16000, 1.7e-3, 5);
        string found = Describe(result);

        var spots = result.Events.Where(e => e.Kind == EventKind.Inductive).ToList();
        Assert.True(spots.Count == 2, $"expected two inductive spots; found: {found}");
        foreach (var (spot, at) in spots.Zip(new[] { firstAt, secondAt }))
        {
            Assert.InRange(spot.DistanceMeters, at - DistanceTolerance(at), at + DistanceTolerance(at));
            // ±10 %: two spots 2.2 rise times apart share their tails, and the fit's covariance shows the trade.
            Assert.True(spot.Value is double l && Math.Abs(l / inductanceHenries - 1) < 0.10, $"found: {found}");
        }
        Assert.True(result.Events.Count == 3 && result.Events[^1].Kind == EventKind.Open, $"found: {found}");
    }
}
