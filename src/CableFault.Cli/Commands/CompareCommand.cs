using System.CommandLine;
using System.Globalization;
using System.Text.Json;
using CableFault.Analysis;
using CableFault.Cli.Infrastructure;
using CableFault.Comparison;
using CableFault.Reporting;
using CableFault.Reporting.Plots;

namespace CableFault.Cli.Commands;

/// <summary><c>cablefault compare BASELINE CURRENT</c>: is the run back to its baseline, and if not, what changed and where?</summary>
public static class CompareCommand
{
    /// <summary>Builds the verb.</summary>
    public static Command Create(CliContext context)
    {
        var baselineArg = new Argument<FileInfo>("baseline") { Description = "Trace recorded at installation (or before the damage)." };
        var currentArg = new Argument<FileInfo>("current") { Description = "Trace recorded now (after the repair)." };
        var vf = new Option<double?>("--vf") { Description = "Velocity factor for both traces (overrides their metadata)." };
        var z0 = new Option<double?>("--z0") { Description = "Cable impedance for both traces, Ω (overrides their metadata)." };
        var cable = new Option<string?>("--cable") { Description = "Cable type (see 'cablefault cables'), for VF, Z0 and loss." };
        var cables = CommonOptions.CableFile();
        var toleranceReflection = new Option<double>("--tolerance-reflection")
        {
            Description = $"Largest accepted change of an event's reflection, and smallest new or gone event that fails (dimensionless, of the incident step). Default {CompareTolerances.DefaultReflection.ToString(CultureInfo.InvariantCulture)} (return loss about 30 dB).",
            DefaultValueFactory = _ => CompareTolerances.DefaultReflection,
        };
        var toleranceDistance = new Option<double>("--tolerance-distance-m")
        {
            Description = $"Largest accepted shift of an event, m. Default {CompareTolerances.DefaultDistanceMeters.ToString(CultureInfo.InvariantCulture)}.",
            DefaultValueFactory = _ => CompareTolerances.DefaultDistanceMeters,
        };
        var window = new Option<double>("--match-window-m")
        {
            Description = $"Events further apart than this are not paired (reported as gone + new), m. Default {CompareTolerances.DefaultMatchWindowMeters.ToString(CultureInfo.InvariantCulture)}.",
            DefaultValueFactory = _ => CompareTolerances.DefaultMatchWindowMeters,
        };
        var matchRise = new Option<bool>("--match-rise") { Description = "Smooth the sharper trace to the slower rise time before comparing." };
        var format = new Option<string>("--format") { Description = "text (a readable summary) or json.", DefaultValueFactory = _ => "text" }
            .AcceptOnlyFromAmong("text", "json");
        var units = CommonOptions.Units();
        var png = CommonOptions.Png("both traces and their difference against distance");
        var svg = CommonOptions.Svg("both traces and their difference against distance");

        var command = new Command("compare",
            "Compare a trace against its baseline: pass when no event is new, gone, moved or changed beyond the tolerances.\n" +
            "Exit code 0 pass, 1 fail, 2 bad input.\n\n" +
            "Example:\n  cablefault compare traces/quillon-bay/mast-feeder.csv traces/quillon-bay/mast-feeder-repaired.csv --png repair.png")
        {
            baselineArg, currentArg, vf, z0, cable, cables, toleranceReflection, toleranceDistance, window, matchRise, format, units, png, svg,
        };
        command.SetAction(parsed =>
        {
            var library = CableOptions.Library(parsed.GetValue(cables));
            var baseline = TraceFiles.Load(parsed.GetValue(baselineArg)!);
            var current = TraceFiles.Load(parsed.GetValue(currentArg)!);
            foreach (string w in baseline.Warnings) context.Warn($"{baseline.Name}: {w}");
            foreach (string w in current.Warnings) context.Warn($"{current.Name}: {w}");
            var options = new RepairCheckOptions
            {
                VelocityFactor = parsed.GetValue(vf),
                ImpedanceOhms = parsed.GetValue(z0),
                CableDesignation = parsed.GetValue(cable),
                Library = library,
                MatchRise = parsed.GetValue(matchRise),
                Tolerances = new CompareTolerances
                {
                    Reflection = parsed.GetValue(toleranceReflection),
                    DistanceMeters = parsed.GetValue(toleranceDistance),
                    MatchWindowMeters = parsed.GetValue(window),
                },
            };
            var result = RepairCheck.Compare(baseline.Trace.WithMetadata("file", baseline.Name),
                current.Trace.WithMetadata("file", current.Name), options);
            foreach (string w in result.Warnings) context.Warn(w);

            var unit = DistanceUnit.Parse(parsed.GetValue(units));
            if (parsed.GetValue(format) == "json") WriteJson(result, baseline.Name, current.Name, context.Output);
            else WriteText(result, baseline.Name, current.Name, unit, context.Output);
            PlotOutput.Write(parsed.GetValue(png), parsed.GetValue(svg),
                () => CompareFigures.Build(result, unit, $"{baseline.Name} vs {current.Name}"), context);
            return result.Pass ? CliApp.Success : CliApp.CheckFailed;
        });
        return command;
    }

