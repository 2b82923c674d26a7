using System.Diagnostics;
using System.Globalization;
using CableFault.Cables;
using CableFault.Cli;
using CableFault.History;
using CableFault.Networks;
using CableFault.Simulation;
using CableFault.Traces;
using Trace = CableFault.Traces.Trace;

namespace CableFault.Benchmarks;

/// <summary>
/// Run history with a large store (issue: run history): fills a temporary database with COUNT small traces (256
/// samples each, 100 runs, the first trace of each run its baseline; seeded noise makes every file distinct), then
/// times `history list` (all runs, and one run) and `history check` (one new trace against its run's baseline), both
/// in-process and as a separate `dotnet cablefault.dll` process as a user would start it (start-up included). The
/// store-only part of a check (read the baseline, store the result) is timed apart from the repair check's own analysis.
/// Usage: history [COUNT] — COUNT defaults to 10 000.
/// </summary>
public static class HistoryBenchmark
{
    private const int SamplesPerTrace = 256;
    private const int Runs = 100;

    public static int Run(string[] args)
    {
        int count = args.Length > 0 && int.TryParse(args[0], out int n) ? n : 10_000;
        string folder = Directory.CreateTempSubdirectory("cf-history-bench-").FullName;
        string db = Path.Combine(folder, "history.db");
        try
        {
            var template = ForwardModel.Simulate(
                new CableNetwork(new NetworkBranch([new CableSegment(10, new CableMedium(50, 0.66)), RunEnd.Open])),
                new InstrumentSettings { RiseTimeSeconds = 1e-9, SampleIntervalSeconds = 0.5e-9, PreTriggerSeconds = 10e-9, SampleCount = SamplesPerTrace })
                .WithMetadata("vf", "0.66").WithMetadata("z0", "50");

            var fill = Stopwatch.StartNew();
            using (var store = HistoryStore.Open(db))
                for (int i = 0; i < count; i++)
                {
                    var trace = Noisy(template, i);
                    store.Add(new NewHistoryEntry
                    {
                        RunId = RunName(i % Runs),
                        FileName = $"trace-{i:D5}.csv",
                        OriginalBytes = Csv(trace),
                        Trace = trace,
                        SettingsJson = """{"vf":0.66,"z0_ohms":50}""",
                        LocateJson = """{"events":[]}""",
                        AddedUtc = new DateTimeOffset(2020, 1, 1, 0, 0, 0, TimeSpan.Zero).AddHours(i),
                        MakeBaseline = i < Runs,
                    });
                }
            fill.Stop();
            Console.WriteLine(I($"filled {count} traces ({Runs} runs, {SamplesPerTrace} samples each) in {fill.Elapsed.TotalSeconds:F1} s, one transaction each; database {new FileInfo(db).Length / 1e6:F1} MB"));

            string newTrace = Path.Combine(folder, "new.csv");
            File.WriteAllBytes(newTrace, Csv(Noisy(template, count + 1)));

            Report("history list (in-process, all)", () => InProcess("history", "list", "--db", db));
            Report("history list --run (in-process, one run)", () => InProcess("history", "list", "--run", RunName(42), "--db", db));
            using (var store = HistoryStore.Open(db))
            {
                Report("store only: current baseline + add (in-process)", () =>
                {
                    var baseline = store.CurrentBaseline(RunName(7))!;
                    var trace = Noisy(template, count + 100 + Environment.TickCount % 1000);
                    store.Add(new NewHistoryEntry
                    {
                        RunId = RunName(7), FileName = "store-only.csv", OriginalBytes = Csv(trace), Trace = trace,
                        SettingsJson = "{}", AddedUtc = DateTimeOffset.UtcNow, Purpose = HistoryPurpose.Check, Passed = true,
                        CheckedAgainstId = baseline.Entry.Id,
                    });
                });
            }
            Report("history check (in-process, incl. repair-check analysis)", () => InProcess("history", "check", newTrace, "--run", RunName(3), "--db", db), okCodes: [0, 1]);

            string cli = Path.Combine(AppContext.BaseDirectory, "cablefault.dll");
            Report("history list (process, all)", () => Process(cli, "history", "list", "--db", db));
            Report("history check (process)", () => Process(cli, "history", "check", newTrace, "--run", RunName(5), "--db", db), okCodes: [0, 1]);
            return 0;
        }
        finally
        {
            Directory.Delete(folder, recursive: true);
        }
    }

    private static string RunName(int i) => $"run-{i:D3}";

    private static Trace Noisy(Trace template, int seed)
    {
        var random = new Random(seed);
        return template.WithSamples(template.SamplesVolts.Select(v => v + 1e-3 * (random.NextDouble() - 0.5)));
    }

    private static byte[] Csv(Trace trace)
    {
        using var stream = new MemoryStream();
        TraceCsvWriter.Write(trace, stream);
        return stream.ToArray();
    }

    private static void Report(string what, Func<int> action, int[]? okCodes = null)
    {
        okCodes ??= [0];
        var times = new List<double>();
        for (int i = 0; i < 3; i++)
        {
            var watch = Stopwatch.StartNew();
            int code = action();
            watch.Stop();
            if (!okCodes.Contains(code)) throw new InvalidOperationException($"{what}: exit code {code}");
            times.Add(watch.Elapsed.TotalSeconds);
        }
        Console.WriteLine(I($"{what}: {string.Join(" / ", times.Select(t => t.ToString("F3", CultureInfo.InvariantCulture)))} s (3 runs; the first includes warm-up)"));
    }

    private static void Report(string what, Action action) => Report(what, () => { action(); return 0; });

    private static int InProcess(params string[] args)
    {
        var output = new StringWriter();
        var error = new StringWriter();
        int code = CliApp.Run(args, output, error);
        if (code > 1) Console.Error.WriteLine(error.ToString());
        return code;
    }

    private static int Process(string cli, params string[] args)
    {
        var info = new ProcessStartInfo("dotnet") { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        info.ArgumentList.Add(cli);
        foreach (string a in args) info.ArgumentList.Add(a);
        using var process = System.Diagnostics.Process.Start(info)!;
        var output = process.StandardOutput.ReadToEndAsync();
        var error = process.StandardError.ReadToEndAsync();
        process.WaitForExit();
        if (process.ExitCode > 1) Console.Error.WriteLine(error.Result);
        return process.ExitCode;
    }

    private static string I(FormattableString text) => text.ToString(CultureInfo.InvariantCulture);
}
