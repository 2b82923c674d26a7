using CableFault.Analysis;
using CableFault.Cables;
using CableFault.Networks;
using CableFault.Simulation;
using CableFault.Workflows;
using Xunit.Abstractions;

namespace CableFault.Tests.Workflows;

/// <summary>
/// A launch lead must not move the fault: the same run located bare and behind a 2 m lead (of another cable, joined
/// by a slightly capacitive connector) gives the same distance once the lead's round trip is taken off.
/// </summary>
public sealed class LaunchLeadTests(ITestOutputHelper output)
{
    /// <summary>The issue's accuracy target: 0.1 % of the distance or 2 cm, whichever is larger.</summary>
    private const double TargetRelative = 0.001;

    private const double TargetFloorMeters = 0.02;

    private const double Vf = 0.66;
    private const double LeadVf = 0.80;
    private const double LeadMeters = 2.0;

    /// <summary>A poor joint of a few pF, large enough that the locator sees it, so that dropping it is tested.</summary>
    private const double ConnectorFarads = 3e-12;

    private static readonly InstrumentSettings Instrument = new()
    {
        RiseTimeSeconds = 1e-9, SampleIntervalSeconds = 100e-12, PreTriggerSeconds = 5e-9, SampleCount = 2600,
    };

    [Fact]
    public void TheFaultIsAtTheSameDistanceWithAndWithoutALead()
    {
        const double fault = 9, length = 18;
        var coax = new CableMedium(50, Vf);
        NetworkElement[] run = [new CableSegment(fault, coax), new ShuntResistor(150), new CableSegment(length - fault, coax), RunEnd.Open];
        var bare = new CableNetwork(new NetworkBranch(run));
        var led = new CableNetwork(new NetworkBranch(
            new NetworkElement[] { new CableSegment(LeadMeters, new CableMedium(50, LeadVf)), new ShuntCapacitor(ConnectorFarads) }.Concat(run).ToArray()));
        var options = new LocateOptions { VelocityFactor = Vf, VelocityFactorRelativeSigma = 0 };
        var lead = new LaunchLead(LeadMeters, LeadVf);

        var withoutLead = Locator.Locate(ForwardModel.Simulate(bare, Instrument), options);
        var withLead = lead.DropLeadEvents(Locator.Locate(ForwardModel.Simulate(led, Instrument), lead.Shift(options)));

        double tolerance = Math.Max(TargetRelative * fault, TargetFloorMeters);
        var a = withoutLead.Events.MinBy(e => Math.Abs(e.DistanceMeters - fault))!;
        var b = withLead.Events.MinBy(e => Math.Abs(e.DistanceMeters - fault))!;
        output.WriteLine($"without lead {a.DistanceMeters:F4} m, with lead {b.DistanceMeters:F4} m; events with lead: {string.Join(", ", withLead.Events.Select(e => $"{e.Kind}@{e.DistanceMeters:F3}"))}");
        Assert.InRange(b.DistanceMeters, a.DistanceMeters - tolerance, a.DistanceMeters + tolerance);
        Assert.InRange(b.DistanceMeters, fault - tolerance, fault + tolerance);
        var raw = Locator.Locate(ForwardModel.Simulate(led, Instrument), lead.Shift(options));
        Assert.Contains(raw.Events, e => Math.Abs(e.DistanceMeters) < tolerance);
        Assert.Contains(withLead.Warnings, w => w.Contains("lead", StringComparison.Ordinal));
        // Nothing is reported inside the lead or at its connector (distances at or before the reference plane).
        Assert.All(withLead.Events, e => Assert.True(e.DistanceMeters > 0, $"{e.Kind} at {e.DistanceMeters:F3} m lies in the lead"));
        // The far end too, to the same target: it is 18 m from the lead's end.
        var end = withLead.Events.Last();
        Assert.Equal(EventKind.Open, end.Kind);
        Assert.InRange(end.DistanceMeters, length - Math.Max(TargetRelative * length, TargetFloorMeters), length + Math.Max(TargetRelative * length, TargetFloorMeters));
    }

    [Fact]
    public void BadLeadValuesAreNamed()
    {
        Assert.NotEmpty(new LaunchLead(-1, 0.66).Problems());
        Assert.NotEmpty(new LaunchLead(2, 1.5).Problems());
        Assert.Empty(new LaunchLead(2, 0.66).Problems());
    }
}
