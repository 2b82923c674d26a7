using CableFault.Analysis;
using CableFault.Networks;
using static CableFault.Tests.Analysis.Locate.LocateFixtures;

namespace CableFault.Tests.Analysis.Locate;

/// <summary>
/// One reference check per event kind: a network built here is simulated by the forward model with 1 mV of seeded
/// noise on a 1 V step, located, and compared with the network (distance) and with the closed form of its reflection
/// (the formula and its source named beside each check).
/// </summary>
public class EventKindReferenceTests
{
    /// <summary>ρ tolerance for lasting steps: at −60 dB noise the fit pins ρ to well under 1 %; 0.02 allows for the
    /// model's edge being fitted along with the events.</summary>
    private const double ReflectionTolerance = 0.02;

    /// <summary>Relative tolerance of a resistance or impedance read from a lasting step (ρ to 1 % moves Z by ~2–3 %).</summary>
    private const double ResistanceRelativeTolerance = 0.05;

    /// <summary>Relative tolerance of a C or L: they are read from a transient shorter than the rise, so from its area.</summary>
    private const double LumpedRelativeTolerance = 0.10;

    private static void AssertDistance(LocatedEvent e, double meters) =>
        Assert.True(Math.Abs(e.DistanceMeters - meters) <= DistanceTolerance(meters),
            $"{e.Kind} at {e.DistanceMeters:0.####} m, expected {meters} m ± {DistanceTolerance(meters)} m");

    [Fact]
    public void OpenEndIsOpenWithReflectionPlusOne()
    {
        var result = Locator.Locate(Simulate(Run(Segment(30), RunEnd.Open)), Options());
        var open = Assert.Single(result.Events);
        Assert.Equal(EventKind.Open, open.Kind);
        // Open: ρ = +1 (DESIGN.md §2; Pozar, Microwave Engineering, 4th ed., §2.3).
        Assert.InRange(open.Reflection, 1 - ReflectionTolerance, 1);
        AssertDistance(open, 30);
    }

    [Fact]
    public void ShortEndIsShortWithReflectionMinusOne()
    {
        var result = Locator.Locate(Simulate(Run(Segment(25), RunEnd.Short)), Options());
        var end = Assert.Single(result.Events);
        Assert.Equal(EventKind.Short, end.Kind);
        // Short: ρ = −1 (DESIGN.md §2).
        Assert.InRange(end.Reflection, -1, -1 + ReflectionTolerance);
        AssertDistance(end, 25);
    }

    [Fact]
    public void StepUpTo75OhmsIsImpedanceRise()
    {
        var result = Locator.Locate(Simulate(Run(Segment(12), Segment(8, 75), RunEnd.Open)), Options());
        var rise = Near(result, 12);
        Assert.Equal(EventKind.ImpedanceRise, rise.Kind);
        // ρ = (Z_L − Z_0)/(Z_L + Z_0) = (75 − 50)/(75 + 50) = 0.2 (Pozar, 4th ed., eq. 2.35).
        Assert.InRange(rise.Reflection, 0.2 - ReflectionTolerance, 0.2 + ReflectionTolerance);
        Assert.InRange(rise.ImpedanceOhms!.Value, 75 * (1 - ResistanceRelativeTolerance), 75 * (1 + ResistanceRelativeTolerance));
        AssertDistance(rise, 12);
        AssertDistance(Near(result, 20), 20);
        Assert.Equal(EventKind.Open, Near(result, 20).Kind);
    }

    [Fact]
    public void StepDownTo35OhmsIsImpedanceDrop()
    {
        var result = Locator.Locate(Simulate(Run(Segment(15), Segment(10, 35), RunEnd.Open)), Options());
        var drop = Near(result, 15);
        Assert.Equal(EventKind.ImpedanceDrop, drop.Kind);
        // ρ = (35 − 50)/(35 + 50) = −0.17647 (Pozar, 4th ed., eq. 2.35).
        Assert.InRange(drop.Reflection, -0.17647 - ReflectionTolerance, -0.17647 + ReflectionTolerance);
        Assert.InRange(drop.ImpedanceOhms!.Value, 35 * (1 - ResistanceRelativeTolerance), 35 * (1 + ResistanceRelativeTolerance));
        AssertDistance(drop, 15);
    }

    [Fact]
    public void ShuntCapacitorIsCapacitiveWithItsFarads()
    {
        // 20 pF on 50 Ω: τ = Z₀C/2 = 0.5 ns (DESIGN.md §2), a dip comparable to the 1 ns rise.
        var result = Locator.Locate(Simulate(Run(Segment(14), new ShuntCapacitor(20e-12), Segment(16), RunEnd.Open)), Options());
        var spot = Near(result, 14);
        Assert.Equal(EventKind.Capacitive, spot.Kind);
        Assert.InRange(spot.Value!.Value, 20e-12 * (1 - LumpedRelativeTolerance), 20e-12 * (1 + LumpedRelativeTolerance));
        Assert.True(spot.Reflection < 0, "a shunt capacitor shows a dip");
        AssertDistance(spot, 14);
    }

