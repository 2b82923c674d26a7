using System.Globalization;
using System.Text.Json.Nodes;
using CableFault.Cables;
using CableFault.Networks;
using CableFault.Simulation;
using CableFault.Tests.Cli;
using CableFault.Traces;
using Xunit.Abstractions;

namespace CableFault.Tests.Workflows;

/// <summary>
/// <c>calibrate --known-event</c>: a run whose far end is beyond the record, with a splice at a surveyed distance. The
/// true VF is the one of the simulated network; the guess handed to the command is 6 % off.
/// </summary>
public sealed class KnownEventCalibrationTests(ITestOutputHelper output) : IDisposable
{
    private const double TrueVf = 0.70, GuessVf = 0.66;
    private const double SpliceMeters = 15, FaultMeters = 25, EndMeters = 80;

    /// <summary>The calibrated VF must hold the true one within this many of its own stated σ's (a 95 % interval).</summary>
    private const double SigmasAllowed = 2;

    /// <summary>3500 samples of 100 ps: the record ends about 345 ns after the edge, 36 m at VF 0.70, short of the end.</summary>
    private static readonly InstrumentSettings Instrument = new()
    {
        RiseTimeSeconds = 1e-9, SampleIntervalSeconds = 100e-12, PreTriggerSeconds = 5e-9, SampleCount = 3500,
        NoiseRmsVolts = 0.5e-3, NoiseSeed = 17,
    };

    private readonly string folder = Directory.CreateTempSubdirectory("cablefault-known-").FullName;

    public void Dispose() => Directory.Delete(folder, recursive: true);

    private string Trace()
    {
        var coax = new CableMedium(50, TrueVf);
        var network = new CableNetwork(new NetworkBranch([
            new CableSegment(SpliceMeters, coax), new SeriesInductor(10e-9),
            new CableSegment(FaultMeters - SpliceMeters, coax), new ShuntResistor(200),
            new CableSegment(EndMeters - FaultMeters, coax), RunEnd.Open]));
        string path = Path.Combine(folder, "long-run.csv");
        var simulated = ForwardModel.Simulate(network, Instrument);
        using var stream = File.Create(path);
        // Samples only, so that the VF is the command line's guess and nothing else.
        TraceCsvWriter.Write(new Trace(simulated.StartTimeSeconds, simulated.SampleIntervalSeconds, simulated.SamplesVolts), stream);
        return path;
    }

    [Fact]
    public void TheKnownSpliceGivesTheTrueVfWhenTheEndIsOutOfTheRecord()
    {
        string trace = Trace();
        string[] guess = ["--vf", GuessVf.ToString(CultureInfo.InvariantCulture), "--z0", "50", "--vf-uncertainty-percent", "5"];

        // The scenario: the record stops well short of the open end at 80 m, so no end can be calibrated on.
        var located = JsonNode.Parse(CliRunner.Run(["locate", trace, "--format", "json", .. guess]).Output)!;
        Assert.All(located["events"]!.AsArray(), e => Assert.True((double)e!["distance_m"]! < EndMeters / 2));

        var result = CliRunner.Run(["calibrate", trace, "--known-event", "15", "--known-event-uncertainty", "0.02", "--format", "json", .. guess]);
        Assert.True(result.ExitCode == 0, result.Error);
        output.WriteLine(result.Output);
        var root = JsonNode.Parse(result.Output)!;
        double vf = (double)root["vf"]!, sigma = (double)root["vf_sigma"]!;
        Assert.Equal("inductive", (string?)root["event_kind"]);
        Assert.InRange(TrueVf, vf - SigmasAllowed * sigma, vf + SigmasAllowed * sigma);
        // The σ is honest but not vacuous: the 2 cm survey alone is 0.13 % of 15 m.
        Assert.InRange(sigma / vf, 0.0013, 0.01);

        var text = CliRunner.Run(["calibrate", trace, "--known-event", "15", .. guess]);
        Assert.True(text.ExitCode == 0, text.Error);
        output.WriteLine(text.Output);
        Assert.Contains("inductive spot", text.Output, StringComparison.Ordinal);
        Assert.Contains("event used", text.Output, StringComparison.Ordinal);
    }

