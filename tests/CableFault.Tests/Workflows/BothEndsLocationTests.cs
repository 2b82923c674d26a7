using System.Globalization;
using CableFault.Analysis;
using CableFault.Cables;
using CableFault.Networks;
using CableFault.Simulation;
using CableFault.Tests.Reference.Ngspice;
using CableFault.Traces;
using CableFault.Workflows;
using Xunit.Abstractions;

namespace CableFault.Tests.Workflows;

/// <summary>
/// Both-ends location: x = L·t_A/(t_A + t_B) must not depend on the velocity factor. Each run is simulated from end A
/// and, reversed, from end B (end A left open), then located with a VF deliberately 5 % too high.
/// </summary>
public sealed class BothEndsLocationTests(ITestOutputHelper output)
{
    /// <summary>The issue's accuracy target for a both-ends distance: 0.1 % of the distance …</summary>
    private const double TargetRelative = 0.001;

    /// <summary>… or 2 cm, whichever is larger.</summary>
    private const double TargetFloorMeters = 0.02;

    /// <summary>The stated VF is this much too high, so a single-ended distance comes out this much too long.</summary>
    private const double VelocityFactorError = 0.05;

    /// <summary>A single-ended distance must be off by at least 4 % (the 5 % error less fitting slack) for the check
    /// to show that the VF error was really there.</summary>
    private const double SingleEndedMinimumError = 0.04;

    private const double Vf = 0.66;
    private const double RiseSeconds = 1e-9;
    private const double SampleSeconds = 100e-12;
    private const double PreTriggerSeconds = 5e-9;

    private static readonly CableMedium Coax = new(50, Vf);

    private static InstrumentSettings Instrument(double runMeters) => new()
    {
        RiseTimeSeconds = RiseSeconds, SampleIntervalSeconds = SampleSeconds, PreTriggerSeconds = PreTriggerSeconds,
        // The record ends a quarter of the run's round trip after the far end: enough to fit it, few multiple echoes.
        SampleCount = (int)((PreTriggerSeconds + 1.25 * 2 * runMeters / (Vf * PhysicalConstants.SpeedOfLightMetersPerSecond)) / SampleSeconds),
    };

    private static LocateResult LocateWrongVf(Trace trace) =>
        Locator.Locate(trace, new LocateOptions { VelocityFactor = Vf * (1 + VelocityFactorError), VelocityFactorRelativeSigma = 0 });

    public static TheoryData<string, double, double> Runs => new()
    {
        // name, fault position from A (m), run length (m)
        { "shunt 100 Ω", 7.0, 20.0 },
        { "75 Ω section start", 12.5, 18.0 },
    };

    private static CableNetwork Run(string name, double faultMeters, double lengthMeters) => name switch
    {
        "shunt 100 Ω" => new CableNetwork(new NetworkBranch(new CableSegment(faultMeters, Coax), new ShuntResistor(100),
            new CableSegment(lengthMeters - faultMeters, Coax), RunEnd.Open)),
        // A 2 m piece of 75 Ω cable with the same VF: two events, the first at faultMeters.
        "75 Ω section start" => new CableNetwork(new NetworkBranch(new CableSegment(faultMeters, Coax), new CableSegment(2, new CableMedium(75, Vf)),
            new CableSegment(lengthMeters - faultMeters - 2, Coax), RunEnd.Open)),
        _ => throw new ArgumentException(name),
    };

    [Theory]
    [MemberData(nameof(Runs))]
    public void BothEndsDistanceIgnoresAWrongVelocityFactor(string name, double faultMeters, double lengthMeters)
    {
        var network = Run(name, faultMeters, lengthMeters);
        var settings = Instrument(lengthMeters);
        var fromA = LocateWrongVf(ForwardModel.Simulate(network, settings));
        var fromB = LocateWrongVf(ForwardModel.Simulate(NetworkReversal.Reverse(network, RunEnd.Open), settings));
        var result = BothEndsLocation.Combine(fromA, fromB, lengthMeters);

        CheckFault(result, fromA, faultMeters, name);
    }

    private void CheckFault(BothEndsResult result, LocateResult fromA, double faultMeters, string name)
    {
        var both = result.Events.Where(e => e.SeenFrom == SeenFrom.BothEnds).ToList();
        Assert.NotEmpty(both);
        var nearest = both.MinBy(e => Math.Abs(e.DistanceFromAMeters - faultMeters))!;
        double tolerance = Math.Max(TargetRelative * faultMeters, TargetFloorMeters);
        var single = fromA.Events.MinBy(e => Math.Abs(e.DistanceMeters - faultMeters * (1 + VelocityFactorError)))!;
        double singleError = single.DistanceMeters / faultMeters - 1;
        output.WriteLine($"{name}: both ends {nearest.DistanceFromAMeters:F4} ± {nearest.DistanceSigmaMeters:F4} m (true {faultMeters} m); single-ended {single.DistanceMeters:F4} m ({singleError:P2})");
        Assert.InRange(nearest.DistanceFromAMeters, faultMeters - tolerance, faultMeters + tolerance);
        Assert.True(Math.Abs(singleError) > SingleEndedMinimumError, $"single-ended error {singleError:P2} should be about {VelocityFactorError:P0}");
        // VF = 2L/(c·T) with T = 2L/v: the pair must give back the simulated VF (to the same 0.1 % target).
        output.WriteLine($"{name}: implied VF {result.ImpliedVelocityFactor:F5} ± {result.ImpliedVelocityFactorSigma:E2}");
        Assert.InRange(result.ImpliedVelocityFactor, Vf * (1 - TargetRelative), Vf * (1 + TargetRelative));
    }

