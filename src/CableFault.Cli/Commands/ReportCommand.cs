using System.CommandLine;
using System.Globalization;
using System.Reflection;
using CableFault.Analysis;
using CableFault.Cli.Infrastructure;
using CableFault.History;
using CableFault.Comparison;
using CableFault.Reporting;
using CableFault.Reporting.Html;

namespace CableFault.Cli.Commands;

/// <summary><c>cablefault report TRACE -o REPORT.html</c>: the self-contained document a technician hands over.</summary>
public static class ReportCommand
{
    /// <summary>Builds the verb.</summary>
    public static Command Create(CliContext context)
    {
        var trace = new Argument<FileInfo>("trace") { Description = "The measured trace (CSV)." };
        var output = new Option<FileInfo>("--output", "-o") { Description = "HTML report to write (replaced atomically).", Required = true };
        var baseline = new Option<FileInfo?>("--baseline") { Description = "A trace of the same run recorded earlier (at installation, before the damage), for the repair check." };
        var job = new Option<FileInfo?>("--job") { Description = "Job file (JSON; see README, 'Job files'): site, run ID, technician, date, instrument, recorded length." };
        var cable = new CableSettingOptions();
        var offset = new Option<double?>("--time-zero-offset-ns") { Description = "Move the reference plane by this much round-trip time after the incident edge, ns (e.g. to skip a launch lead)." };
        var window = TraceFiles.WindowOption();
        var site = new Option<string?>("--site") { Description = "Site name for the header (overrides the job file and trace)." };
        var runId = new Option<string?>("--run-id") { Description = "Cable run ID for the header." };
        var technician = new Option<string?>("--technician") { Description = "Technician's name for the header." };
        var date = new Option<string?>("--date") { Description = "Date and time of the measurement (ISO 8601 preferred)." };
        var length = new Option<double?>("--expected-length") { Description = "Installed length of the run, in --units: an end found there is reported as expected." };
        var units = CommonOptions.Units();
        var historyRun = new Option<string?>("--run") { Description = "Run ID in the history database: its current baseline is used for the repair check (unless --baseline is given) and its earlier measurements are listed." };
        var db = HistoryCommand.DbOption();
        var asBuilt = new AsBuiltOptions();
        var referenceKind = CheckOptions.ReferenceKind();

        var command = new Command("report",
            "Write one self-contained HTML report of a measurement: job header, summary, plots, event table, settings and cautions.\n\n" +
            "Examples:\n  cablefault report traces/quillon-bay/mast-feeder-damaged.csv --job job.json -o QB-01.html\n" +
            "  cablefault report traces/quillon-bay/mast-feeder-damaged.csv --as-built traces/quillon-bay/mast-feeder.asbuilt.json -o QB-01.html")
        {
            trace, output, baseline, job, site, runId, technician, date, length, units, offset, window, historyRun, db, referenceKind,
        };
        cable.AddTo(command);
        asBuilt.AddTo(command);
        command.SetAction(parsed =>
        {
            var unit = DistanceUnit.Parse(parsed.GetValue(units));
            var library = CableOptions.Library(parsed.GetValue(cable.CableFile));
            var transform = TraceFiles.TransformFor(parsed.GetValue(window));
            var loaded = TraceFiles.Load(parsed.GetValue(trace)!, transform);
            foreach (string warning in loaded.Warnings) context.Warn($"{loaded.Name}: {warning}");

            var fromFile = parsed.GetValue(job) is FileInfo jobFile ? InputFiles.Read(jobFile, "job", JobSheetJson.Read) : JobSheet.Empty;
            double? lengthOption = parsed.GetValue(length) is double shown ? shown * unit.MetersPerUnit : null;
            if (lengthOption is not (null or > 0)) throw new InputException($"--expected-length {parsed.GetValue(length)}: must be a positive length in {unit.Symbol}");
            var fromOptions = new JobSheet(Site: parsed.GetValue(site), RunId: parsed.GetValue(runId), Technician: parsed.GetValue(technician),
                MeasuredAt: parsed.GetValue(date), CableType: parsed.GetValue(cable.Cable), ExpectedLengthMeters: lengthOption);
            var sheet = fromOptions.Over(fromFile).Over(JobSheet.FromTrace(loaded.Trace));

            var settings = ResolveSettings(parsed, loaded, fromFile, library, cable, context);
            var result = Locator.Locate(loaded.Trace, settings.ToLocateOptions() with
            {
                TimeZeroOffsetSeconds = parsed.GetValue(offset) is double ns ? ns * 1e-9 : null,
                WarningsInFeet = unit == DistanceUnit.Feet,
            });

            RepairCheckPart? repair = null;
            IReadOnlyList<PastCheck>? history = null;
            TraceFiles.Loaded? before = parsed.GetValue(baseline) is FileInfo baselineFile ? TraceFiles.Load(baselineFile, transform) : null;
            if (parsed.GetValue(historyRun) is string historyRunId)
            {
                string path = HistoryCommand.DatabasePath(parsed, db);
                if (!HistoryStore.Exists(path))
                    throw new InputException($"{path}: no history database there; store traces first with 'cablefault history add TRACE --run {historyRunId}' or give --db");
                using var store = HistoryStore.Open(path, new HistoryStoreOptions { CreateIfMissing = false });
                var entries = store.List(historyRunId);
                if (entries.Count == 0)
                    throw new InputException($"{path}: run '{historyRunId}' has no stored traces; see 'cablefault history list'");
                history = entries.Select(e => new PastCheck(e.Id, e.AddedUtc, e.FileName,
                    e.IsCurrentBaseline ? "baseline (current)" : e.WasBaseline ? "baseline (earlier)" : e.Purpose == HistoryPurpose.Check ? "check" : "record",
                    e.Passed, e.Note)).ToList();
                if (before is null && store.CurrentBaseline(historyRunId) is { } stored)
                    before = new TraceFiles.Loaded(stored.Trace, [], $"history #{stored.Entry.Id} ({stored.Entry.FileName}, stored {stored.Entry.AddedUtc.UtcDateTime:yyyy-MM-dd})");
                if (sheet.RunId is null) sheet = sheet with { RunId = historyRunId };
            }
            if (before is not null)
            {
                foreach (string warning in before.Warnings) context.Warn($"{before.Name}: {warning}");
                // Both traces are read with the settings resolved for the current one, so the comparison cannot
                // disagree with the rest of the report.
                var compareOptions = new RepairCheckOptions
                {
                    VelocityFactor = settings.VelocityFactor,
                    ImpedanceOhms = settings.ImpedanceOhms,
                    SourceImpedanceOhms = settings.SourceImpedanceOhms,
                    CableDesignation = settings.Cable?.Designation,
                    Library = library,
                    ReferenceKind = ReferenceKindNames.Parse(parsed.GetValue(referenceKind)!),
                    WarningsInFeet = unit == DistanceUnit.Feet,
                };
                try
                {
                    repair = new RepairCheckPart(before.Name, RepairCheck.Compare(before.Trace, loaded.Trace, compareOptions));
                }
                catch (InputException e)
                {
                    // The measurement is still worth reporting; the document says why the check is missing.
                    repair = new RepairCheckPart(before.Name, null, $"The traces could not be compared: {e.Message}");
                    context.Warn($"repair check not made: {e.Message}");
                }
            }

            // The list: --as-built, else the job file's "as_built" (a path relative to the job file).
            FileInfo? listFile = parsed.GetValue(asBuilt.File);
            if (listFile is null && fromFile.AsBuiltFile is string relative && parsed.GetValue(job) is FileInfo jobOf)
                listFile = new FileInfo(Path.Combine(jobOf.DirectoryName ?? ".", relative));
            var list = listFile is null ? null : AsBuiltOptions.Load(listFile);
            var match = list is null ? null : Workflows.AsBuiltMatcher.Match(result, list);

            var input = new ReportInput(sheet, loaded.Name, result, settings, unit, DateTimeOffset.UtcNow, Version(), repair, history, match, listFile?.Name);
            string html = HtmlReport.Render(input);
            var target = parsed.GetValue(output)!;
            AtomicFile.WriteText(target.FullName, writer => writer.Write(html));
            context.Error.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"wrote {target.Name}: {result.Events.Count} event(s){(match is null ? "" : $" ({match.Unexpected.Count} unexpected, {match.ExpectedCount} as listed, {match.Missing.Count} listed not found)")}, {html.Length / 1024.0:0} kB"));
            if (repair?.Comparison is { Pass: false })
            {
                context.Error.WriteLine(repair.Comparison.ReferenceKind == ReferenceKind.Pair
                    ? "pair check: FAIL, differs from the reference pair (see the report)"
                    : "repair check: FAIL (see the report)");
                return CliApp.CheckFailed;
            }
            return CliApp.Success;
        });
        return command;
    }

    /// <summary>The cable settings with the job file between the options and the trace metadata: option, job file,
    /// trace metadata, cable type, default.</summary>
    private static CableSettings ResolveSettings(ParseResult parsed, TraceFiles.Loaded loaded, JobSheet fromFile, Cables.CableLibrary library,
        CableSettingOptions cable, CliContext context)
    {
        string? cableName = parsed.GetValue(cable.Cable);
        if (cableName is null && fromFile.CableType is string jobCable)
        {
            // A job file's cable type is often written for people ("RG-213, double screen"); use it only when it names a type.
            if (library.Find(jobCable) is not null) cableName = jobCable;
            else context.Warn($"job file cable type '{jobCable}' is not a known cable type; shown in the header only");
        }
        double? vfOption = parsed.GetValue(cable.VelocityFactor);
        double? z0Option = parsed.GetValue(cable.Impedance);
        double? sigma = parsed.GetValue(cable.VelocityFactorUncertainty) is double percent ? percent / 100 : null;
        var settings = CableSettings.Resolve(loaded.Trace, vfOption ?? fromFile.VelocityFactor, z0Option ?? fromFile.ImpedanceOhms,
            cableName, parsed.GetValue(cable.SourceImpedance), library, sigma);
        if (vfOption is null && fromFile.VelocityFactor is not null) settings = settings with { VelocityFactorSource = "job" };
        if (z0Option is null && fromFile.ImpedanceOhms is not null) settings = settings with { ImpedanceSource = "job" };
        foreach (string warning in settings.Warnings) context.Warn(warning);
        return settings;
    }

    private static string Version() =>
        typeof(ReportCommand).Assembly.GetCustomAttribute<AssemblyInformationalVersionAttribute>()?.InformationalVersion.Split('+')[0] ?? "0";
}