    [Fact]
    public void SeriesInductorIsInductiveWithItsHenries()
    {
        // 50 nH on 50 Ω: τ = L/(2Z₀) = 0.5 ns (DESIGN.md §2).
        var result = Locator.Locate(Simulate(Run(Segment(14), new SeriesInductor(50e-9), Segment(16), RunEnd.Open)), Options());
        var spot = Near(result, 14);
        Assert.Equal(EventKind.Inductive, spot.Kind);
        Assert.InRange(spot.Value!.Value, 50e-9 * (1 - LumpedRelativeTolerance), 50e-9 * (1 + LumpedRelativeTolerance));
        Assert.True(spot.Reflection > 0, "a series inductor shows a bump");
        AssertDistance(spot, 14);
    }

    [Fact]
    public void ShuntResistorBeforeAnOpenEndIsPartialShort()
    {
        var result = Locator.Locate(Simulate(Run(Segment(10), new ShuntResistor(100), Segment(15), RunEnd.Open)), Options());
        var fault = Near(result, 10);
        Assert.Equal(EventKind.PartialShort, fault.Kind);
        // Shunt R across Z₀: ρ = −Z₀/(2R + Z₀) = −50/250 = −0.2 (DESIGN.md §2).
        Assert.InRange(fault.Reflection, -0.2 - ReflectionTolerance, -0.2 + ReflectionTolerance);
        Assert.InRange(fault.Value!.Value, 100 * (1 - ResistanceRelativeTolerance), 100 * (1 + ResistanceRelativeTolerance));
        AssertDistance(fault, 10);
        Assert.Equal(EventKind.Open, Near(result, 25).Kind);
    }

    [Fact]
    public void SeriesResistorBeforeAShortEndIsSeriesResistance()
    {
        var result = Locator.Locate(Simulate(Run(Segment(10), new SeriesResistor(30), Segment(15), RunEnd.Short)), Options());
        var joint = Near(result, 10);
        Assert.Equal(EventKind.SeriesResistance, joint.Kind);
        // Series R on Z₀: ρ = R/(R + 2Z₀) = 30/130 = 0.2308 (DESIGN.md §2, the load Z₀ + R).
        Assert.InRange(joint.Reflection, 0.2308 - ReflectionTolerance, 0.2308 + ReflectionTolerance);
        Assert.InRange(joint.Value!.Value, 30 * (1 - ResistanceRelativeTolerance), 30 * (1 + ResistanceRelativeTolerance));
        AssertDistance(joint, 10);
        Assert.Equal(EventKind.Short, Near(result, 25).Kind);
    }

    [Fact]
    public void EqualLineJunctionIsTapWithMinusOneThird()
    {
        // At 12 m the run splits: a 6 m open branch and the 20 m main line to an open end.
        var network = Run(Segment(12), new Junction([
            new NetworkBranch(Segment(20), RunEnd.Open),
            new NetworkBranch(Segment(6), RunEnd.Open)]));
        var result = Locator.Locate(Simulate(network), Options());
        var tap = Near(result, 12);
        Assert.Equal(EventKind.Tap, tap.Kind);
        // Two equal lines in parallel: Z₀/2, ρ = −1/3 (DESIGN.md §2).
        Assert.InRange(tap.Reflection, -1.0 / 3 - ReflectionTolerance, -1.0 / 3 + ReflectionTolerance);
        AssertDistance(tap, 12);
        Assert.Contains(result.Events, e => e.Kind == EventKind.Open && Math.Abs(e.DistanceMeters - 32) <= DistanceTolerance(32));
        // The branch's open end is reported (12 + 6 m along the branch); its re-reflections are not events of their own.
        Assert.Contains(result.Events, e => e.Kind == EventKind.Open && Math.Abs(e.DistanceMeters - 18) <= DistanceTolerance(18));
        Assert.Equal(3, result.Events.Count);
    }

    [Fact]
    public void ResistiveEndIsTerminationWithItsOhms()
    {
        var result = Locator.Locate(Simulate(Run(Segment(40), RunEnd.Resistor(150))), Options());
        var end = Assert.Single(result.Events);
        Assert.Equal(EventKind.Termination, end.Kind);
        // ρ = (150 − 50)/(150 + 50) = 0.5 (Pozar, 4th ed., eq. 2.35).
        Assert.InRange(end.Reflection, 0.5 - ReflectionTolerance, 0.5 + ReflectionTolerance);
        Assert.InRange(end.Value!.Value, 150 * (1 - ResistanceRelativeTolerance), 150 * (1 + ResistanceRelativeTolerance));
        AssertDistance(end, 40);
    }
}
