using System.CommandLine;
using CableFault.Analysis;
using CableFault.Cli.Infrastructure;
using CableFault.Reporting;
using CableFault.Reporting.Locate;

namespace CableFault.Cli.Commands;

/// <summary><c>cablefault locate TRACE</c>: every event on the run, with distance ± σ, kind, size and confidence.</summary>
public static class LocateCommand
{
    /// <summary>Builds the verb.</summary>
    public static Command Create(CliContext context)
    {
        var trace = new Argument<FileInfo>("trace") { Description = "Step-response trace (CSV; see README)." };
        var cable = new CableSettingOptions();
        var units = CommonOptions.Units();
        var format = new Option<string>("--format") { Description = "text (a table) or json (DESIGN.md §4 contract).", DefaultValueFactory = _ => "text" }
            .AcceptOnlyFromAmong("text", "json");
        var offset = new Option<double?>("--time-zero-offset-ns") { Description = "Move the reference plane by this much round-trip time after the incident edge, ns (e.g. to skip a launch lead)." };
        var window = TraceFiles.WindowOption();
        var png = CommonOptions.Png("the trace and impedance profile with the events marked");
        var svg = CommonOptions.Svg("the trace and impedance profile with the events marked");

        var command = new Command("locate",
            "Find and classify every event on the run: distance from the connector with a ± figure, kind, size and confidence.\n\n" +
            "Example:\n  cablefault locate traces/quillon-bay/mast-feeder-damaged.csv --cable RG-213 --png damaged.png")
        {
            trace, units, format, offset, window, png, svg,
        };
        cable.AddTo(command);
        command.SetAction(parsed =>
        {
            var file = parsed.GetValue(trace)!;
            var loaded = TraceFiles.Load(file, TraceFiles.TransformFor(parsed.GetValue(window)));
            var settings = cable.Resolve(parsed, loaded.Trace);
            bool json = parsed.GetValue(format) == "json";
            foreach (string warning in loaded.Warnings.Concat(settings.Warnings)) context.Warn(warning);

            var options = settings.ToLocateOptions() with
            {
                TimeZeroOffsetSeconds = parsed.GetValue(offset) is double ns ? ns * 1e-9 : null,
            };
            var result = Locator.Locate(loaded.Trace, options);
            var unit = DistanceUnit.Parse(parsed.GetValue(units));
            context.Output.Write(json ? LocateJson.Render(result, loaded.Name, unit) + Environment.NewLine : LocateText.Render(result, loaded.Name, unit));

            string title = loaded.Trace.MetadataOrNull("run") ?? loaded.Name;
            PlotOutput.Write(parsed.GetValue(png), parsed.GetValue(svg), () => LocateFigures.Build(result, title, unit), context);
            return CliApp.Success;
        });
        return command;
    }
}
