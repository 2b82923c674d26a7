using CableFault.Analysis;
using CableFault.Networks;
using static CableFault.Tests.Analysis.Locate.LocateFixtures;

namespace CableFault.Tests.Analysis.Locate;

/// <summary>
/// Two faults at one place, where a short section of other cable meets the run again or begins: a leak or a bad joint in
/// the splice at its end, a connector's inductance at its start. At first each reflects like a single step (a drop to Z₀‖R,
/// a rise to Z₀ + R, a step slightly moved), and only the rest of the trace tells them apart: the far end's echo returns
/// through a resistor differently than through a step (DC divider, Pozar, 4th ed., §2.3), and a series L between Z₁ and Z₂
/// adds its own reflection of time constant L/(Z₁ + Z₂) to the step (ρ(s) = (sL + Z₂ − Z₁)/(sL + Z₂ + Z₁)). The records are
/// long enough (over 200 rise times) that the selection works on smoothed data and the sharper look decides the details.
/// The network is the truth.
/// </summary>
public class CompoundEventTests
{
    private const double SectionAt = 20, SectionMeters = 3, OpenAt = 90;

    [Theory]
    [InlineData(75, 500)]
    [InlineData(30, 300)]
    public void LeakWhereASectionEndsIsALeakAndAReturnToTheRun(double sectionOhms, double leakOhms)
    {
        const double joint = SectionAt + SectionMeters;
        var network = Run(Segment(SectionAt), Segment(SectionMeters, sectionOhms), new ShuntResistor(leakOhms),
            Segment(OpenAt - joint), RunEnd.Open);
        var result = Locator.Locate(Simulate(network, seed: 3), Options());
        string found = Describe(result);

        // The leak's size rests on the end's echo level: ±10 % (a 1 mV-noise record sees that level to far better than 1 %,
        // the rest is the trade with the coincident step).
        AssertOneAt(result, EventKind.PartialShort, joint, leakOhms, 0.10);
        var back = result.Events.SingleOrDefault(e => e.Kind is EventKind.ImpedanceDrop or EventKind.ImpedanceRise
            && Math.Abs(e.DistanceMeters - joint) < 0.5);
        Assert.True(back?.ImpedanceOhms is double z && Math.Abs(z - ImpedanceOhms) < 2.5, $"expected a return to {ImpedanceOhms} Ω at {joint} m; found: {found}");
        var end = result.Events[^1];
        Assert.True(end.Kind == EventKind.Open, $"found: {found}");
        Assert.InRange(end.DistanceMeters, OpenAt - DistanceTolerance(OpenAt), OpenAt + DistanceTolerance(OpenAt));
        Assert.True(result.Events.Count == 4, $"expected a rise/drop, a leak, a return and the open; found: {found}");
    }

    [Fact]
    public void BadJointWhereALowSectionEndsIsASeriesResistanceAndAReturnToTheRun()
    {
        const double joint = SectionAt + SectionMeters, seriesOhms = 12;
        var network = Run(Segment(SectionAt), Segment(SectionMeters, 35), new SeriesResistor(seriesOhms),
            Segment(OpenAt - joint), RunEnd.Short);
        var result = Locator.Locate(Simulate(network, seed: 4), Options());
        string found = Describe(result);

        AssertOneAt(result, EventKind.SeriesResistance, joint, seriesOhms, 0.10);
        Assert.True(result.Events[^1].Kind == EventKind.Short, $"found: {found}");
        Assert.True(result.Events.Count == 4, $"expected a drop, a series resistance, a return and the short; found: {found}");
    }

    [Fact]
    public void ConnectorWhereASectionBeginsIsAnInductiveSpotAndARise()
    {
        const double inductanceHenries = 25e-9;
        var network = Run(Segment(SectionAt), new SeriesInductor(inductanceHenries), Segment(SectionMeters, 75),
            Segment(OpenAt - SectionAt - SectionMeters), RunEnd.Open);
        var result = Locator.Locate(Simulate(network, seed: 5), Options());
        string found = Describe(result);

        // ±20 %: at one place the spot's size trades with the step's position (both delay the edge), a correlation the
        // fit's covariance shows; the technician needs "about 25 nH at the joint".
        AssertOneAt(result, EventKind.Inductive, SectionAt, inductanceHenries, 0.20);
        var rise = result.Events.SingleOrDefault(e => e.Kind == EventKind.ImpedanceRise);
        Assert.True(rise?.ImpedanceOhms is double z && Math.Abs(z - 75) < 3, $"expected a rise to 75 Ω at {SectionAt} m; found: {found}");
        Assert.True(result.Events.Count == 4, $"expected a spot, a rise, a drop and the open; found: {found}");
    }

    /// <summary>Exactly one event of <paramref name="kind"/>, within the distance target of <paramref name="meters"/>, its
    /// value (SI) within <paramref name="relativeTolerance"/> of <paramref name="value"/>.</summary>
    private static void AssertOneAt(LocateResult result, EventKind kind, double meters, double value, double relativeTolerance)
    {
        string found = Describe(result);
        var one = result.Events.SingleOrDefault(e => e.Kind == kind);
        Assert.True(one is not null, $"expected one {kind} at {meters} m; found: {found}");
        Assert.InRange(one!.DistanceMeters, meters - DistanceTolerance(meters), meters + DistanceTolerance(meters));
        Assert.True(one.Value is double v && Math.Abs(v / value - 1) < relativeTolerance, $"{kind} {one.Value}, expected {value}; found: {found}");
    }
}
