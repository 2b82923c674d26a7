using CableFault.Tests.Cli;

namespace CableFault.Tests.History;

/// <summary>The 'history' verb in-process: add, list, show, export, check, and its exit codes (DESIGN.md §4).</summary>
public class HistoryCommandTests : IDisposable
{
    private readonly string _folder = Directory.CreateTempSubdirectory("cf-history-cli-").FullName;
    private string Db => Path.Combine(_folder, "runs.db");

    public void Dispose() => Directory.Delete(_folder, recursive: true);

    private CliRunner.Result History(params string[] args) => CliRunner.Run(["history", .. args, "--db", Db]);

    [Fact]
    public void AddListShowExportRoundTrip()
    {
        string install = HistoryFixtures.WriteCsv(_folder, "install.csv", HistoryFixtures.Capture(HistoryFixtures.Installed(), seed: 1));
        var added = History("add", install, "--run", "mast-feeder", "--baseline", "--note", "at handover");
        Assert.True(added.ExitCode == 0, added.Error);
        Assert.Contains("as #1", added.Output);

        var list = History("list");
        Assert.Equal(0, list.ExitCode);
        string row = list.Output.Split('\n')[1];
        Assert.StartsWith("1\t", row);
        Assert.Contains("\tmast-feeder\tinstall.csv\tcurrent\t", row);
        Assert.Contains("at handover", row);

        var show = History("show", "1");
        Assert.Equal(0, show.ExitCode);
        Assert.Contains(HistoryStoreHash(install), show.Output);
        Assert.Contains("\"events\"", show.Output); // the stored locate result
        Assert.Contains("the run's current baseline", show.Output);

        string exported = Path.Combine(_folder, "back.csv");
        var export = History("export", "1", "-o", exported);
        Assert.Equal(0, export.ExitCode);
        Assert.Equal(File.ReadAllBytes(install), File.ReadAllBytes(exported));
    }

    [Fact]
    public void SameFileTwiceIsSaidAndExitsZero()
    {
        string install = HistoryFixtures.WriteCsv(_folder, "install.csv", HistoryFixtures.Capture(HistoryFixtures.Installed(), seed: 1));
        Assert.Equal(0, History("add", install, "--run", "mast").ExitCode);
        var again = History("add", install, "--run", "mast");
        Assert.Equal(0, again.ExitCode);
        Assert.Contains("already stored as #1", again.Output);
        Assert.Equal(2, History("list").Output.Split('\n', StringSplitOptions.RemoveEmptyEntries).Length); // header + one row
    }

    [Fact]
    public void CheckPassesForTheSameRunAndFailsForADamagedOne()
    {
        string install = HistoryFixtures.WriteCsv(_folder, "install.csv", HistoryFixtures.Capture(HistoryFixtures.Installed(), seed: 1));
        string repaired = HistoryFixtures.WriteCsv(_folder, "repaired.csv", HistoryFixtures.Capture(HistoryFixtures.Installed(), seed: 2));
        string damaged = HistoryFixtures.WriteCsv(_folder, "damaged.csv", HistoryFixtures.Capture(HistoryFixtures.Damaged(), seed: 3));
        Assert.Equal(0, History("add", install, "--run", "mast", "--baseline").ExitCode);

        var pass = History("check", repaired, "--run", "mast");
        Assert.True(pass.ExitCode == 0, pass.Output + pass.Error);
        Assert.Contains("verdict: PASS", pass.Output);

        // A 10 Ω partial short at 6 m (ρ ≈ −0.71) is far outside any tolerance: the check must fail.
        var fail = History("check", damaged, "--run", "mast");
        Assert.True(fail.ExitCode == 1, fail.Output + fail.Error);
        Assert.Contains("verdict: FAIL", fail.Output);

        var rows = History("list", "--run", "mast").Output.Split('\n', StringSplitOptions.RemoveEmptyEntries).Skip(1).ToList();
        Assert.Equal(3, rows.Count);
        Assert.Contains("pass vs #1", rows[1]);
        Assert.Contains("fail vs #1", rows[2]);
    }

    [Fact]
    public void CheckWithoutABaselineIsBadInput()
    {
        string trace = HistoryFixtures.WriteCsv(_folder, "t.csv", HistoryFixtures.Capture(HistoryFixtures.Installed(), seed: 1));
        Assert.Equal(0, History("add", trace, "--run", "mast").ExitCode); // stored, but not as baseline
        var result = History("check", trace, "--run", "mast");
        Assert.Equal(2, result.ExitCode);
        Assert.Contains("has no baseline", result.Error);
        Assert.Single(result.Error.Split('\n', StringSplitOptions.RemoveEmptyEntries));
    }

    [Fact]
    public void ForeignDatabaseIsOneLineExitTwoAndUntouched()
    {
        File.WriteAllText(Db, "not a database at all\n");
        string trace = HistoryFixtures.WriteCsv(_folder, "t.csv", HistoryFixtures.Capture(HistoryFixtures.Installed(), seed: 1));
        foreach (var result in new[] { History("add", trace, "--run", "mast"), History("list"), History("show", "1") })
        {
            Assert.Equal(2, result.ExitCode);
            Assert.Single(result.Error.Split('\n', StringSplitOptions.RemoveEmptyEntries));
            Assert.DoesNotContain("Exception", result.Error);
        }
        Assert.Equal("not a database at all\n", File.ReadAllText(Db));
    }

    [Fact]
    public void UnknownIdIsBadInput()
    {
        string trace = HistoryFixtures.WriteCsv(_folder, "t.csv", HistoryFixtures.Capture(HistoryFixtures.Installed(), seed: 1));
        Assert.Equal(0, History("add", trace, "--run", "mast").ExitCode);
        var result = History("export", "7", "-o", Path.Combine(_folder, "x.csv"));
        Assert.Equal(2, result.ExitCode);
        Assert.Contains("no stored trace #7", result.Error);
        Assert.False(File.Exists(Path.Combine(_folder, "x.csv")));
    }

    private static string HistoryStoreHash(string path) =>
        Convert.ToHexStringLower(System.Security.Cryptography.SHA256.HashData(File.ReadAllBytes(path)));
}