    private static void WriteText(CompareResult r, string baselineName, string currentName, DistanceUnit unit, TextWriter o)
    {
        var s = r.Settings;
        o.WriteLine(I($"repair check: {currentName} against baseline {baselineName}"));
        o.WriteLine(I($"  cable: VF {s.VelocityFactor:0.###} ({s.VelocityFactorSource}), Z0 {s.ImpedanceOhms:0.#} Ω ({s.ImpedanceSource}); rise {r.BaselineRiseTimeSeconds * 1e9:0.###} / {r.CurrentRiseTimeSeconds * 1e9:0.###} ns{(r.RiseMatched ? " (matched)" : "")}"));
        o.WriteLine(I($"verdict: {(r.Pass ? "PASS" : "FAIL")}"));
        var failing = r.Events.Where(e => e.ExceedsTolerance).ToList();
        foreach (var e in failing) o.WriteLine("  - " + Line(e, unit));
        foreach (var g in r.Regions.Where(g => !g.Explained && g.StartMeters > r.BlindZoneMeters && Math.Abs(g.PeakDifference) > r.Tolerances.Reflection))
            o.WriteLine(I($"  - unexplained difference of {Signed(g.PeakDifference, 3)} at {unit.Format(g.PeakDistanceMeters)} ({unit.Format(g.StartMeters)} to {unit.Format(g.EndMeters)})"));
        if (r.Pass) o.WriteLine(I($"  every event within ±{unit.Format(r.Tolerances.DistanceMeters)} and ±{r.Tolerances.Reflection:0.###} reflection; nothing new or gone above the tolerance"));
        o.WriteLine("events (by distance):");
        if (r.Events.Count == 0) o.WriteLine("  none found on either trace");
        foreach (var e in r.Events) o.WriteLine("  " + Line(e, unit));
        int outside = r.Regions.Count;
        o.WriteLine(outside == 0
            ? I($"difference: within the noise band (±{r.NoiseBand:0.0000} of the incident step) everywhere")
            : I($"difference: {outside} stretch(es) outside the noise band (±{r.NoiseBand:0.0000} of the step); largest {Signed(r.Regions.MaxBy(g => Math.Abs(g.PeakDifference))!.PeakDifference, 3)} at {unit.Format(r.Regions.MaxBy(g => Math.Abs(g.PeakDifference))!.PeakDistanceMeters)}"));
        o.WriteLine(I($"tolerances: reflection ±{r.Tolerances.Reflection:0.###}, distance ±{unit.Format(r.Tolerances.DistanceMeters)} (--tolerance-reflection, --tolerance-distance-m); blind zone {unit.Format(r.BlindZoneMeters)}"));
    }

