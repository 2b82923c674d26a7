using AngleSharp.Html.Parser;
using CableFault.Tests.Cli;

namespace CableFault.Tests.History;

/// <summary>`report --run ID` takes the run's current baseline from the history database and lists its earlier measurements.</summary>
public class ReportFromHistoryTests : IDisposable
{
    private readonly string _folder = Directory.CreateTempSubdirectory("cf-report-history-").FullName;

    public void Dispose() => Directory.Delete(_folder, recursive: true);

    [Fact]
    public void BaselineAndEarlierChecksComeFromTheDatabase()
    {
        string db = Path.Combine(_folder, "history.db");
        string installed = HistoryFixtures.WriteCsv(_folder, "installed.csv", HistoryFixtures.Capture(HistoryFixtures.Installed(), 1));
        string recheck = HistoryFixtures.WriteCsv(_folder, "recheck.csv", HistoryFixtures.Capture(HistoryFixtures.Installed(), 2));
        string damaged = HistoryFixtures.WriteCsv(_folder, "damaged.csv", HistoryFixtures.Capture(HistoryFixtures.Damaged(), 3));
        Assert.Equal(0, CliRunner.Run("history", "add", installed, "--run", "YARD-7", "--baseline", "--db", db, "--note", "as installed").ExitCode);
        Assert.Equal(0, CliRunner.Run("history", "check", recheck, "--run", "YARD-7", "--db", db).ExitCode);

        string report = Path.Combine(_folder, "report.html");
        var result = CliRunner.Run("report", damaged, "--run", "YARD-7", "--db", db, "-o", report);

        // The damaged run differs from the stored baseline: the repair check ran against it and failed (exit 1).
        Assert.Equal(1, result.ExitCode);
        var document = new HtmlParser().ParseDocument(File.ReadAllText(report));
        var rows = document.QuerySelectorAll("table.history tbody tr").Select(r => r.TextContent).ToList();
        Assert.Equal(2, rows.Count);
        Assert.Contains("installed.csv", rows[0]);
        Assert.Contains("baseline (current)", rows[0]);
        Assert.Contains("as installed", rows[0]);
        Assert.Contains("recheck.csv", rows[1]);
        Assert.Contains("pass", rows[1]);
        Assert.Contains("history #1", document.Body!.TextContent);
    }

    [Fact]
    public void UnknownRunIsOneClearLine()
    {
        string db = Path.Combine(_folder, "history.db");
        string installed = HistoryFixtures.WriteCsv(_folder, "installed.csv", HistoryFixtures.Capture(HistoryFixtures.Installed(), 1));
        Assert.Equal(0, CliRunner.Run("history", "add", installed, "--run", "YARD-7", "--db", db).ExitCode);
        var result = CliRunner.Run("report", installed, "--run", "NOPE", "--db", db, "-o", Path.Combine(_folder, "r.html"));
        Assert.Equal(2, result.ExitCode);
        Assert.Single(result.Error.Split('\n', StringSplitOptions.RemoveEmptyEntries));
        Assert.Contains("NOPE", result.Error);
        Assert.False(File.Exists(Path.Combine(_folder, "r.html")));
    }
}
