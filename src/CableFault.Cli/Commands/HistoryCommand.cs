using System.CommandLine;
using System.Globalization;
using System.Text.Json;
using CableFault.Analysis;
using CableFault.Cli.Infrastructure;
using CableFault.Comparison;
using CableFault.History;
using CableFault.Reporting;
using CableFault.Reporting.Locate;

namespace CableFault.Cli.Commands;

/// <summary>
/// <c>cablefault history add|list|show|export|check</c>: every run's traces and its baseline, kept in one SQLite file
/// (--db, else $CABLEFAULT_DB, else the per-user data folder).
/// </summary>
public static class HistoryCommand
{
    /// <summary>Environment variable naming the database file when --db is absent.</summary>
    public const string DatabaseVariable = "CABLEFAULT_DB";

    /// <summary>
    /// Crash-test hook: when set, <c>history add</c> and <c>history check</c> print a line on stderr and wait forever
    /// inside their write transaction, so a test can kill the process mid-write.
    /// </summary>
    public const string PauseVariable = "CABLEFAULT_HISTORY_TEST_PAUSE";

    /// <summary>Builds the verb.</summary>
    public static Command Create(CliContext context)
    {
        var command = new Command("history",
            "Keep every run's traces and its baseline in an embedded database, and check new traces against the baseline.\n" +
            $"Database: --db, else ${DatabaseVariable}, else {DefaultDatabasePath()}.\n\n" +
            "Examples:\n  cablefault history add install.csv --run mast-feeder --baseline --note 'at handover'\n" +
            "  cablefault history check repaired.csv --run mast-feeder\n  cablefault history list --run mast-feeder");
        command.Subcommands.Add(Add(context));
        command.Subcommands.Add(List(context));
        command.Subcommands.Add(Show(context));
        command.Subcommands.Add(Export(context));
        command.Subcommands.Add(Check(context));
        return command;
    }

    /// <summary>The database file when neither --db nor $CABLEFAULT_DB is given: $XDG_DATA_HOME/cablefault/history.db,
    /// else ~/.local/share/cablefault/history.db (the local application-data folder on Windows).</summary>
    public static string DefaultDatabasePath()
    {
        string? xdg = Environment.GetEnvironmentVariable("XDG_DATA_HOME");
        string root = !string.IsNullOrWhiteSpace(xdg) && Path.IsPathRooted(xdg) ? xdg
            : OperatingSystem.IsWindows() ? Environment.GetFolderPath(Environment.SpecialFolder.LocalApplicationData)
            : Path.Combine(Environment.GetFolderPath(Environment.SpecialFolder.UserProfile), ".local", "share");
        return Path.Combine(root, "cablefault", "history.db");
    }

    internal static Option<FileInfo?> DbOption() =>
        new("--db") { Description = $"History database file (default: ${DatabaseVariable}, else {DefaultDatabasePath()})." };

    internal static string DatabasePath(ParseResult parsed, Option<FileInfo?> db) =>
        parsed.GetValue(db)?.FullName
        ?? (Environment.GetEnvironmentVariable(DatabaseVariable) is { Length: > 0 } fromEnvironment ? fromEnvironment : DefaultDatabasePath());

    private static HistoryStore OpenForWrite(string path, CliContext context) => HistoryStore.Open(path, new HistoryStoreOptions
    {
        InsideWriteTransaction = Environment.GetEnvironmentVariable(PauseVariable) is { Length: > 0 }
            ? () =>
            {
                context.Error.WriteLine("history: paused inside the write transaction");
                context.Error.Flush();
                Thread.Sleep(Timeout.Infinite);
            }
            : null,
    });

