using System.Text.Json.Nodes;
using CableFault.Cables;
using CableFault.Networks;
using CableFault.Simulation;
using CableFault.Tests.Cli;
using CableFault.Workflows;
using Xunit.Abstractions;

namespace CableFault.Tests.Workflows;

/// <summary>
/// The README's worked examples of the three field workflows, run through the command line on the demo traces of
/// traces/quillon-bay/. The truth is each trace's network file (the invented ground truth the trace was simulated
/// from): every expected figure below is read from that file, not copied from the tool's output.
/// </summary>
public sealed class DemoWorkflowTests(ITestOutputHelper output)
{
    /// <summary>
    /// How close the both-ends placement must come to the wet section's start: 0.1 m, a tenth of the slack the
    /// single-ended as-built checks allow on the same run. The method itself is exact only for a uniform VF; the 0.6 m
    /// wet section (VF 0.60 against 0.66) skews the B-side round trip by about 0.04 m, well inside this.
    /// </summary>
    private const double BothEndsToleranceMeters = 0.1;

    /// <summary>The pair's implied VF against the cable's nominal VF: within 1 % (the wet section and loss dispersion shift it by well under that).</summary>
    private const double ImpliedVfRelativeTolerance = 0.01;

    /// <summary>
    /// Taking the lead off must not move an event by more than 5 cm: about an eighth of the 0.4 m two-event resolution
    /// the fit states at this record length, and far less than the 2 m the lead itself adds.
    /// </summary>
    private const double LeadToleranceMeters = 0.05;

    private static string Demo(string name) => Path.Combine(CliRunner.RepositoryRoot(), "traces", "quillon-bay", name);

    private static CableNetwork Network(string name)
    {
        using var stream = File.OpenRead(Demo(name));
        return NetworkJson.Read(stream, name, CableLibrary.BuiltIn);
    }

    /// <summary>Distance from the port to the start of the first element that satisfies <paramref name="match"/>, m.</summary>
    private static double DistanceTo(NetworkBranch branch, Func<NetworkElement, bool> match)
    {
        double meters = 0;
        foreach (var element in branch.Elements)
        {
            if (match(element)) return meters;
            if (element is CableSegment segment) meters += segment.LengthMeters;
        }
        throw new InvalidOperationException("element not found in the network file");
    }

    private static double TotalLength(NetworkBranch branch) => branch.Elements.OfType<CableSegment>().Sum(s => s.LengthMeters);

    private JsonObject LocateJson(params string[] args)
    {
        var result = CliRunner.Run(["locate", .. args, "--format", "json"]);
        Assert.True(result.ExitCode == 0, result.Error);
        output.WriteLine(result.Output);
        return JsonNode.Parse(result.Output)!.AsObject();
    }

    [Fact]
    public void TheMastHeadNetworkIsTheDamagedRunReversed()
    {
        // Truth: mast-feeder-damaged.network.json turned round by NetworkReversal, the equipment-room connector left open.
        var expected = NetworkReversal.Reverse(Network("mast-feeder-damaged.network.json"), RunEnd.Open);
        var actual = Network("mast-feeder-damaged-from-mast.network.json");
        Assert.Equal(expected.Name, actual.Name);
        Assert.Equal(expected.Run.Elements.Count, actual.Run.Elements.Count);
        foreach (var (e, a) in expected.Run.Elements.Zip(actual.Run.Elements))
        {
            Assert.Equal(e.GetType(), a.GetType());
            switch (e, a)
            {
                case (CableSegment se, CableSegment sa):
                    Assert.Equal(se.LengthMeters, sa.LengthMeters);
                    Assert.Equal(se.CableDesignation, sa.CableDesignation);
                    Assert.Equal(se.Medium.ImpedanceOhms, sa.Medium.ImpedanceOhms);
                    Assert.Equal(se.Medium.VelocityFactor, sa.Medium.VelocityFactor);
                    break;
                case (SeriesInductor le, SeriesInductor la):
                    Assert.Equal(le.InductanceHenries, la.InductanceHenries);
                    break;
                case (RunEnd ee, RunEnd ea):
                    Assert.Equal(ee with { Label = null }, ea with { Label = null }); // labels only describe
                    break;
            }
        }

        // Loss models are not comparable field by field: the two runs must give the same noiseless trace.
        var instrument = InstrumentSettings.DefaultFor(expected, 0.5e-9) with { SampleCount = 4000 };
        var reversed = ForwardModel.Simulate(expected, instrument).SamplesVolts;
        var file = ForwardModel.Simulate(actual, instrument).SamplesVolts;
        Assert.Equal(reversed.Length, file.Length);
        for (int i = 0; i < reversed.Length; i++) Assert.Equal(reversed[i], file[i], 12);
    }

