using System.CommandLine;
using System.Text.Json;
using System.Text.Json.Nodes;
using CableFault.Analysis;
using CableFault.Cli.Infrastructure;
using CableFault.Reporting;
using CableFault.Reporting.Locate;
using CableFault.Workflows;

namespace CableFault.Cli.Commands;

/// <summary>
/// <c>cablefault locate TRACE...</c>: every event on the run, with distance ± σ, kind, size and confidence. One file gives
/// the table (or the DESIGN.md §4 JSON object); several files, folders or patterns run in parallel with progress on
/// stderr, skip bad inputs (exit code 2 at the end) and finish with a summary table (or a JSON array).
/// </summary>
public static class LocateCommand
{
    /// <summary>Builds the verb.</summary>
    public static Command Create(CliContext context)
    {
        var traces = new Argument<string[]>("traces")
        {
            Description = "Step-response traces (CSV, or Touchstone .s1p/.s2p; see README): files, folders (their *.csv, *.s1p, *.s2p) or patterns such as 'site-4/*.csv'.",
            Arity = ArgumentArity.OneOrMore,
        };
        var cable = new CableSettingOptions();
        var field = new FieldOptions();
        var asBuilt = new AsBuiltOptions();
        var units = CommonOptions.Units();
        var format = new Option<string>("--format") { Description = "text (a table) or json (DESIGN.md §4 contract; an array of those objects for several traces).", DefaultValueFactory = _ => "text" }
            .AcceptOnlyFromAmong("text", "json");
        var offset = new Option<double?>("--time-zero-offset-ns") { Description = "Move the reference plane by this much round-trip time after the incident edge, ns (e.g. to skip a launch lead)." };
        var window = TraceFiles.WindowOption();
        var png = CommonOptions.Png("the trace and impedance profile with the events marked (one trace only)");
        var svg = CommonOptions.Svg("the trace and impedance profile with the events marked (one trace only)");
        var eventsCsv = new Option<FileInfo?>("--events-csv") { Description = "Also write every event of every trace to this CSV file (safe to open in a spreadsheet)." };
        var fitSettling = new Option<bool>("--fit-settling")
        {
            Description = "Also fit a slow settling of the instrument's step (a creep of a per cent or so over tens of ns after the edge) and read every echo with it; for instruments whose step into a matched load keeps creeping.",
        };
        var jobs = new Option<int?>("--jobs") { Description = $"Traces worked on at once when several are given (default: the number of cores, here {BatchRunner.DefaultDegree})." };

        var command = new Command("locate",
            "Find and classify every event on the run: distance from the connector with a ± figure, kind, size and confidence. " +
            "Several traces (files, folders, patterns) are located in parallel and summarised; a bad one is reported and skipped, and the exit code is then 2.\n\n" +
            "Examples:\n  cablefault locate traces/quillon-bay/mast-feeder-damaged.csv --cable RG-213 --png damaged.png\n" +
            "  cablefault locate traces/quillon-bay --events-csv events.csv\n" +
            "  cablefault locate traces/quillon-bay/mast-feeder-damaged.csv --cable RG-213 --as-built traces/quillon-bay/mast-feeder.asbuilt.json")
        {
            traces, units, format, offset, window, png, svg, eventsCsv, fitSettling, jobs,
        };
        cable.AddTo(command);
        field.AddTo(command);
        asBuilt.AddTo(command);
        command.SetAction(parsed =>
        {
            var paths = parsed.GetValue(traces)!;
            var unit = DistanceUnit.Parse(parsed.GetValue(units));
            bool json = parsed.GetValue(format) == "json";
            var library = CableOptions.Library(parsed.GetValue(cable.CableFile));
            if (parsed.GetValue(cable.Cable) is string cableName) library.Get(cableName); // an unknown --cable is a usage error, not a per-file one
            double? sigma = parsed.GetValue(cable.VelocityFactorUncertainty) is double percent ? percent / 100 : null;
            var transform = TraceFiles.TransformFor(parsed.GetValue(window));
            double? offsetSeconds = parsed.GetValue(offset) is double ns ? ns * 1e-9 : null;

            var insulation = field.InsulationClass(parsed);
            var list = asBuilt.Load(parsed);
            string? listName = parsed.GetValue(asBuilt.File)?.Name;
            // Traces worked on side by side already keep the cores busy (see LocateOptions.SelectAheadOfLossProbe and
            // SplitRunsAcrossCores).
            bool useIdleCores = true;
            EventsCsv.Entry Locate(string path, Action<string> warn, bool timingSigmaOnly = false)
            {
                if (BatchInputs.ProblemBeforeReading(path) is string problem) throw new InputException(problem);
                var loaded = TraceFiles.Load(new FileInfo(path), transform);
                CableSettings settings;
                try
                {
                    settings = CableSettings.Resolve(loaded.Trace, parsed.GetValue(cable.VelocityFactor), parsed.GetValue(cable.Impedance),
                        parsed.GetValue(cable.Cable), parsed.GetValue(cable.SourceImpedance), library, sigma);
                }
                catch (InputException e)
                {
                    // Metadata problems surface here; the message must say which file holds them.
                    throw new InputException(BatchRunner.Named(e.Message, path, loaded.Name), e);
                }
                foreach (string warning in loaded.Warnings.Concat(settings.Warnings)) warn(warning);
                var options = settings.ToLocateOptions() with
                {
                    TimeZeroOffsetSeconds = offsetSeconds, EstimateSettling = parsed.GetValue(fitSettling),
                    WarningsInFeet = unit == DistanceUnit.Feet, SelectAheadOfLossProbe = useIdleCores,
                    SplitRunsAcrossCores = useIdleCores,
                };
                // Both ends: the VF cancels, so the σ's must be the timing σ's alone.
                if (timingSigmaOnly) options = options with { VelocityFactorRelativeSigma = 0 };
                var lead = field.Lead(parsed, unit, library, settings.VelocityFactor);
                if (lead is not null) options = lead.Shift(options);
                var result = Locator.Locate(loaded.Trace, options);
                if (lead is not null) result = lead.DropLeadEvents(result);
                string method = DistanceMethod.Describe(result.Options, settings.Cable, lead, unit);
                return new EventsCsv.Entry(path, loaded.Name, loaded.Trace.MetadataOrNull("run"), result, method);
            }

            if (parsed.GetValue(field.BothEnds))
            {
                if (list is not null)
                    throw new InputException("--as-built marks the events of single-ended traces; leave it out with --from-both-ends, or locate each end's trace on its own with it");
                if (paths.Length != 2 || !paths.All(File.Exists))
                    throw new InputException("--from-both-ends takes exactly two trace files: the one from end A, then the one from end B");
                var (lengthMeters, lengthSigmaMeters) = field.LengthMeters(parsed, unit);
                var a = Locate(paths[0], context.Warn, timingSigmaOnly: true);
                var b = Locate(paths[1], context.Warn, timingSigmaOnly: true);
                var pair = BothEndsLocation.Combine(a.Result, b.Result, lengthMeters, lengthSigmaMeters);
                string method = DistanceMethod.BothEnds(lengthMeters, lengthSigmaMeters, unit);
                if (json)
                {
                    var node = JsonNode.Parse(BothEndsLocate.Json(pair, a.TraceName, b.TraceName, unit))!.AsObject();
                    node["distance_method"] = method;
                    context.Output.WriteLine(node.ToJsonString(JsonOptions));
                }
                else
                {
                    context.Output.Write(BothEndsLocate.Text(pair, a.TraceName, b.TraceName, a.Result.Options.VelocityFactor, unit));
                    context.Output.WriteLine($"distances: {method}");
                }
                return CliApp.Success;
            }
            if (parsed.GetValue(field.Length) is not null)
                throw new InputException("--length is for --from-both-ends; to work out the VF from a run of known length use 'cablefault calibrate'");

            if (BatchInputs.IsSingleFile(paths))
            {
                var located = Locate(paths[0], context.Warn);
                bool ranged = VelocityRangeOutput.Applies(located.Result);
                var match = list is null ? null : AsBuiltMatcher.Match(located.Result, list);
                if (json)
                {
                    var node = LocateJson.ToNode(located.Result, located.TraceName, unit);
                    node["distance_method"] = located.Method;
                    if (ranged) VelocityRangeOutput.AddJson(node, located.Result, insulation);
                    if (match is not null) AsBuiltJsonOutput.Add(node, match, unit, listName);
                    context.Output.WriteLine(node.ToJsonString(JsonOptions));
                }
                else
                {
                    context.Output.Write(LocateText.Render(located.Result, located.TraceName, unit, match, located.Method));
                    if (ranged) context.Output.Write(VelocityRangeOutput.Text(located.Result, insulation, unit));
                }
                WriteEventsCsv(parsed.GetValue(eventsCsv), [located], unit, context);
                PlotOutput.Write(parsed.GetValue(png), parsed.GetValue(svg),
                    () => LocateFigures.Build(located.Result, located.Run ?? located.TraceName, unit), context);
                return CliApp.Success;
            }

            if (parsed.GetValue(png) is not null || parsed.GetValue(svg) is not null)
                throw new InputException("--png and --svg draw one trace; give a single trace file for a figure");
            int degree = parsed.GetValue(jobs) ?? BatchRunner.DefaultDegree;
            if (degree < 1) throw new InputException($"--jobs {degree}: must be 1 or more");

            var inputs = BatchInputs.Expand(paths);
            useIdleCores = degree == 1 || inputs.Count == 1;
            var progress = new BatchProgress(context.Error, BatchProgress.IsTerminal(context.Error), inputs.Count);
            var outcomes = BatchRunner.Run(inputs, degree, (path, warn) =>
                Locate(path, w => warn(BatchRunner.Named(w, path, Path.GetFileName(path)))), context, progress);

            // One as-built list applies to every trace: useful for repeated measurements of the same run.
            if (json) context.Output.WriteLine(RenderJsonArray(outcomes, unit, insulation, list, listName));
            else
            {
                foreach (var done in outcomes.Where(o => o.Succeeded))
                    context.Output.WriteLine(LocateText.Render(done.Value!.Result, done.Path, unit,
                        list is null ? null : AsBuiltMatcher.Match(done.Value!.Result, list), done.Value!.Method));
                context.Output.Write(BatchSummary.Render(
                    outcomes.Select(o => new BatchSummary.Row(o.Path, o.Value?.Run, o.Value?.Result)).ToList(), unit));
            }
            WriteEventsCsv(parsed.GetValue(eventsCsv), outcomes.Where(o => o.Succeeded).Select(o => o.Value!).ToList(), unit, context);

            if (outcomes.Any(o => o.Internal)) return CliApp.InternalError;
            return outcomes.Any(o => !o.Succeeded) ? CliApp.BadInput : CliApp.Success;
        });
        return command;
    }