    private static Command Add(CliContext context)
    {
        var trace = new Argument<FileInfo>("trace") { Description = "Trace file (CSV, or Touchstone .s1p/.s2p)." };
        var run = RunOption(required: true);
        var baseline = new Option<bool>("--baseline") { Description = "Make this trace the run's reference for later repair checks (earlier baselines stay on record)." };
        var note = new Option<string?>("--note") { Description = "A note kept with the trace." };
        var db = DbOption();
        var cable = new CableSettingOptions();
        var window = TraceFiles.WindowOption();
        var command = new Command("add",
            "Store a trace: the original file, its samples and metadata, the cable settings and the locate result, with a SHA-256 and a UTC time. " +
            "The same file stored again for the same run is recognised by its hash: nothing is added, exit code 0.")
        {
            trace, run, baseline, note, db, window,
        };
        cable.AddTo(command);
        command.SetAction(parsed =>
        {
            var file = parsed.GetValue(trace)!;
            var loaded = TraceFiles.Load(file, TraceFiles.TransformFor(parsed.GetValue(window)));
            byte[] bytes = File.ReadAllBytes(file.FullName);
            var settings = cable.Resolve(parsed, loaded.Trace);
            foreach (string w in loaded.Warnings.Concat(settings.Warnings)) context.Warn($"{loaded.Name}: {w}");
            string path = DatabasePath(parsed, db);
            using var store = OpenForWrite(path, context); // open (and reject a foreign file) before the slow locate
            // A re-import is recognised by its hash before the slow locate; Add then reports it without storing anything.
            bool known = store.FindInRun(parsed.GetValue(run)!, HistoryStore.Sha256Hex(bytes)) is not null;
            var located = known ? null : Locator.Locate(loaded.Trace, settings.ToLocateOptions());
            var result = store.Add(new NewHistoryEntry
            {
                RunId = parsed.GetValue(run)!,
                FileName = loaded.Name,
                OriginalBytes = bytes,
                Trace = loaded.Trace,
                SettingsJson = SettingsJson(settings),
                LocateJson = located is null ? null : LocateJson.Render(located, loaded.Name, DistanceUnit.Meters),
                Note = parsed.GetValue(note),
                AddedUtc = DateTimeOffset.UtcNow,
                MakeBaseline = parsed.GetValue(baseline),
            });
            ReportAdd(result, parsed.GetValue(run)!, loaded.Name, context);
            return CliApp.Success;
        });
        return command;
    }