    [Fact]
    public void TheCalibratedTypePlacesTheLeakAndSaysHowItsVfWasFound()
    {
        string trace = Trace();
        string cables = Path.Combine(folder, "cables.json");
        var calibrate = CliRunner.Run("calibrate", trace, "--vf", "0.66", "--z0", "50", "--vf-uncertainty-percent", "5",
            "--known-event", "15", "--known-event-uncertainty", "0.02", "--write-cable", cables, "--designation", "SITE-COAX", "--format", "json");
        Assert.True(calibrate.ExitCode == 0, calibrate.Error);
        double relative = (double)JsonNode.Parse(calibrate.Output)!["vf_relative_sigma"]!;

        var located = CliRunner.Run("locate", trace, "--cables", cables, "--cable", "SITE-COAX", "--format", "json");
        Assert.True(located.ExitCode == 0, located.Error);
        var root = JsonNode.Parse(located.Output)!;
        Assert.Contains("calibrated on the known event at 15.00 m", (string?)root["distance_method"], StringComparison.Ordinal);
        // The leak at 25 m (the network's): within three calibrated-VF σ's of the distance plus a 2 cm timing floor
        // (the field workflows' accuracy target). The cable file keeps no VF σ, so the table's own ± is the nominal 2 %.
        var leak = root["events"]!.AsArray().Single(e => Math.Abs((double)e!["distance_m"]! - FaultMeters) < 2)!;
        double d = (double)leak["distance_m"]!;
        double tolerance = 3 * relative * FaultMeters + 0.02;
        output.WriteLine($"leak at {d:F4} m, tolerance {tolerance:F3} m");
        Assert.InRange(d, FaultMeters - tolerance, FaultMeters + tolerance);
    }

    [Fact]
    public void TheLabelOfAnAsBuiltListGivesTheDistance()
    {
        string trace = Trace();
        string list = Path.Combine(folder, "long-run.asbuilt.json");
        File.WriteAllText(list, """{ "schema": "cablefault-asbuilt/1", "features": [ { "kind": "splice", "distance_m": 15, "label": "S1", "tolerance_m": 0.04 }, { "kind": "end", "distance_m": 80 } ] }""");
        var result = CliRunner.Run("calibrate", trace, "--vf", "0.66", "--z0", "50", "--vf-uncertainty-percent", "5", "--as-built", list, "--use-label", "s1", "--format", "json");
        Assert.True(result.ExitCode == 0, result.Error);
        var root = JsonNode.Parse(result.Output)!;
        Assert.Equal(15.0, (double)root["known_distance_m"]!);
        // Half the listed tolerance: the tolerance is a 95 % bound.
        Assert.Equal(0.02, (double)root["known_distance_sigma_m"]!, 12);
        double vf = (double)root["vf"]!, sigma = (double)root["vf_sigma"]!;
        Assert.InRange(TrueVf, vf - SigmasAllowed * sigma, vf + SigmasAllowed * sigma);

        var unknown = CliRunner.Run("calibrate", trace, "--vf", "0.66", "--as-built", list, "--use-label", "S7");
        Assert.Equal(2, unknown.ExitCode);
        Assert.Contains("no feature labelled 'S7'; the labels are: S1", unknown.Error, StringComparison.Ordinal);
    }

    [Fact]
    public void AnAmbiguousOrEmptySearchIsRefused()
    {
        string trace = Trace();
        // With the VF known only to ±25 %, both the splice (14.1 m under the guess) and the leak (23.6 m) could be the
        // event at 20 m.
        var ambiguous = CliRunner.Run("calibrate", trace, "--vf", "0.66", "--z0", "50", "--vf-uncertainty-percent", "25", "--known-event", "20");
        Assert.Equal(2, ambiguous.ExitCode);
        string line = Assert.Single(ambiguous.Error.Split('\n', StringSplitOptions.RemoveEmptyEntries));
        Assert.Contains("2 events could be the one at 20.00 m", line, StringComparison.Ordinal);

        var none = CliRunner.Run("calibrate", trace, "--vf", "0.66", "--z0", "50", "--known-event", "5");
        Assert.Equal(2, none.ExitCode);
        Assert.Contains("no located event lies within", none.Error, StringComparison.Ordinal);
        Assert.Contains("the nearest is the inductive", none.Error, StringComparison.Ordinal);

        var both = CliRunner.Run("calibrate", trace, "--length", "80", "--known-event", "15");
        Assert.Equal(2, both.ExitCode);
    }
}