    private static readonly JsonSerializerOptions JsonOptions = new() { WriteIndented = true, Encoder = System.Text.Encodings.Web.JavaScriptEncoder.UnsafeRelaxedJsonEscaping };

    private static string RenderJsonArray(IReadOnlyList<BatchRunner.Outcome<EventsCsv.Entry>> outcomes, DistanceUnit unit, Cables.InsulationClass insulation,
        AsBuiltList? list, string? listName)
    {
        var array = new JsonArray();
        foreach (var outcome in outcomes)
        {
            if (outcome.Value is { } located)
            {
                var node = LocateJson.ToNode(located.Result, located.TraceName, unit);
                node["path"] = outcome.Path;
                node["distance_method"] = located.Method;
                if (VelocityRangeOutput.Applies(located.Result)) VelocityRangeOutput.AddJson(node, located.Result, insulation);
                if (list is not null) AsBuiltJsonOutput.Add(node, AsBuiltMatcher.Match(located.Result, list), unit, listName);
                array.Add(node);
            }
            else
            {
                array.Add(new JsonObject
                {
                    ["trace"] = Path.GetFileName(outcome.Path),
                    ["path"] = outcome.Path,
                    ["error"] = outcome.Error,
                });
            }
        }
        return array.ToJsonString(new JsonSerializerOptions { WriteIndented = true, Encoder = System.Text.Encodings.Web.JavaScriptEncoder.UnsafeRelaxedJsonEscaping });
    }

    private static void WriteEventsCsv(FileInfo? file, IReadOnlyList<EventsCsv.Entry> entries, DistanceUnit unit, CliContext context)
    {
        if (file is null) return;
        AtomicFile.WriteText(file.FullName, writer => EventsCsv.Write(entries, unit, writer));
        context.Error.WriteLine($"wrote {file.Name}: {entries.Sum(e => e.Result.Events.Count)} events from {entries.Count} trace{(entries.Count == 1 ? "" : "s")}");
    }
}