    private static void ReportAdd(HistoryAddResult result, string run, string name, CliContext context)
    {
        string baselineText = result.BaselineSet ? "; now the run's baseline" : "";
        context.Output.WriteLine(result.AlreadyStored
            ? $"{name}: already stored as #{result.Id} in run '{run}' (same SHA-256); nothing added{baselineText}"
            : $"stored {name} as #{result.Id} in run '{run}'{baselineText}");
        if (result.SameFileInOtherRuns.Count > 0)
            context.Warn($"{name}: the same file is also stored under another run (#{string.Join(", #", result.SameFileInOtherRuns)}); check the --run name");
    }

    private static Command List(CliContext context)
    {
        var run = RunOption(required: false);
        var db = DbOption();
        var command = new Command("list", "List the stored traces (oldest first): id, time (UTC), run, file, baseline mark, check verdict, note.") { run, db };
        command.SetAction(parsed =>
        {
            string path = DatabasePath(parsed, db);
            if (!HistoryStore.Exists(path))
            {
                context.Error.WriteLine($"no history yet at {path}");
                return CliApp.Success;
            }
            using var store = HistoryStore.Open(path, new HistoryStoreOptions { CreateIfMissing = false });
            var entries = store.List(parsed.GetValue(run));
            var o = context.Output;
            o.WriteLine("id\tadded (UTC)\trun\tfile\tbaseline\tcheck\tnote");
            foreach (var e in entries)
            {
                string mark = e.IsCurrentBaseline ? "current" : e.WasBaseline ? "earlier" : "";
                string check = e.Passed is bool p ? (p ? "pass" : "fail") + $" vs #{e.CheckedAgainstId}" : "";
                o.WriteLine($"{e.Id}\t{e.AddedUtc.UtcDateTime.ToString("yyyy-MM-dd HH:mm:ss", CultureInfo.InvariantCulture)}\t{e.RunId}\t{e.FileName}\t{mark}\t{check}\t{e.Note}");
            }
            if (entries.Count == 0) context.Error.WriteLine(parsed.GetValue(run) is string r ? $"no traces stored for run '{r}'" : "no traces stored");
            return CliApp.Success;
        });
        return command;
    }

    private static Command Show(CliContext context)
    {
        var id = new Argument<long>("id") { Description = "Stored trace id (see 'history list')." };
        var db = DbOption();
        var command = new Command("show", "Show one stored trace: where it came from, its hash, settings and the stored locate result.") { id, db };
        command.SetAction(parsed =>
        {
            using var store = HistoryStore.Open(DatabasePath(parsed, db), new HistoryStoreOptions { CreateIfMissing = false });
            var stored = Require(store, parsed.GetValue(id));
            var e = stored.Entry;
            var o = context.Output;
            o.WriteLine($"#{e.Id} {e.FileName} (run '{e.RunId}', {(e.Purpose == HistoryPurpose.Check ? "repair check" : "record")})");
            o.WriteLine($"added:    {e.AddedUtc.UtcDateTime.ToString("yyyy-MM-dd HH:mm:ss.fff", CultureInfo.InvariantCulture)} UTC");
            o.WriteLine($"sha256:   {e.Sha256} ({stored.OriginalBytes.Length} bytes)");
            o.WriteLine(FormattableString.Invariant($"samples:  {e.SampleCount} at {stored.Trace.SampleIntervalSeconds * 1e9:0.####} ns from {stored.Trace.StartTimeSeconds * 1e9:0.####} ns"));
            o.WriteLine($"baseline: {(e.IsCurrentBaseline ? "the run's current baseline" : e.WasBaseline ? "an earlier baseline of the run" : "no")}");
            if (e.Passed is bool passed) o.WriteLine($"check:    {(passed ? "PASS" : "FAIL")} against #{e.CheckedAgainstId}");
            if (e.Note is not null) o.WriteLine($"note:     {e.Note}");
            if (stored.Trace.Metadata.Count > 0)
                o.WriteLine("metadata: " + string.Join(", ", stored.Trace.Metadata.OrderBy(p => p.Key, StringComparer.Ordinal).Select(p => $"{p.Key}={p.Value}")));
            o.WriteLine($"settings: {stored.SettingsJson}");
            if (stored.CheckJson is not null) o.WriteLine($"check result: {stored.CheckJson}");
            if (stored.LocateJson is not null) { o.WriteLine("locate:"); o.WriteLine(stored.LocateJson); }
            return CliApp.Success;
        });
        return command;
    }

    private static Command Export(CliContext context)
    {
        var id = new Argument<long>("id") { Description = "Stored trace id (see 'history list')." };
        var output = new Option<FileInfo>("-o", "--output") { Description = "File to write the original trace file to.", Required = true };
        var db = DbOption();
        var command = new Command("export", "Write a stored trace's original file back, byte for byte.") { id, output, db };
        command.SetAction(parsed =>
        {
            using var store = HistoryStore.Open(DatabasePath(parsed, db), new HistoryStoreOptions { CreateIfMissing = false });
            var stored = Require(store, parsed.GetValue(id));
            var file = parsed.GetValue(output)!;
            AtomicFile.Write(file.FullName, stream => stream.Write(stored.OriginalBytes));
            context.Error.WriteLine($"wrote {file.Name}: #{stored.Entry.Id} {stored.Entry.FileName}, {stored.OriginalBytes.Length} bytes, sha256 {stored.Entry.Sha256}");
            return CliApp.Success;
        });
        return command;
    }

    private static Command Check(CliContext context)
    {
        var trace = new Argument<FileInfo>("trace") { Description = "Trace recorded now (after the repair)." };
        var run = RunOption(required: true);
        var note = new Option<string?>("--note") { Description = "A note kept with the trace." };
        var vf = new Option<double?>("--vf") { Description = "Velocity factor for both traces (default: the one the baseline was stored with)." };
        var z0 = new Option<double?>("--z0") { Description = "Cable impedance for both traces, Ω (default: the one the baseline was stored with)." };
        var cable = new Option<string?>("--cable") { Description = "Cable type (default: the one the baseline was stored with)." };
        var cables = CommonOptions.CableFile();
        var db = DbOption();
        var command = new Command("check",
            "Repair check of a new trace against the run's current baseline (as 'compare'); the trace is stored with the verdict.\n" +
            "Exit code 0 pass, 1 fail, 2 bad input (e.g. the run has no baseline).")
        {
            trace, run, note, vf, z0, cable, cables, db,
        };
        command.SetAction(parsed =>
        {
            string runId = parsed.GetValue(run)!;
            var file = parsed.GetValue(trace)!;
            var current = TraceFiles.Load(file);
            byte[] bytes = File.ReadAllBytes(file.FullName);
            foreach (string w in current.Warnings) context.Warn($"{current.Name}: {w}");
            using var store = OpenForWrite(DatabasePath(parsed, db), context);
            var baseline = store.CurrentBaseline(runId)
                ?? throw new InputException($"run '{runId}' has no baseline in {store.DatabasePath}; store one first with 'cablefault history add TRACE --run {runId} --baseline'");
            var stored = JsonSerializer.Deserialize<JsonElement>(baseline.SettingsJson);
            var options = new RepairCheckOptions
            {
                VelocityFactor = parsed.GetValue(vf) ?? Number(stored, "vf"),
                ImpedanceOhms = parsed.GetValue(z0) ?? Number(stored, "z0_ohms"),
                SourceImpedanceOhms = Number(stored, "source_ohms"),
                CableDesignation = parsed.GetValue(cable) ?? (stored.TryGetProperty("cable", out var c) && c.ValueKind == JsonValueKind.String ? c.GetString() : null),
                Library = CableOptions.Library(parsed.GetValue(cables)),
            };
            string baselineName = $"#{baseline.Entry.Id} {baseline.Entry.FileName}";
            var result = RepairCheck.Compare(baseline.Trace.WithMetadata("file", baseline.Entry.FileName),
                current.Trace.WithMetadata("file", current.Name), options);
            foreach (string w in result.Warnings) context.Warn(w);

            string checkJson = JsonSerializer.Serialize(new Dictionary<string, object?>
            {
                ["verdict"] = result.Pass ? "pass" : "fail",
                ["baseline_id"] = baseline.Entry.Id,
                ["reasons"] = result.Reasons,
                ["tolerances"] = new Dictionary<string, double>
                {
                    ["reflection"] = result.Tolerances.Reflection,
                    ["distance_m"] = result.Tolerances.DistanceMeters,
                    ["match_window_m"] = result.Tolerances.MatchWindowMeters,
                },
            });
            var added = store.Add(new NewHistoryEntry
            {
                RunId = runId,
                FileName = current.Name,
                OriginalBytes = bytes,
                Trace = current.Trace,
                SettingsJson = SettingsJson(result.Settings),
                LocateJson = LocateJson.Render(result.CurrentLocate, current.Name, DistanceUnit.Meters),
                Note = parsed.GetValue(note),
                AddedUtc = DateTimeOffset.UtcNow,
                Purpose = HistoryPurpose.Check,
                Passed = result.Pass,
                CheckedAgainstId = baseline.Entry.Id,
                CheckJson = checkJson,
            });

            var o = context.Output;
            o.WriteLine($"repair check: {current.Name} against baseline {baselineName} of run '{runId}'");
            o.WriteLine($"verdict: {(result.Pass ? "PASS" : "FAIL")}");
            foreach (string reason in result.Reasons) o.WriteLine($"  - {reason}");
            o.WriteLine(added.AlreadyStored
                ? $"already stored as #{added.Id} (same SHA-256); nothing added"
                : $"stored as #{added.Id} with the verdict");
            return result.Pass ? CliApp.Success : CliApp.CheckFailed;
        });
        return command;
    }

    private static Option<string> RunOption(bool required) => new("--run")
    {
        Description = required ? "Run (cable installation) the trace belongs to, e.g. mast-feeder." : "Only this run.",
        Required = required,
    };

    private static StoredTrace Require(HistoryStore store, long id) =>
        store.Get(id) ?? throw new InputException($"no stored trace #{id} in {store.DatabasePath}; see 'cablefault history list'");

    private static double? Number(JsonElement settings, string name) =>
        settings.TryGetProperty(name, out var value) && value.ValueKind == JsonValueKind.Number ? value.GetDouble() : null;

    private static string SettingsJson(CableSettings s) => JsonSerializer.Serialize(new Dictionary<string, object?>
    {
        ["vf"] = s.VelocityFactor,
        ["vf_source"] = s.VelocityFactorSource,
        ["vf_relative_sigma"] = s.VelocityFactorRelativeSigma,
        ["z0_ohms"] = s.ImpedanceOhms,
        ["z0_source"] = s.ImpedanceSource,
        ["source_ohms"] = s.SourceImpedanceOhms,
        ["cable"] = s.Cable?.Designation,
    });
}