    [Fact]
    public void FromBothEndsPlacesTheWetSectionAndGivesTheCableVf()
    {
        // Truth: mast-feeder-damaged.network.json — the wet section starts after 12.0 + 15.3 m of RG-213 (27.3 m),
        // the run is 42.5 m long, and its cable's VF is RG-213's (the network names it).
        var run = Network("mast-feeder-damaged.network.json");
        double wetStartMeters = DistanceTo(run.Run, e => e.Label == "wet section");
        double lengthMeters = TotalLength(run.Run);
        double cableVf = run.Run.Elements.OfType<CableSegment>().First(s => s.CableDesignation == "RG-213").Medium.VelocityFactor;
        Assert.Equal(42.5, lengthMeters, 9); // the README's --length

        var json = LocateJson("--from-both-ends", Demo("mast-feeder-damaged.csv"), Demo("mast-feeder-damaged-from-mast.csv"),
            "--length", "42.5");
        var wet = json["events"]!.AsArray().Single(e => (string?)e!["kind_from_a"] == "impedance_drop")!;
        Assert.Equal("both", (string?)wet["seen_from"]);
        Assert.InRange((double)wet["distance_m"]!, wetStartMeters - BothEndsToleranceMeters, wetStartMeters + BothEndsToleranceMeters);
        Assert.InRange((double)json["implied_vf"]!, cableVf * (1 - ImpliedVfRelativeTolerance), cableVf * (1 + ImpliedVfRelativeTolerance));

        // The README's command as written (text output) runs too.
        var text = CliRunner.Run("locate", "--from-both-ends", Demo("mast-feeder-damaged.csv"), Demo("mast-feeder-damaged-from-mast.csv"), "--length", "42.5");
        Assert.True(text.ExitCode == 0, text.Error);
        Assert.Contains("the pair implies VF", text.Output, StringComparison.Ordinal);
    }

    [Fact]
    public void TheLaunchLeadIsTakenOffAndTheTapStaysWhereItIs()
    {
        // Truth: camera-drop-with-lead.network.json — a 2.0 m lead, then 18.0 m to the tap, whose spare branch runs
        // 7.0 m to an open outlet (25.0 m from the lead's far connector) and whose other runs 12.0 m to the camera (30.0 m).
        var run = Network("camera-drop-with-lead.network.json");
        var lead = (CableSegment)run.Run.Elements[0];
        Assert.Equal("launch lead", lead.Label);
        var tap = run.Run.Elements.OfType<Junction>().Single();
        double tapMeters = DistanceTo(run.Run, e => e is Junction) - lead.LengthMeters;
        var spare = tap.Branches.Single(b => b.Elements[^1] is RunEnd { Kind: EndKind.Open });
        double spareEndMeters = tapMeters + TotalLength(spare);

        var json = LocateJson(Demo("camera-drop-with-lead.csv"), "--lead-length", "2", "--lead-cable", lead.CableDesignation!);
        var events = json["events"]!.AsArray();
        var tapEvent = events.Single(e => (string?)e!["kind"] == "tap")!;
        var openEvent = events.Single(e => (string?)e!["kind"] == "open")!;
        Assert.InRange((double)tapEvent["distance_m"]!, tapMeters - LeadToleranceMeters, tapMeters + LeadToleranceMeters);
        Assert.InRange((double)openEvent["distance_m"]!, spareEndMeters - LeadToleranceMeters, spareEndMeters + LeadToleranceMeters);
        // The camera, a 75 Ω load at the end of the other branch, ends the run there and nothing else is listed. It shows
        // no step, only the end of the lossy cable's creep, so its place is read to its own ± (two σ here).
        var cameraBranch = tap.Branches.Single(b => b.Elements[^1] is RunEnd { Kind: EndKind.Resistor });
        double cameraMeters = tapMeters + TotalLength(cameraBranch);
        var cameraEvent = events.Single(e => (string?)e!["kind"] == "termination")!;
        double cameraSigma = (double)cameraEvent["distance_sigma_m"]!;
        Assert.InRange((double)cameraEvent["distance_m"]!, cameraMeters - 2 * cameraSigma, cameraMeters + 2 * cameraSigma);
        Assert.Equal(3, events.Count);

        // Without the lead options the same trace puts the tap a lead's length further out: the options matter.
        var plain = LocateJson(Demo("camera-drop-with-lead.csv"));
        double plainTap = plain["events"]!.AsArray().Where(e => (string?)e!["kind"] == "tap").Select(e => (double)e!["distance_m"]!).Single();
        Assert.InRange(plainTap, tapMeters + lead.LengthMeters - LeadToleranceMeters, tapMeters + lead.LengthMeters + LeadToleranceMeters);
    }

    [Fact]
    public void WithNoVfTheIntervalsHoldTheTrueDistances()
    {
        // The trace must really carry no VF: neither a vf line nor a cable type that would give one.
        string[] header = File.ReadLines(Demo("sensor-pair-novf.csv")).TakeWhile(l => l.StartsWith('#')).ToArray();
        Assert.DoesNotContain(header, l => l.StartsWith("# vf=", StringComparison.Ordinal) || l.StartsWith("# cable=", StringComparison.Ordinal));

        // Truth: sensor-pair.network.json — the flooded junction box (shunt leak) 51.2 m out, the open end at 88.0 m,
        // on CAT5E whose VF must lie inside the twisted-pair range.
        var run = Network("sensor-pair.network.json");
        double leakMeters = DistanceTo(run.Run, e => e is ShuntResistor);
        double endMeters = TotalLength(run.Run);
        double cableVf = run.Run.Elements.OfType<CableSegment>().First().Medium.VelocityFactor;

        var json = LocateJson(Demo("sensor-pair-novf.csv"), "--insulation", "twisted_pair");
        Assert.Equal("default", (string?)json["vf_source"]);
        Assert.Equal("twisted_pair", (string?)json["insulation"]);
        var vfRange = json["vf_range"]!.AsArray().Select(v => (double)v!).ToArray();
        Assert.InRange(cableVf, vfRange[0], vfRange[1]);

        var ranges = json["events"]!.AsArray().Select(e => e!["distance_range_m"]!.AsArray().Select(v => (double)v!).ToArray()).ToList();
        Assert.Contains(ranges, r => r[0] <= leakMeters && leakMeters <= r[1]);
        Assert.Contains(ranges, r => r[0] <= endMeters && endMeters <= r[1]);
    }
}
