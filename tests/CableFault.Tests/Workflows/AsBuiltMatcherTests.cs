using CableFault.Analysis;
using CableFault.Cables;
using CableFault.Networks;
using CableFault.Simulation;
using CableFault.Workflows;
using Xunit.Abstractions;

namespace CableFault.Tests.Workflows;

/// <summary>
/// The matcher on a simulated run whose layout is known (the network is the ground truth): two splices and the end are
/// listed, a leak between them is not.
/// </summary>
public sealed class AsBuiltMatcherTests(ITestOutputHelper output)
{
    private const double Vf = 0.66;

    /// <summary>Data-sheet VF spread (common practice, as CableSettings.NominalVelocityFactorRelativeSigma).</summary>
    private const double VfRelativeSigma = 0.02;

    private const double SpliceOneMeters = 8, LeakMeters = 15, SpliceTwoMeters = 21, EndMeters = 30;

    private static readonly CableMedium Coax = new(50, Vf);

    /// <summary>8 m to a 10 nH splice, a 150 Ω leak at 15 m, a 5 pF splice at 21 m, open at 30 m.</summary>
    private static readonly CableNetwork Run = new(new NetworkBranch([
        new CableSegment(SpliceOneMeters, Coax), new SeriesInductor(10e-9),
        new CableSegment(LeakMeters - SpliceOneMeters, Coax), new ShuntResistor(150),
        new CableSegment(SpliceTwoMeters - LeakMeters, Coax), new ShuntCapacitor(5e-12),
        new CableSegment(EndMeters - SpliceTwoMeters, Coax), RunEnd.Open]));

    private static LocateResult Locate(CableNetwork network, InstrumentSettings? instrument = null)
    {
        instrument ??= InstrumentSettings.DefaultFor(network, 1e-9) with { NoiseRmsVolts = 0.5e-3, NoiseSeed = 7 };
        return Locator.Locate(ForwardModel.Simulate(network, instrument), new LocateOptions { VelocityFactor = Vf, VelocityFactorRelativeSigma = VfRelativeSigma });
    }

    private static readonly Lazy<LocateResult> Located = new(() => Locate(Run));

    private static AsBuiltEntry Entry(string kind, double meters, string? label = null, double tolerance = AsBuiltList.DefaultToleranceMeters)
    {
        Assert.True(AsBuiltKinds.TryAccepted(kind, out var kinds));
        return new AsBuiltEntry(kind, meters, label, tolerance, kinds);
    }

    private void Show(AsBuiltMatch match)
    {
        foreach (var m in match.Events)
            output.WriteLine($"{m.Event.Kind} at {m.Event.DistanceMeters:F3} ± {m.Event.DistanceSigmaMeters:F3} m: {(m.Expected ? "expected " + m.Entry!.Name : "UNEXPECTED")}");
        foreach (var miss in match.Missing) output.WriteLine($"missing: {miss.Explanation}");
    }

    [Fact]
    public void ListedSplicesAndTheEndAreExpectedAndTheLeakIsNot()
    {
        var list = new AsBuiltList([Entry("splice", SpliceOneMeters, "S1"), Entry("splice", SpliceTwoMeters, "S2"), Entry("end", EndMeters)]);
        var match = AsBuiltMatcher.Match(Located.Value, list);
        Show(match);

        Assert.Empty(match.Missing);
        Assert.Equal(3, match.ExpectedCount);
        var unexpected = Assert.Single(match.Unexpected);
        Assert.InRange(unexpected.Event.DistanceMeters, LeakMeters - 0.5, LeakMeters + 0.5);
        Assert.Null(unexpected.NearbyEntry);
        Assert.Equal("S1", match.Events.Single(m => Math.Abs(m.Event.DistanceMeters - SpliceOneMeters) < 0.5).Entry!.Label);
        Assert.Equal("S2", match.Events.Single(m => Math.Abs(m.Event.DistanceMeters - SpliceTwoMeters) < 0.5).Entry!.Label);
    }

    [Fact]
    public void AFeatureListedAtTheWrongDistanceIsUnexpectedAndMissing()
    {
        // S2 recorded 2 m too far out: beyond its gate √(0.5² + (2·0.02·21)²) ≈ 0.97 m.
        const double wrong = SpliceTwoMeters + 2;
        var list = new AsBuiltList([Entry("splice", SpliceOneMeters, "S1"), Entry("splice", wrong, "S2"), Entry("end", EndMeters)]);
        var match = AsBuiltMatcher.Match(Located.Value, list);
        Show(match);

        var missing = Assert.Single(match.Missing);
        Assert.Equal("S2", missing.Entry.Label);
        Assert.Equal(AsBuiltMissReason.NotSeen, missing.Reason);
        Assert.Equal(2, match.Unexpected.Count);
        Assert.Contains(match.Unexpected, m => Math.Abs(m.Event.DistanceMeters - SpliceTwoMeters) < 0.5);
    }

    [Fact]
    public void AJointThatShowsAsALeakIsNotExpected()
    {
        // The leak's place is listed as a splice: a splice does not look like a shunt resistance, so the leak stays a
        // finding, and the listed splice is reported as present but of the wrong kind.
        var list = new AsBuiltList([Entry("splice", LeakMeters, "S9")]);
        var match = AsBuiltMatcher.Match(Located.Value, list);
        Show(match);

        var leak = match.Events.Single(m => Math.Abs(m.Event.DistanceMeters - LeakMeters) < 0.5);
        Assert.False(leak.Expected);
        Assert.Equal("S9", leak.NearbyEntry?.Label);
        Assert.Equal(AsBuiltMissReason.KindDiffers, Assert.Single(match.Missing).Reason);
    }

