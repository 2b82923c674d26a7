using System.Text.Json;
using CableFault.Analysis;
using CableFault.Cli;
using CableFault.Cli.Infrastructure;
using CableFault.Reporting;
using CableFault.Reporting.Locate;
using CableFault.Tests.Cli;
using CableFault.Traces;

namespace CableFault.Tests.Hardening;

/// <summary>Batch locate: several inputs, bad ones skipped with one line, exit code 2, summary, JSON array, events CSV.</summary>
public sealed class BatchLocateTests : IDisposable
{
    private readonly string _folder = Directory.CreateTempSubdirectory("cf-batch-").FullName;

    public void Dispose() => Directory.Delete(_folder, recursive: true);

    /// <summary>A short simulated run (invented): 10 m of RG-58, a 20 pF spot, 5 m more, open. Small, so locate is quick.</summary>
    private string Simulated(string name, string run)
    {
        string network = Path.Combine(_folder, "run.network.json");
        File.WriteAllText(network, """{ "run": [ { "type": "segment", "length_m": 10, "cable": "RG-58" }, { "type": "shunt_c", "capacitance_pf": 20 }, { "type": "segment", "length_m": 5, "cable": "RG-58" }, { "type": "end", "end": "open" } ] }""");
        string path = Path.Combine(_folder, name);
        var result = CliRunner.Run("simulate", network, "-o", path, "--rise-time-ns", "1", "--sample-interval-ps", "250", "--duration-ns", "200", "--meta", $"run={run}", "--meta", "vf=0.66");
        Assert.Equal(0, result.ExitCode);
        File.Delete(network);
        return path;
    }

    [Fact]
    public void One_bad_file_is_reported_once_and_skipped_and_the_rest_complete()
    {
        string a = Simulated("a.csv", "alpha");
        string b = Simulated("b.csv", "=SUM(A1)");
        string bad = Path.Combine(_folder, "bad.csv");
        File.WriteAllText(bad, "time_s,volts\n0,NaN\n1e-9,0.5\n");
        string events = Path.Combine(_folder, "events.csv");

        var text = CliRunner.Run("locate", _folder, "--events-csv", events, "--jobs", "2");

        Assert.Equal(CliApp.BadInput, text.ExitCode);
        var problemLines = text.Error.Split('\n').Where(l => l.StartsWith("cablefault:", StringComparison.Ordinal)).ToList();
        Assert.Single(problemLines);
        Assert.Contains("bad.csv", problemLines[0]);
        Assert.DoesNotContain("   at ", text.Error);
        Assert.Contains("Summary: 3 inputs, 2 located, 1 skipped", text.Output);
        Assert.Contains("skipped (bad input)", text.Output);
        Assert.Contains("alpha", text.Output);

        // Events CSV: a header and one row per event of the two good traces; the formula-like run title is neutralised,
        // negative reflections stay plain numbers.
        string[] rows = File.ReadAllLines(events);
        Assert.StartsWith("path,trace,run,event,distance_m", rows[0]);
        Assert.Contains(rows, r => r.Contains(",'=SUM(A1),", StringComparison.Ordinal));
        Assert.DoesNotContain(rows, r => r.Contains(",=SUM", StringComparison.Ordinal));
        Assert.Contains(rows, r => r.Split(',')[6] == "capacitive" && r.Split(',')[7].StartsWith('-') && double.TryParse(r.Split(',')[7], System.Globalization.CultureInfo.InvariantCulture, out _));

        var json = CliRunner.Run("locate", a, b, bad, "--format", "json");
        Assert.Equal(CliApp.BadInput, json.ExitCode);
        using var document = JsonDocument.Parse(json.Output);
        var items = document.RootElement.EnumerateArray().ToList();
        Assert.Equal(3, items.Count);
        Assert.Equal("a.csv", items[0].GetProperty("trace").GetString());
        Assert.True(items[0].GetProperty("events").GetArrayLength() > 0);
        Assert.Equal("bad.csv", items[2].GetProperty("trace").GetString());
        Assert.Contains("bad.csv", items[2].GetProperty("error").GetString());
        Assert.Equal(rows.Length - 1, items[0].GetProperty("events").GetArrayLength() + items[1].GetProperty("events").GetArrayLength());
    }

    [Fact]
    public void One_file_prints_exactly_what_the_library_renders()
    {
        string a = Simulated("single.csv", "alpha");
        var trace = TraceCsvReader.Read(File.OpenRead(a), "single.csv");
        var settings = CableSettings.Resolve(trace, null, null, null, null, Cables.CableLibrary.BuiltIn);
        var result = Locator.Locate(trace, settings.ToLocateOptions());

        var text = CliRunner.Run("locate", a);
        var json = CliRunner.Run("locate", a, "--format", "json");

        Assert.Equal(0, text.ExitCode);
        Assert.Equal(LocateText.Render(result, "single.csv", DistanceUnit.Meters), text.Output);
        Assert.Equal(LocateJson.Render(result, "single.csv", DistanceUnit.Meters) + Environment.NewLine, json.Output);
        Assert.DoesNotContain("Summary", text.Output);
    }

    [Fact]
    public void Patterns_folders_and_missing_inputs_expand_as_documented()
    {
        foreach (string name in new[] { "b.csv", "a.s1p", "notes.txt", "c.CSV" }) File.WriteAllText(Path.Combine(_folder, name), "");
        var fromFolder = BatchInputs.Expand([_folder]).Select(Path.GetFileName).ToList();
        Assert.Equal(["a.s1p", "b.csv", "c.CSV"], fromFolder);
        var fromPattern = BatchInputs.Expand([Path.Combine(_folder, "*.csv")]).Select(Path.GetFileName).ToList();
        Assert.Equal(["b.csv"], fromPattern);
        string nothing = Path.Combine(_folder, "*.none");
        Assert.Equal([nothing], BatchInputs.Expand([nothing]));
        Assert.NotNull(BatchInputs.ProblemBeforeReading(nothing));
        Assert.False(BatchInputs.IsSingleFile([_folder]));
        Assert.True(BatchInputs.IsSingleFile([Path.Combine(_folder, "b.csv")]));
        // The same file named twice is located once.
        Assert.Single(BatchInputs.Expand([Path.Combine(_folder, "b.csv"), Path.Combine(_folder, ".", "b.csv")]));
    }

    [Fact]
    public void Figures_need_a_single_trace()
    {
        var result = CliRunner.Run("locate", _folder, Path.Combine(_folder, "x.csv"), "--png", Path.Combine(_folder, "x.png"));
        CorpusCliTests.AssertOneCleanLine(result, "--png");
    }
}