    private static string Line(EventChange e, DistanceUnit unit)
    {
        var ev = (e.Current ?? e.Baseline)!;
        string kind = EventKindNames.ToJsonName(ev.Kind).Replace('_', ' ');
        return e.Kind switch
        {
            EventChangeKind.New => I($"new:       {kind} at {unit.Format(ev.DistanceMeters)}, trace differs by {Signed(e.PeakDifference, 3)} of the step there"),
            EventChangeKind.Gone => I($"gone:      {kind} at {unit.Format(ev.DistanceMeters)} (reflection {Signed(ev.Reflection, 3)}), trace differs by {Signed(e.PeakDifference, 3)} there"),
            EventChangeKind.Moved => I($"moved:     {kind} by {Signed(unit.FromMeters(e.ShiftMeters!.Value), 2)} {unit.Symbol}, {unit.Format(e.Baseline!.DistanceMeters)} → {unit.Format(e.Current!.DistanceMeters)}, reflection {Signed(e.Baseline.Reflection, 3)} → {Signed(e.Current.Reflection, 3)}"),
            EventChangeKind.Changed => I($"changed:   {kind} at {unit.Format(ev.DistanceMeters)}, reflection {Signed(e.Baseline!.Reflection, 3)} → {Signed(e.Current!.Reflection, 3)}"),
            _ => I($"unchanged: {kind} at {unit.Format(ev.DistanceMeters)}, reflection {Signed(ev.Reflection, 3)} (shift {Signed(unit.FromMeters(e.ShiftMeters!.Value), 3)} {unit.Symbol})"),
        };
    }

    private static void WriteJson(CompareResult r, string baselineName, string currentName, TextWriter o)
    {
        var s = r.Settings;
        var document = new Dictionary<string, object?>
        {
            ["baseline"] = baselineName,
            ["current"] = currentName,
            ["verdict"] = r.Pass ? "pass" : "fail",
            ["reasons"] = r.Reasons,
            ["vf"] = s.VelocityFactor,
            ["vf_source"] = s.VelocityFactorSource,
            ["z0_ohms"] = s.ImpedanceOhms,
            ["tolerances"] = new Dictionary<string, object?>
            {
                ["reflection"] = r.Tolerances.Reflection,
                ["distance_m"] = r.Tolerances.DistanceMeters,
                ["match_window_m"] = r.Tolerances.MatchWindowMeters,
                ["value_fraction"] = r.Tolerances.ValueFraction,
            },
            ["noise_band"] = r.NoiseBand,
            ["blind_zone_m"] = r.BlindZoneMeters,
            ["rise_baseline_s"] = r.BaselineRiseTimeSeconds,
            ["rise_current_s"] = r.CurrentRiseTimeSeconds,
            ["rise_matched"] = r.RiseMatched,
            ["events"] = r.Events.Select(e => new Dictionary<string, object?>
            {
                ["change"] = EventChangeKindNames.ToJsonName(e.Kind),
                ["exceeds_tolerance"] = e.ExceedsTolerance,
                ["distance_m"] = e.DistanceMeters,
                ["shift_m"] = e.ShiftMeters,
                ["reflection_change"] = e.ReflectionChange,
                ["peak_difference"] = e.PeakDifference,
                ["baseline"] = Event(e.Baseline),
                ["current"] = Event(e.Current),
                ["description"] = e.Description,
            }),
            ["differences"] = r.Regions.Select(g => new Dictionary<string, object?>
            {
                ["start_m"] = g.StartMeters,
                ["end_m"] = g.EndMeters,
                ["peak_distance_m"] = g.PeakDistanceMeters,
                ["peak_difference"] = g.PeakDifference,
                ["explained"] = g.Explained,
            }),
            ["warnings"] = r.Warnings,
        };
        o.WriteLine(JsonSerializer.Serialize(document, new JsonSerializerOptions { WriteIndented = true }));
    }

    private static Dictionary<string, object?>? Event(LocatedEvent? e) => e is null ? null : new()
    {
        ["distance_m"] = e.DistanceMeters,
        ["distance_sigma_m"] = e.DistanceSigmaMeters,
        ["kind"] = EventKindNames.ToJsonName(e.Kind),
        ["reflection"] = e.Reflection,
        ["impedance_ohms"] = e.ImpedanceOhms,
        ["value"] = e.Value,
        ["confidence"] = e.Confidence,
    };

    private static string Signed(double value, int decimals)
    {
        double r = Math.Round(value, decimals);
        return (r > 0 ? "+" : "") + r.ToString("F" + decimals, CultureInfo.InvariantCulture);
    }

    private static string I(FormattableString text) => text.ToString(CultureInfo.InvariantCulture);
}
