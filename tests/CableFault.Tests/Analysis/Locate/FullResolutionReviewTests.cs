using CableFault.Analysis;
using CableFault.Networks;
using static CableFault.Tests.Analysis.Locate.LocateFixtures;

namespace CableFault.Tests.Analysis.Locate;

/// <summary>
/// A short stretch of other cable on a long record. Over 200 m the record spans thousands of rise times, so the model is
/// fitted to smoothed data on which a section two rise times long and a lumped L or C reflect alike; the unsmoothed
/// samples still tell them apart (a section's reflection is a flat-topped pulse between two edges of ρ = ±(Z₁ − Z₀)/(Z₁ + Z₀),
/// Pozar, <i>Microwave Engineering</i>, 4th ed., eq. 2.35; a lumped part's is an exponential of time constant L/2Z₀ or
/// Z₀C/2, ibid. §2.3). The network is the truth; the lumped case checks that a real spot stays a spot.
/// </summary>
public class FullResolutionReviewTests
{
    private const double SectionAt = 60, RunMeters = 200;

    /// <summary>Two instrument rise times of round trip: u = v·t_r/2 = 0.099 m, so 0.2 m.</summary>
    private const double SectionMeters = 0.2;

    [Theory]
    [InlineData(75)]
    [InlineData(33)]
    public void ShortSectionOnALongRecordIsTwoSteps(double sectionOhms)
    {
        var network = Run(Segment(SectionAt), Segment(SectionMeters, sectionOhms), Segment(RunMeters - SectionAt - SectionMeters), RunEnd.Open);
        var result = Locator.Locate(Simulate(network, seed: 11), Options());
        string found = Describe(result);

        var (into, back) = sectionOhms > ImpedanceOhms
            ? (EventKind.ImpedanceRise, EventKind.ImpedanceDrop) : (EventKind.ImpedanceDrop, EventKind.ImpedanceRise);
        var start = result.Events.SingleOrDefault(e => e.Kind == into);
        var end = result.Events.SingleOrDefault(e => e.Kind == back);
        Assert.True(start is not null && end is not null, $"expected a {into} and a {back}; found: {found}");
        Assert.InRange(start!.DistanceMeters, SectionAt - DistanceTolerance(SectionAt), SectionAt + DistanceTolerance(SectionAt));
        double endAt = SectionAt + SectionMeters;
        Assert.InRange(end!.DistanceMeters, endAt - DistanceTolerance(endAt), endAt + DistanceTolerance(endAt));
        // The section's impedance within 5 % (its plateau is two rise times long at −60 dB noise).
        Assert.True(start.ImpedanceOhms is double z && Math.Abs(z / sectionOhms - 1) < 0.05, $"found: {found}");
        Assert.DoesNotContain(result.Events, e => e.Kind is EventKind.Capacitive or EventKind.Inductive);
        Assert.True(result.Events[^1].Kind == EventKind.Open && result.Events.Count == 3, $"found: {found}");
    }

    [Fact]
    public void LumpedInductanceOnALongRecordStaysASpot()
    {
        // L/2Z₀ = 0.3 ns: a spot of about the size of the 75 Ω section above, whose low-frequency equivalent is a series
        // Z₁τ − Z₀²τ/Z₁ ≈ 42 nH (τ = 1.01 ns its one-way delay).
        const double inductanceHenries = 30e-9;
        var network = Run(Segment(SectionAt), new SeriesInductor(inductanceHenries), Segment(RunMeters - SectionAt), RunEnd.Open);
        var result = Locator.Locate(Simulate(network, seed: 12), Options());
        string found = Describe(result);

        var spot = result.Events.SingleOrDefault(e => e.Kind == EventKind.Inductive);
        Assert.True(spot?.Value is double l && Math.Abs(l / inductanceHenries - 1) < 0.1, $"expected one inductive spot of 30 nH; found: {found}");
        Assert.InRange(spot!.DistanceMeters, SectionAt - DistanceTolerance(SectionAt), SectionAt + DistanceTolerance(SectionAt));
        Assert.True(result.Events.Count == 2, $"expected the spot and the open; found: {found}");
    }
}
