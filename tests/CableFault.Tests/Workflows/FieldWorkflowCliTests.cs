using System.Text.Json.Nodes;
using CableFault.Cables;
using CableFault.Networks;
using CableFault.Simulation;
using CableFault.Tests.Cli;
using CableFault.Traces;
using CableFault.Workflows;
using Xunit.Abstractions;

namespace CableFault.Tests.Workflows;

/// <summary>The field workflows through <c>cablefault locate</c>, on simulated traces written to a temporary folder.</summary>
public sealed class FieldWorkflowCliTests(ITestOutputHelper output) : IDisposable
{
    /// <summary>The accuracy target: 0.1 % of the distance or 2 cm, whichever is larger.</summary>
    private const double TargetRelative = 0.001;

    private const double TargetFloorMeters = 0.02;

    private static readonly InstrumentSettings Instrument = new()
    {
        RiseTimeSeconds = 1e-9, SampleIntervalSeconds = 100e-12, PreTriggerSeconds = 5e-9, SampleCount = 2600,
    };

    private readonly string folder = Directory.CreateTempSubdirectory("cablefault-field-").FullName;

    public void Dispose() => Directory.Delete(folder, recursive: true);

    private string Write(CableNetwork network, string name)
    {
        string path = Path.Combine(folder, name);
        using var stream = File.Create(path);
        // Samples only: the simulator's metadata (VF, Z0) would answer what these tests want the options to answer.
        var simulated = ForwardModel.Simulate(network, Instrument);
        TraceCsvWriter.Write(new Trace(simulated.StartTimeSeconds, simulated.SampleIntervalSeconds, simulated.SamplesVolts), stream);
        return path;
    }

    private static double Tolerance(double meters) => Math.Max(TargetRelative * meters, TargetFloorMeters);

    private static CableNetwork ShuntRun(double vf, double fault, double length) => new(new NetworkBranch(
        new CableSegment(fault, new CableMedium(50, vf)), new ShuntResistor(100), new CableSegment(length - fault, new CableMedium(50, vf)), RunEnd.Open));

    [Fact]
    public void BothEndsThroughTheCommandLineIgnoresAWrongVf()
    {
        var run = ShuntRun(0.66, 7, 20);
        string a = Write(run, "end-a.csv");
        string b = Write(NetworkReversal.Reverse(run, RunEnd.Open), "end-b.csv");
        // The stated VF is 5 % too high; the pair must not care.
        var result = CliRunner.Run("locate", "--from-both-ends", a, b, "--length", "20", "--vf", "0.693", "--z0", "50", "--format", "json");
        Assert.True(result.ExitCode == 0, result.Error);
        var root = JsonNode.Parse(result.Output)!;
        var fault = Assert.Single(root["events"]!.AsArray())!;
        Assert.Equal("both", (string?)fault["seen_from"]);
        Assert.InRange((double)fault["distance_m"]!, 7 - Tolerance(7), 7 + Tolerance(7));
        Assert.InRange((double)root["implied_vf"]!, 0.66 * (1 - TargetRelative), 0.66 * (1 + TargetRelative));

        var text = CliRunner.Run("locate", "--from-both-ends", a, b, "--length", "20", "--vf", "0.693", "--z0", "50");
        output.WriteLine(text.Output);
        Assert.Contains("implies VF 0.66", text.Output, StringComparison.Ordinal);
    }

    [Fact]
    public void BothEndsNeedsALengthAndTwoTraces()
    {
        string a = Write(ShuntRun(0.66, 7, 20), "only.csv");
        var noLength = CliRunner.Run("locate", "--from-both-ends", a, a);
        Assert.NotEqual(0, noLength.ExitCode);
        Assert.Contains("--length", noLength.Error, StringComparison.Ordinal);
        var one = CliRunner.Run("locate", "--from-both-ends", a, "--length", "20");
        Assert.NotEqual(0, one.ExitCode);
        Assert.Contains("exactly two", one.Error, StringComparison.Ordinal);
    }

    [Fact]
    public void UnknownVfGivesARangeThatHoldsTheTrueDistance()
    {
        // Foam PE cable (VF 0.83, inside the 0.78–0.88 foam range of InsulationClassRanges), fault at 9 m; no VF given.
        const double vf = 0.83, fault = 9;
        string path = Write(ShuntRun(vf, fault, 16), "foam.csv");
        var result = CliRunner.Run("locate", path, "--z0", "50", "--insulation", "foam_pe", "--format", "json");
        Assert.True(result.ExitCode == 0, result.Error);
        var root = JsonNode.Parse(result.Output)!;
        Assert.Equal("default", (string?)root["vf_source"]);
        var events = root["events"]!.AsArray();
        var shunt = events.MinBy(e => Math.Abs((double)e!["electrical_length_m"]! * vf - fault))!;
        var range = shunt["distance_range_m"]!.AsArray();
        Assert.InRange(fault, (double)range[0]!, (double)range[1]!);
        // Electrical length = distance / VF (v = c): physics, not the code's own formula restated.
        Assert.InRange((double)shunt["electrical_length_m"]!, fault / vf - Tolerance(fault / vf), fault / vf + Tolerance(fault / vf));
        Assert.NotNull(shunt["round_trip_s"]);
        Assert.NotNull(shunt["distance_m"]); // the contract field stays

        var text = CliRunner.Run("locate", path, "--z0", "50", "--insulation", "foam_pe");
        output.WriteLine(text.Output);
        Assert.Contains("VF not known", text.Output, StringComparison.Ordinal);

        var stated = CliRunner.Run("locate", path, "--z0", "50", "--vf", "0.83", "--format", "json");
        Assert.Null(JsonNode.Parse(stated.Output)!["events"]!.AsArray()[0]!["distance_range_m"]);
    }

    [Fact]
    public void LeadOptionsMoveTheReferencePlane()
    {
        const double fault = 9;
        var coax = new CableMedium(50, 0.66);
        var led = new CableNetwork(new NetworkBranch(new CableSegment(2, new CableMedium(50, 0.80)), new ShuntCapacitor(3e-12),
            new CableSegment(fault, coax), new ShuntResistor(100), new CableSegment(7, coax), RunEnd.Open));
        string path = Write(led, "with-lead.csv");
        var result = CliRunner.Run("locate", path, "--z0", "50", "--vf", "0.66", "--lead-length", "2", "--lead-vf", "0.80", "--format", "json");
        Assert.True(result.ExitCode == 0, result.Error);
        var events = JsonNode.Parse(result.Output)!["events"]!.AsArray();
        Assert.All(events, e => Assert.True((double)e!["distance_m"]! > 0));
        Assert.Contains(events, e => Math.Abs((double)e!["distance_m"]! - fault) <= Tolerance(fault));

        var orphan = CliRunner.Run("locate", path, "--lead-vf", "0.8");
        Assert.NotEqual(0, orphan.ExitCode);
        Assert.Contains("--lead-length", orphan.Error, StringComparison.Ordinal);
    }
}
