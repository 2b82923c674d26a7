using CableFault.Analysis;
using CableFault.Networks;
using CableFault.Traces;
using static CableFault.Tests.Analysis.Locate.LocateFixtures;

namespace CableFault.Tests.Analysis.Locate;

/// <summary>Resolution of close events, no invented events, and uncertainty that follows the VF's.</summary>
public class ResolutionAndHonestyTests
{
    /// <summary>A close pair counts as resolved when each member is placed within a quarter of their separation.</summary>
    private const double PairPlacementFraction = 0.25;

    [Fact]
    public void TwoEqualReflectionsHalfARiseApartAreResolvedAt40Db()
    {
        // Two equal steps, ρ = (Z₂ − Z₁)/(Z₂ + Z₁) = 1/19 each (Pozar, 4th ed., eq. 2.35): 50 → 55.56 → 61.73 Ω.
        // Their separation is half of v·t_r/2, the distance two edges merge by eye (DESIGN.md §2).
        double v = VelocityFactor * PhysicalConstants.SpeedOfLightMetersPerSecond;
        double separation = 0.5 * v * RiseSeconds / 2;
        double z1 = 50 * 20.0 / 18, z2 = z1 * 20.0 / 18;
        // 40 dB SNR: noise RMS = reflected step / 100; the reflected step is ρ of the 1 V incident step.
        double noise = (1.0 / 19) / 100;
        var network = Run(Segment(10), Segment(separation, z1), Segment(4, z2), RunEnd.Open);
        var result = Locator.Locate(Simulate(network, noise, seed: 7), Options());
        var pair = result.Events.Where(e => e.DistanceMeters is > 9.8 and < 10.3).OrderBy(e => e.DistanceMeters).ToList();
        Assert.True(pair.Count == 2, $"expected two events near 10 m, found: {string.Join("; ", result.Events.Select(e => $"{e.Kind} {e.DistanceMeters:0.####} m"))}");
        Assert.InRange(pair[0].DistanceMeters, 10 - PairPlacementFraction * separation, 10 + PairPlacementFraction * separation);
        Assert.InRange(pair[1].DistanceMeters, 10 + separation - PairPlacementFraction * separation, 10 + separation + PairPlacementFraction * separation);
        Assert.All(pair, e => Assert.Equal(EventKind.ImpedanceRise, e.Kind));
    }

    [Theory]
    [InlineData(+1)]
    [InlineData(-1)]
    public void TwoCloseStepsIntoAMatchedLineAreNamedStepsNotResistors(int sign)
    {
        // A staircase of two equal steps, ρ = ±1/11 each (Pozar, 4th ed., eq. 2.35), half of v·t_r/2 apart, into a line
        // that runs on matched. A series (or shunt) resistor just before the second step loads the port the same way to
        // within the rise, so the trace cannot ask for a resistor: with no evidence either way, no fault is named.
        double v = VelocityFactor * PhysicalConstants.SpeedOfLightMetersPerSecond;
        double separation = 0.5 * v * RiseSeconds / 2;
        double step = sign > 0 ? 12.0 / 10 : 10.0 / 12;
        double z1 = 50 * step, z2 = z1 * step;
        double noise = (1.0 / 11) / 100;
        var network = Run(Segment(6), Segment(separation, z1), Segment(8, z2), RunEnd.Matched);
        var result = Locator.Locate(Simulate(network, noise, seed: 5), Options());
        string found = string.Join("; ", result.Events.Select(e => $"{e.Kind} {e.DistanceMeters:0.####} m"));
        var expected = sign > 0 ? EventKind.ImpedanceRise : EventKind.ImpedanceDrop;
        Assert.True(result.Events.Count is 1 or 2, $"expected the staircase alone near 6 m, found: {found}");
        Assert.All(result.Events, e => Assert.InRange(e.DistanceMeters, 6 - separation, 6 + 2 * separation));
        // The first is a step; the last may also be read as the resistive end of Z₂ it is equivalent to.
        Assert.True(result.Events[0].Kind == expected, $"first event should be {expected}; found: {found}");
        Assert.True(result.Events[^1].Kind == expected || result.Events[^1].Kind == EventKind.Termination, $"found: {found}");
    }

    [Fact]
    public void MatchedLineHasNoEvents()
    {
        var result = Locator.Locate(Simulate(Run(Segment(30), RunEnd.Matched), seed: 11), Options());
        Assert.Empty(result.Events);
    }

    [Fact]
    public void NoiseOnlyTraceIsRefusedWithoutEvents()
    {
        var random = new Random(5);
        var samples = Enumerable.Range(0, 4096).Select(_ => 1e-3 * (random.NextDouble() - 0.5) * Math.Sqrt(12)).ToArray();
        var trace = new Trace(-5e-9, RiseSeconds / 8, samples);
        Assert.False(Locator.TryLocate(trace, Options(), out var result, out var error));
        Assert.Null(result);
        Assert.False(string.IsNullOrWhiteSpace(error));
        Assert.DoesNotContain('\n', error!);
    }

    [Fact]
    public void DistanceSigmaGrowsWithVelocityFactorUncertainty()
    {
        var trace = Simulate(Run(Segment(30), RunEnd.Open), seed: 3);
        var calibrated = Assert.Single(Locator.Locate(trace, Options(vfSigma: 0.002)).Events);
        var catalogue = Assert.Single(Locator.Locate(trace, Options(vfSigma: 0.05)).Events);
        Assert.True(catalogue.DistanceSigmaMeters > calibrated.DistanceSigmaMeters);
        // δd = d·δVF/VF (DESIGN.md §2) is one term of the quadrature sum, so σ_d is at least that and, when it dominates,
        // close to it (the fit's time term of a clean open is millimetres).
        double d = catalogue.DistanceMeters;
        Assert.InRange(catalogue.DistanceSigmaMeters, d * 0.05, d * 0.05 * 1.01);
        Assert.True(calibrated.DistanceSigmaMeters >= calibrated.DistanceMeters * 0.002);
    }
}