    [Fact]
    public void AFeatureBeyondTheRecordIsSaidToBeOutOfReach()
    {
        // 2100 samples of 125 ps end about 257 ns after the edge, 25.4 m at VF 0.66: a splice listed at 27 m and the end are
        // not in the record.
        var shortRecord = InstrumentSettings.DefaultFor(Run, 1e-9) with { SampleCount = 2100, NoiseRmsVolts = 0.5e-3, NoiseSeed = 7 };
        var result = Locate(Run, shortRecord);
        var list = new AsBuiltList([Entry("splice", SpliceOneMeters, "S1"), Entry("splice", 27, "S3"), Entry("end", EndMeters)]);
        var match = AsBuiltMatcher.Match(result, list);
        Show(match);

        Assert.Equal(2, match.Missing.Count);
        Assert.All(match.Missing, m => Assert.Equal(AsBuiltMissReason.BeyondRecord, m.Reason));
        Assert.True(match.Events.Single(m => Math.Abs(m.Event.DistanceMeters - SpliceOneMeters) < 0.5).Expected);
    }

    [Fact]
    public void FeaturesPastAnEarlyBreakAreExplainedByIt()
    {
        // A break (open) at 12 m: the listed S2 and end lie behind it.
        var broken = new CableNetwork(new NetworkBranch([
            new CableSegment(SpliceOneMeters, Coax), new SeriesInductor(10e-9), new CableSegment(4, Coax), RunEnd.Open]));
        var instrument = InstrumentSettings.DefaultFor(Run, 1e-9) with { NoiseRmsVolts = 0.5e-3, NoiseSeed = 7 };
        var match = AsBuiltMatcher.Match(Locate(broken, instrument),
            new AsBuiltList([Entry("splice", SpliceOneMeters, "S1"), Entry("splice", SpliceTwoMeters, "S2"), Entry("end", EndMeters)]));
        Show(match);

        Assert.Equal(["S2", null], match.Missing.Select(m => m.Entry.Label));
        Assert.All(match.Missing, m => Assert.Equal(AsBuiltMissReason.BeyondFullReflection, m.Reason));
        Assert.Contains(match.Unexpected, m => m.Event.Kind == EventKind.Open && Math.Abs(m.Event.DistanceMeters - 12) < 0.5);
    }

    [Fact]
    public void TheGateIsTheToleranceAndTwoSigmaInQuadrature()
    {
        // Hand value: √(0.5² + (2·0.2)²) = √0.41 = 0.6403 m.
        const double gate = 0.6403;
        var entry = Entry("splice", 10, tolerance: 0.5);
        LocatedEvent At(double meters) => new(meters, 0.2, EventKind.Inductive, 0.01, null, 1e-9, 0.9, 0);
        Assert.True(AsBuiltMatcher.Match([At(10 + gate - 0.01)], new AsBuiltList([entry])).Events[0].Expected);
        Assert.False(AsBuiltMatcher.Match([At(10 + gate + 0.01)], new AsBuiltList([entry])).Events[0].Expected);
        Assert.False(AsBuiltMatcher.Match([At(10 - gate - 0.01)], new AsBuiltList([entry])).Events[0].Expected);
    }

    [Fact]
    public void AnEventPastTheOpenEndIsAnEchoNotAFinding()
    {
        // Nothing travels past a full reflection (ρ = +1): an event found beyond it is a re-reflection.
        LocatedEvent open = new(20, 0.4, EventKind.Open, 1, null, null, 1, 0);
        LocatedEvent later = new(40, 0.8, EventKind.Unknown, 0.02, null, null, 0.5, 0);
        var match = AsBuiltMatcher.Match([open, later], new AsBuiltList([Entry("end", 20)]));
        Assert.True(match.Events[0].Expected);
        Assert.Same(open, match.Events[1].BeyondFullReflection);
        Assert.Empty(match.Unexpected);
        Assert.Single(match.Echoes);
    }

    [Fact]
    public void AnEntryRefusesImpossibleNumbers()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => new AsBuiltEntry("splice", -1, null, 0.5, [EventKind.Inductive]));
        Assert.Throws<ArgumentOutOfRangeException>(() => new AsBuiltEntry("splice", double.NaN, null, 0.5, [EventKind.Inductive]));
        Assert.Throws<ArgumentOutOfRangeException>(() => new AsBuiltEntry("splice", 3, null, 0, [EventKind.Inductive]));
    }

    [Fact]
    public void EachFeatureTakesOneEventTheClosest()
    {
        var entry = Entry("splice", 10, "S1");
        LocatedEvent At(double meters) => new(meters, 0.1, EventKind.Capacitive, -0.01, null, 1e-12, 0.9, 0);
        var match = AsBuiltMatcher.Match([At(9.7), At(10.1)], new AsBuiltList([entry]));
        Assert.False(match.Events[0].Expected);
        Assert.True(match.Events[1].Expected);
        Assert.Empty(match.Missing);
    }
}
