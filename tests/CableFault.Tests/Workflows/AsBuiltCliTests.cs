using System.Text.Json.Nodes;
using CableFault.Cables;
using CableFault.Networks;
using CableFault.Simulation;
using CableFault.Tests.Cli;
using CableFault.Traces;
using Xunit.Abstractions;

namespace CableFault.Tests.Workflows;

/// <summary>
/// <c>--as-built</c> on <c>locate</c> and <c>report</c>, and <c>calibrate --known-event</c>, through the command line.
/// The truth is the network a trace was simulated from: the demo's network files, or a network built here.
/// </summary>
public sealed class AsBuiltCliTests(ITestOutputHelper output) : IDisposable
{
    private readonly string folder = Directory.CreateTempSubdirectory("cablefault-asbuilt-").FullName;

    public void Dispose() => Directory.Delete(folder, recursive: true);

    private static string Demo(string name) => Path.Combine(CliRunner.RepositoryRoot(), "traces", "quillon-bay", name);

    /// <summary>traces/quillon-bay/mast-feeder-damaged.network.json: wet section from 27.3 m to 27.9 m.</summary>
    private const double WetStartMeters = 27.3, WetEndMeters = 27.9;

    /// <summary>Slack around the wet section's ends: the located distances carry a 2 % VF σ (about 0.55 m there).</summary>
    private const double WetSlackMeters = 1.0;

    [Fact]
    public void LocateJsonKeepsEveryContractFieldAndAddsTheMarks()
    {
        string trace = Demo("mast-feeder-damaged.csv");
        var plain = CliRunner.Run("locate", trace, "--cable", "RG-213", "--format", "json");
        var marked = CliRunner.Run("locate", trace, "--cable", "RG-213", "--format", "json", "--as-built", Demo("mast-feeder.asbuilt.json"));
        Assert.True(marked.ExitCode == 0, marked.Error);
        var before = JsonNode.Parse(plain.Output)!.AsObject();
        var after = JsonNode.Parse(marked.Output)!.AsObject();

        // DESIGN.md §4: these keys and meanings are a contract.
        foreach (string key in new[] { "trace", "vf", "vf_source", "z0_ohms", "rise_s", "noise_v", "blind_zone_m", "events" })
            Assert.True(after.ContainsKey(key), $"'{key}' missing");
        // Every field of the plain output is there unchanged; the list only adds.
        foreach (var (key, value) in before)
        {
            if (key == "events") continue;
            Assert.Equal(value?.ToJsonString(), after[key]?.ToJsonString());
        }
        var plainEvents = before["events"]!.AsArray();
        var events = after["events"]!.AsArray();
        Assert.Equal(plainEvents.Count, events.Count);
        for (int i = 0; i < events.Count; i++)
        {
            foreach (string key in new[] { "distance_m", "distance_sigma_m", "kind", "reflection", "impedance_ohms", "value", "confidence" })
                Assert.True(events[i]!.AsObject().ContainsKey(key), $"events[{i}].{key} missing");
            foreach (var (key, value) in plainEvents[i]!.AsObject())
                Assert.Equal(value?.ToJsonString(), events[i]![key]?.ToJsonString());
        }

        // The connector pair at 12.0 m and the open end at 42.5 m are listed; the wet section is not.
        foreach (var e in events)
        {
            double d = (double)e!["distance_m"]!;
            string status = (string)e["as_built"]!["status"]!;
            bool wet = d > WetStartMeters - WetSlackMeters && d < WetEndMeters + WetSlackMeters;
            Assert.Equal(wet ? "unexpected" : "expected", status);
        }
        Assert.Equal(2, events.Count(e => (string?)e!["as_built"]!["status"] == "unexpected"));
        var connector = events.Single(e => (string?)e!["as_built"]!["label"] == "roof-entry bulkhead")!["as_built"]!;
        Assert.Equal(12.0, (double)connector["listed_distance_m"]!);
        Assert.Equal("connector", (string?)connector["feature"]);
        Assert.Empty(after["as_built_missing"]!.AsArray());
        Assert.Contains("single-ended", (string?)after["distance_method"]);
    }

