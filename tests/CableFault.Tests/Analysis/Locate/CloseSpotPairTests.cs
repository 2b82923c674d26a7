using CableFault.Analysis;
using CableFault.Networks;
using static CableFault.Tests.Analysis.Locate.LocateFixtures;

namespace CableFault.Tests.Analysis.Locate;

/// <summary>
/// Two equal lumped spots a rise or two apart (the two connectors of a short patch lead, two kinks) are two spots, not
/// a short section of other cable: each spot reflects the derivative of the edge, ρ(t) ∝ τ·d/dt of the step with
/// τ = L/(2Z₀) or Z₀C/2 (Pozar, <i>Microwave Engineering</i>, 4th ed., §2.3 and §4.1 for the lumped elements, from
/// memory), so the pair shows two peaks with a dip between them where a section shows one flat-topped pulse.
/// </summary>
public class CloseSpotPairTests
{
    [Theory]
    [InlineData(1.3, 40e-9)]
    [InlineData(1.3, 100e-9)]
    [InlineData(1.5, 100e-9)]
    [InlineData(2.5, 100e-9)]
    public void TwoEqualInductorsAFewRiseLengthsApartAreTwoInductiveSpots(double separationInRiseLengths, double inductanceHenries) =>
        AssertTwoSpots(separationInRiseLengths, () => new SeriesInductor(inductanceHenries), EventKind.Inductive);

    [Theory]
    [InlineData(1.3, 15e-12)]
    [InlineData(1.5, 40e-12)]
    [InlineData(2.5, 40e-12)]
    public void TwoEqualCapacitorsAFewRiseLengthsApartAreTwoCapacitiveSpots(double separationInRiseLengths, double capacitanceFarads) =>
        AssertTwoSpots(separationInRiseLengths, () => new ShuntCapacitor(capacitanceFarads), EventKind.Capacitive);

    /// <summary>Two equal spots at 12 m and 12 m + the separation (in v·t_r/2), an open at 25 m: exactly two spots of
    /// <paramref name="kind"/> before the open, each within half of v·t_r/2 of its place.</summary>
    private static void AssertTwoSpots(double separationInRiseLengths, Func<NetworkElement> spot, EventKind kind)
    {
        double v = VelocityFactor * PhysicalConstants.SpeedOfLightMetersPerSecond;
        double u = v * RiseSeconds / 2;
        double separation = separationInRiseLengths * u;
        var network = Run(Segment(12), spot(), Segment(separation), spot(), Segment(13 - separation), RunEnd.Open);
        var result = Locator.Locate(Simulate(network, seed: 4), Options());
        string found = string.Join("; ", result.Events.Select(e => $"{e.Kind} {e.DistanceMeters:0.####} m"));
        var spots = result.Events.Where(e => e.DistanceMeters < 20).ToList();
        Assert.True(spots.Count == 2, $"expected two events near 12 m, found: {found}");
        Assert.True(spots.All(e => e.Kind == kind), $"expected two {kind} spots, found: {found}");
        // Placed within half a rise length each (the pair is resolved by its shape, not by a clean gap).
        Assert.InRange(spots[0].DistanceMeters, 12 - u / 2, 12 + u / 2);
        Assert.InRange(spots[1].DistanceMeters, 12 + separation - u / 2, 12 + separation + u / 2);
        Assert.Equal(EventKind.Open, result.Events[^1].Kind);
    }
}