    /// <summary>Noise of 2 mV RMS on a 1 V step (seeded): a field-grade trace. The both-ends σ must cover the error:
    /// within 4 σ (a 6e-5 chance of a false failure for a Gaussian error).</summary>
    [Fact]
    public void WithNoiseTheSigmaCoversTheError()
    {
        const double length = 20, fault = 7;
        var network = Run("shunt 100 Ω", fault, length);
        var fromA = LocateWrongVf(ForwardModel.Simulate(network, Instrument(length) with { NoiseRmsVolts = 2e-3, NoiseSeed = 11 }));
        var fromB = LocateWrongVf(ForwardModel.Simulate(NetworkReversal.Reverse(network, RunEnd.Open), Instrument(length) with { NoiseRmsVolts = 2e-3, NoiseSeed = 12 }));
        var result = BothEndsLocation.Combine(fromA, fromB, length);
        var nearest = result.Events.Where(e => e.SeenFrom == SeenFrom.BothEnds).MinBy(e => Math.Abs(e.DistanceFromAMeters - fault))!;
        output.WriteLine($"noisy: {nearest.DistanceFromAMeters:F4} ± {nearest.DistanceSigmaMeters:F4} m (true {fault} m); {result.Events.Count} event(s)");
        double tolerance = Math.Max(TargetRelative * fault, TargetFloorMeters);
        Assert.InRange(nearest.DistanceFromAMeters, fault - tolerance, fault + tolerance);
        Assert.True(nearest.DistanceSigmaMeters > 0, "a noisy fit must report a non-zero σ");
        Assert.True(Math.Abs(nearest.DistanceFromAMeters - fault) <= 4 * nearest.DistanceSigmaMeters + 1e-4,
            $"error {nearest.DistanceFromAMeters - fault:F4} m against σ {nearest.DistanceSigmaMeters:F4} m");
    }

    [Fact]
    public void AFullBreakIsPlacedFromTheTwoOpens()
    {
        // The run is cut at 8 m of 20 m: A sees an open at 8 m, B an open at 12 m, and neither sees the far end. The
        // two opens are one fault (t_A + t_B = T), not the run's two ends (t_A ≈ t_B ≈ T).
        const double length = 20, cut = 8;
        var coax = Coax;
        var settings = Instrument(length);
        var fromA = LocateWrongVf(ForwardModel.Simulate(new CableNetwork(new NetworkBranch(new CableSegment(cut, coax), RunEnd.Open)), settings));
        var fromB = LocateWrongVf(ForwardModel.Simulate(new CableNetwork(new NetworkBranch(new CableSegment(length - cut, coax), RunEnd.Open)), settings));
        var result = BothEndsLocation.Combine(fromA, fromB, length);

        var fault = Assert.Single(result.Events);
        Assert.Equal(SeenFrom.BothEnds, fault.SeenFrom);
        double tolerance = Math.Max(TargetRelative * cut, TargetFloorMeters);
        output.WriteLine($"break: {fault.DistanceFromAMeters:F4} m (true {cut} m), implied VF {result.ImpliedVelocityFactor:F5}");
        Assert.InRange(fault.DistanceFromAMeters, cut - tolerance, cut + tolerance);
        Assert.InRange(result.ImpliedVelocityFactor, Vf * (1 - TargetRelative), Vf * (1 + TargetRelative));
    }

    [Fact]
    public void AFaultSeenFromOneEndOnlyIsFlagged()
    {
        // A shunt 100 Ω at 6 m from A; from B the trace is cut short before it, so B cannot see it.
        const double length = 20, fault = 6;
        var network = Run("shunt 100 Ω", fault, length);
        var settings = Instrument(length);
        var fromA = LocateWrongVf(ForwardModel.Simulate(network, settings));
        var clean = new CableNetwork(new NetworkBranch(new CableSegment(length, Coax), RunEnd.Open));
        var fromB = LocateWrongVf(ForwardModel.Simulate(clean, settings));
        var result = BothEndsLocation.Combine(fromA, fromB, length);

        var flagged = Assert.Single(result.Events);
        Assert.Equal(SeenFrom.EndAOnly, flagged.SeenFrom);
        Assert.Contains(result.Warnings, w => w.Contains("end A only", StringComparison.Ordinal));
        // With both far ends seen, T is measured, so even a one-sided event is placed by x = L·t_A/T, free of the VF.
        Assert.InRange(flagged.DistanceFromAMeters, fault - Math.Max(TargetRelative * fault, TargetFloorMeters), fault + Math.Max(TargetRelative * fault, TargetFloorMeters));
    }

