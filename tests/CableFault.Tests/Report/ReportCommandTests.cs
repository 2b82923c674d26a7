using CableFault.Tests.Cli;

namespace CableFault.Tests.Report;

/// <summary>The <c>report</c> verb end to end: job file, options, atomic replacement, errors.</summary>
public class ReportCommandTests : IDisposable
{
    private readonly string _folder = Directory.CreateTempSubdirectory("cf-report-").FullName;

    public void Dispose() => Directory.Delete(_folder, recursive: true);

    private string Simulated()
    {
        string network = Path.Combine(_folder, "run.json");
        // 18 m of 50 Ω cable (VF 0.66) into an open end: the open is at 18 m by construction.
        File.WriteAllText(network, """{ "name": "short run", "run": [ { "type": "segment", "length_m": 18, "z0_ohms": 50, "vf": 0.66 }, { "type": "end", "end": "open" } ] }""");
        string trace = Path.Combine(_folder, "run.csv");
        var result = CliRunner.Run("simulate", network, "-o", trace, "--noise-mv", "1", "--meta", "vf=0.66", "--meta", "z0=50",
            "--meta", "technician=From Trace");
        Assert.Equal(0, result.ExitCode);
        return trace;
    }

    [Fact]
    public void WritesTheReportOverAnOldOneAndRefusesBadInputWithoutTouchingIt()
    {
        string trace = Simulated();
        string job = Path.Combine(_folder, "job.json");
        File.WriteAllText(job, """{ "schema": "cablefault-job/1", "run_id": "<b>R-18</b>", "technician": "From Job", "expected_length_ft": 59.055 }""");
        string output = Path.Combine(_folder, "report.html");
        File.WriteAllText(output, "old report");

        var ok = CliRunner.Run("report", trace, "--job", job, "--technician", "From Option", "--baseline", trace, "-o", output, "--units", "ft");
        Assert.True(ok.ExitCode == 0, ok.Error);
        var document = ReportFixtures.Parse(File.ReadAllText(output));
        Assert.Equal("<b>R-18</b>", document.QuerySelector("h1")!.TextContent);
        Assert.Empty(document.QuerySelectorAll("h1 b"));
        // Options beat the job file, which beats the trace metadata.
        Assert.Contains("From Option", document.QuerySelector(".job")!.TextContent);
        // 59.055 ft is 18.000 m: the open at the recorded length is the run's end.
        Assert.StartsWith("The run ends as recorded: open at 59", document.QuerySelector(".summary .headline")!.TextContent);
        // The trace against itself: the repair check runs and passes.
        Assert.Equal("Verdict: PASS — the run matches its baseline within the tolerances below.", document.QuerySelector(".verdict")!.TextContent);
        Assert.Single(Directory.GetFiles(_folder, "*report.html*"));

        File.WriteAllText(job, """{ "run_id": 7, "colour": "blue" }""");
        var bad = CliRunner.Run("report", trace, "--job", job, "-o", output);
        Assert.Equal(2, bad.ExitCode);
        Assert.Single(bad.Error.Split('\n', StringSplitOptions.RemoveEmptyEntries));
        Assert.Contains("run_id", bad.Error);
        Assert.Contains("colour", bad.Error);
        Assert.StartsWith("<!DOCTYPE html>", File.ReadAllText(output));
        Assert.Single(Directory.GetFiles(_folder, "*report.html*"));
    }

    [Fact]
    public void OutputIsRequired()
    {
        var result = CliRunner.Run("report", Path.Combine(_folder, "missing.csv"));
        Assert.Equal(2, result.ExitCode);
        Assert.Single(result.Error.Split('\n', StringSplitOptions.RemoveEmptyEntries));
    }
}