    [Fact]
    public void LocateTextMarksEachRowAndSpeaksOfTheUnexpectedFirst()
    {
        var result = CliRunner.Run("locate", Demo("mast-feeder-damaged.csv"), "--cable", "RG-213", "--as-built", Demo("mast-feeder.asbuilt.json"));
        Assert.True(result.ExitCode == 0, result.Error);
        output.WriteLine(result.Output);
        var lines = result.Output.Split('\n');
        Assert.Contains(lines, l => l.Contains("as built", StringComparison.Ordinal) && l.Contains("distance", StringComparison.Ordinal));
        Assert.Contains(lines, l => l.Contains("inductive spot", StringComparison.Ordinal) && l.EndsWith("expected: connector (roof-entry bulkhead) at 12.0 m", StringComparison.Ordinal));
        Assert.Equal(2, lines.Count(l => l.Contains("impedance", StringComparison.Ordinal) && l.TrimEnd().EndsWith("UNEXPECTED", StringComparison.Ordinal)));
        int summary = Array.FindIndex(lines, l => l.Contains("as-built list", StringComparison.Ordinal));
        Assert.True(summary > 0);
        Assert.Contains("2 UNEXPECTED events", lines[summary], StringComparison.Ordinal);
        int firstUnexpected = Array.FindIndex(lines, summary, l => l.TrimStart().StartsWith("UNEXPECTED", StringComparison.Ordinal));
        int firstExpected = Array.FindIndex(lines, summary, l => l.TrimStart().StartsWith("expected", StringComparison.Ordinal));
        Assert.InRange(firstUnexpected, summary + 1, firstExpected - 1);
        Assert.Contains(lines, l => l.Contains("distances: single-ended", StringComparison.Ordinal));
    }

    [Fact]
    public void AfterTheRepairTheNewSplicesAreNotOnTheOldList()
    {
        // traces/quillon-bay/mast-feeder-repaired.network.json: repair splices at 26.9 m and 28.1 m, not in the 2025 list.
        var result = CliRunner.Run("locate", Demo("mast-feeder-repaired.csv"), "--cable", "RG-213", "--format", "json", "--as-built", Demo("mast-feeder.asbuilt.json"));
        Assert.True(result.ExitCode == 0, result.Error);
        var unexpected = JsonNode.Parse(result.Output)!["events"]!.AsArray()
            .Where(e => (string?)e!["as_built"]!["status"] == "unexpected").Select(e => (double)e!["distance_m"]!).Order().ToList();
        Assert.Equal(2, unexpected.Count);
        Assert.InRange(unexpected[0], 26.9 - WetSlackMeters, 26.9 + WetSlackMeters);
        Assert.InRange(unexpected[1], 28.1 - WetSlackMeters, 28.1 + WetSlackMeters);
    }

    [Fact]
    public void ABadListIsOneLineNamingTheFileAndThePath()
    {
        string list = Path.Combine(folder, "bad.asbuilt.json");
        File.WriteAllText(list, """{ "schema": "cablefault-asbuilt/1", "features": [ { "kind": "weld", "distance_m": 3 }, { "kind": "end" } ] }""");
        var result = CliRunner.Run("locate", Demo("mast-feeder.csv"), "--as-built", list);
        Assert.Equal(2, result.ExitCode);
        string line = Assert.Single(result.Error.Split('\n', StringSplitOptions.RemoveEmptyEntries));
        Assert.Contains("bad.asbuilt.json: 2 problems", line, StringComparison.Ordinal);
        Assert.Contains("$.features[0].kind", line, StringComparison.Ordinal);
        Assert.Contains("$.features[1]: 'distance_m'", line, StringComparison.Ordinal);
    }

    [Fact]
    public void BothEndsRefusesTheList()
    {
        var result = CliRunner.Run("locate", "--from-both-ends", Demo("mast-feeder.csv"), Demo("mast-feeder-damaged.csv"), "--length", "42.5",
            "--as-built", Demo("mast-feeder.asbuilt.json"));
        Assert.Equal(2, result.ExitCode);
        Assert.Contains("--as-built", Assert.Single(result.Error.Split('\n', StringSplitOptions.RemoveEmptyEntries)), StringComparison.Ordinal);
    }

    [Fact]
    public void ReportTakesTheListFromTheJobFile()
    {
        string list = Path.Combine(folder, "run.asbuilt.json");
        File.Copy(Demo("mast-feeder.asbuilt.json"), list);
        string job = Path.Combine(folder, "job.json");
        File.WriteAllText(job, """{ "schema": "cablefault-job/1", "run_id": "QB-01", "expected_length_m": 42.5, "as_built": "run.asbuilt.json" }""");
        string html = Path.Combine(folder, "report.html");
        var result = CliRunner.Run("report", Demo("mast-feeder-damaged.csv"), "--job", job, "-o", html);
        Assert.True(result.ExitCode == 0, result.Error);
        var document = Report.ReportFixtures.Parse(File.ReadAllText(html));
        string headline = document.QuerySelector(".summary .headline")!.TextContent;
        Assert.StartsWith("Unexpected: impedance drop", headline, StringComparison.Ordinal);
        Assert.Contains("2 listed features found as expected", document.QuerySelector(".summary")!.TextContent, StringComparison.Ordinal);
    }
}