    /// <summary>With feet asked for (the locate options of end A carry it, as the CLI's --units ft sets them), the
    /// one-sided event's warning gives its distance from A in feet: the metre figure over 0.3048 m/ft (the
    /// international foot, exact by definition), to the three decimals printed.</summary>
    [Fact]
    public void TheOneSidedWarningSpeaksFeetWhenAsked()
    {
        const double length = 20, fault = 6;
        var settings = Instrument(length);
        var fromA = LocateWrongVf(ForwardModel.Simulate(Run("shunt 100 Ω", fault, length), settings));
        var fromB = LocateWrongVf(ForwardModel.Simulate(new CableNetwork(new NetworkBranch(new CableSegment(length, Coax), RunEnd.Open)), settings));
        var inFeet = BothEndsLocation.Combine(fromA with { Options = fromA.Options with { WarningsInFeet = true } }, fromB, length);

        var flagged = Assert.Single(inFeet.Events);
        var warning = Assert.Single(inFeet.Warnings, w => w.Contains("end A only", StringComparison.Ordinal));
        var match = System.Text.RegularExpressions.Regex.Match(warning, @"event at ([0-9.]+) ft from A");
        Assert.True(match.Success, warning);
        double feet = double.Parse(match.Groups[1].Value, System.Globalization.CultureInfo.InvariantCulture);
        Assert.InRange(feet, flagged.DistanceFromAMeters / 0.3048 - 0.002, flagged.DistanceFromAMeters / 0.3048 + 0.002);
    }

    [Fact]
    public void ReversalPutsTheLumpedPartAtTheMirroredPosition()
    {
        var network = Run("shunt 100 Ω", 7, 20);
        var reversed = NetworkReversal.Reverse(network, RunEnd.Short);
        var elements = reversed.Run.Elements;
        Assert.Equal(13, Assert.IsType<CableSegment>(elements[0]).LengthMeters);
        Assert.IsType<ShuntResistor>(elements[1]);
        Assert.Equal(7, Assert.IsType<CableSegment>(elements[2]).LengthMeters);
        Assert.Equal(EndKind.Short, Assert.IsType<RunEnd>(elements[3]).Kind);
        Assert.Throws<ArgumentException>(() => NetworkReversal.Reverse(
            new CableNetwork(new NetworkBranch(new Junction([new NetworkBranch(RunEnd.Open)]))), RunEnd.Open));
    }

    /// <summary>
    /// The same check on traces from ngspice (Debian package ngspice, an independent circuit simulator; lossless lines
    /// are its T element): a 100 Ω shunt 8 m into a 22 m run, simulated once from each end with the other end open.
    /// </summary>
    [NgspiceTheory]
    [InlineData(8.0, 22.0)]
    public void BothEndsDistanceFromNgspiceTraces(double faultMeters, double lengthMeters)
    {
        var fromA = LocateWrongVf(NgspiceTrace(faultMeters, lengthMeters - faultMeters, lengthMeters));
        var fromB = LocateWrongVf(NgspiceTrace(lengthMeters - faultMeters, faultMeters, lengthMeters));
        var result = BothEndsLocation.Combine(fromA, fromB, lengthMeters);
        CheckFault(result, fromA, faultMeters, "ngspice shunt");
    }

    private static Trace NgspiceTrace(double firstMeters, double secondMeters, double runMeters)
    {
        var settings = Instrument(runMeters);
        double tstop = settings.DurationSeconds + 2 * SampleSeconds;
        string I(double value) => value.ToString("R", CultureInfo.InvariantCulture);
        // The edge is the one of Reference/Ngspice/open.cir: V_s = 1 + erf((t − pre)/(σ√2)), erf by Abramowitz & Stegun,
        // Handbook of Mathematical Functions (1964), eq. 7.1.26; the far end is open (1 TΩ for a DC path).
        string circuit = $$"""
            * both-ends check: {{I(firstMeters)}} m, 100 ohm shunt, {{I(secondMeters)}} m, open
            .param vf={{I(Vf)}} c0=299792458 rise={{I(RiseSeconds)}} pre={{I(PreTriggerSeconds)}} sig={rise/2.5631031310892007} tmax={sig/10}
            {{GeneratedNetlist.ErfEdge}}
            Rs src port 50
            T1 port 0 mid 0 Z0=50 TD={{{I(firstMeters)}}/(vf*c0)}
            Rf mid 0 100
            T2 mid 0 far 0 Z0=50 TD={{{I(secondMeters)}}/(vf*c0)}
            Rfar far 0 1e12
            .tran {tmax} {{I(tstop)}} 0 {tmax}
            """;
        // Trace time t is ngspice time t + pre (edge midpoint at 0), as in NgspiceComparisonTests.
        return GeneratedNetlist.Run(circuit, "bothends", PreTriggerSeconds, SampleSeconds, settings.SampleCount);
    }
}
