using System.Diagnostics;
using CableFault.Cli.Commands;
using CableFault.History;

namespace CableFault.Tests.History;

/// <summary>
/// Separate cablefault processes against one database: one killed in the middle of its write transaction, and two
/// writing at once. The built cablefault.dll sits beside the test assembly (the test project references the CLI).
/// </summary>
public class HistoryCrashTests : IDisposable
{
    /// <summary>Guard against a child that never reaches its pause (a broken build): a hang, not a timing check.</summary>
    private static readonly TimeSpan ChildGuard = TimeSpan.FromMinutes(5);

    private readonly string _folder = Directory.CreateTempSubdirectory("cf-history-crash-").FullName;
    private string Db => Path.Combine(_folder, "runs.db");

    public void Dispose() => Directory.Delete(_folder, recursive: true);

    private Process Start(bool pause, params string[] args)
    {
        var info = new ProcessStartInfo("dotnet")
        {
            RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false,
        };
        info.ArgumentList.Add(Path.Combine(AppContext.BaseDirectory, "cablefault.dll"));
        foreach (string a in args) info.ArgumentList.Add(a);
        info.ArgumentList.Add("--db");
        info.ArgumentList.Add(Db);
        if (pause) info.Environment[HistoryCommand.PauseVariable] = "1";
        else info.Environment.Remove(HistoryCommand.PauseVariable);
        return Process.Start(info)!;
    }

    [Fact]
    public void ProcessKilledInsideTheWriteLeavesASoundDatabaseWithoutTheHalfWrittenTrace()
    {
        // One committed trace, the run's baseline, stored beforehand.
        using (var store = HistoryStore.Open(Db)) store.Add(HistoryFixtures.Entry("mast", 1, baseline: true));
        string trace = HistoryFixtures.WriteCsv(_folder, "new.csv", HistoryFixtures.Capture(HistoryFixtures.Installed(), seed: 9));

        using var child = Start(pause: true, "history", "add", trace, "--run", "mast", "--baseline");
        var paused = Task.Run(async () =>
        {
            // Warnings may come first; the pause line says the trace row is written and the commit not yet done.
            while (await child.StandardError.ReadLineAsync() is string line)
                if (line == "history: paused inside the write transaction") return true;
            return false;
        });
        Assert.True(paused.Wait(ChildGuard), "the child never reached its write transaction");
        Assert.True(paused.Result, "the child ended without pausing inside its write transaction");
        child.Kill(entireProcessTree: true); // SIGKILL: no clean-up, no rollback by the process
        child.WaitForExit();

        using (var store = HistoryStore.Open(Db))
        {
            Assert.Empty(store.CheckIntegrity()); // PRAGMA integrity_check "ok" and no dangling references
            var entries = store.List();
            Assert.Equal(["capture-1.csv"], entries.Select(e => e.FileName)); // the interrupted add is wholly absent
            Assert.Equal(entries[0].Id, store.CurrentBaseline("mast")!.Entry.Id);
        }

        // The same add afterwards goes through normally.
        using var again = Start(pause: false, "history", "add", trace, "--run", "mast", "--baseline");
        string error = again.StandardError.ReadToEnd();
        again.WaitForExit();
        Assert.True(again.ExitCode == 0, error);
        using var after = HistoryStore.Open(Db);
        Assert.Equal(2, after.List().Count);
        Assert.Equal("new.csv", after.CurrentBaseline("mast")!.Entry.FileName);
    }

    [Fact]
    public void TwoProcessesAddingAtOnceBothSucceed()
    {
        string a = HistoryFixtures.WriteCsv(_folder, "a.csv", HistoryFixtures.Capture(HistoryFixtures.Installed(), seed: 1));
        string b = HistoryFixtures.WriteCsv(_folder, "b.csv", HistoryFixtures.Capture(HistoryFixtures.Installed(), seed: 2));
        // Both create the database too: the schema set-up itself must also cope with a second process.
        using var first = Start(pause: false, "history", "add", a, "--run", "mast", "--baseline");
        using var second = Start(pause: false, "history", "add", b, "--run", "tower", "--baseline");
        var errors = new[] { first.StandardError.ReadToEndAsync(), second.StandardError.ReadToEndAsync() };
        first.WaitForExit();
        second.WaitForExit();
        // Each either succeeded or was told, in one line, that the database was busy.
        foreach (var (process, error) in new[] { (first, errors[0].Result), (second, errors[1].Result) })
            Assert.True(process.ExitCode == 0 || (process.ExitCode == 2 && error.Contains("busy") && error.Contains("try again")), error);
        using var store = HistoryStore.Open(Db);
        Assert.Empty(store.CheckIntegrity());
        int succeeded = (first.ExitCode == 0 ? 1 : 0) + (second.ExitCode == 0 ? 1 : 0);
        Assert.Equal(succeeded, store.List().Count);
        Assert.Equal(2, succeeded); // with a 10 s busy timeout and writes of milliseconds, neither should have to give up
    }
}
