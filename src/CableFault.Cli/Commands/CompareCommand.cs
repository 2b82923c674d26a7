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
        var baselineArg = new Argument<FileInfo>("baseline") { Description = "Trace recorded at installation (or before the damage); with --reference-kind pair, a healthy pair of the same cable." };
        var currentArg = new Argument<FileInfo>("current") { Description = "Trace recorded now (after the repair); with --reference-kind pair, the suspect pair." };
        var vf = new Option<double?>("--vf") { Description = "Velocity factor for both traces (overrides their metadata)." };
        var z0 = new Option<double?>("--z0") { Description = "Cable impedance for both traces, Ω (overrides their metadata)." };
        var cable = new Option<string?>("--cable") { Description = "Cable type (see 'cablefault cables'), for VF, Z0 and loss." };
        var cables = CommonOptions.CableFile();
        var referenceKind = CheckOptions.ReferenceKind();
        var toleranceReflection = CheckOptions.ToleranceReflection();
        var toleranceDistance = CheckOptions.ToleranceDistance();
        var toleranceDistancePct = CheckOptions.ToleranceDistancePercent();
        var toleranceLengthPct = CheckOptions.ToleranceLengthPercent();
        var toleranceZ0Pct = CheckOptions.ToleranceImpedancePercent();
        var window = new Option<double?>("--match-window-m")
        {
            Description = $"Events further apart than this are not paired (reported as gone + new), m. Default {CompareTolerances.DefaultMatchWindowMeters.ToString(CultureInfo.InvariantCulture)}.",
        };
        var matchRise = new Option<bool>("--match-rise") { Description = "Smooth the sharper trace to the slower rise time before comparing." };
        var format = new Option<string>("--format") { Description = "text (a readable summary) or json.", DefaultValueFactory = _ => "text" }
            .AcceptOnlyFromAmong("text", "json");
        var units = CommonOptions.Units();
        var png = CommonOptions.Png("both traces and their difference against distance");
        var svg = CommonOptions.Svg("both traces and their difference against distance");

        var command = new Command("compare",
            "Compare a trace against its baseline: pass when no event is new, gone, moved or changed beyond the tolerances.\n" +
            "With --reference-kind pair the reference is a healthy pair of the same cable: pair-to-pair tolerances, the\n" +
            "length difference of the pairs fitted and reported, and their impedance difference reported.\n" +
            "Exit code 0 pass, 1 fail, 2 bad input.\n\n" +
            "Examples:\n  cablefault compare traces/quillon-bay/mast-feeder.csv traces/quillon-bay/mast-feeder-repaired.csv --png repair.png\n" +
            "  cablefault compare traces/quillon-bay/sensor-cable-pair1.csv traces/quillon-bay/sensor-cable-pair3.csv --reference-kind pair")
        {
            baselineArg, currentArg, vf, z0, cable, cables, referenceKind, toleranceReflection, toleranceDistance, toleranceDistancePct,
            toleranceLengthPct, toleranceZ0Pct, window, matchRise, format, units, png, svg,
        };
        command.SetAction(parsed =>
        {
            var library = CableOptions.Library(parsed.GetValue(cables));
            var kind = ReferenceKindNames.Parse(parsed.GetValue(referenceKind)!);
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
                ReferenceKind = kind,
                Tolerances = CheckOptions.Tolerances(kind, parsed.GetValue(toleranceReflection), parsed.GetValue(toleranceDistance),
                    parsed.GetValue(window), parsed.GetValue(toleranceDistancePct), parsed.GetValue(toleranceLengthPct), parsed.GetValue(toleranceZ0Pct)),
            };
            var unit = DistanceUnit.Parse(parsed.GetValue(units));
            options = options with { WarningsInFeet = unit == DistanceUnit.Feet };
            var result = RepairCheck.Compare(baseline.Trace.WithMetadata("file", baseline.Name),
                current.Trace.WithMetadata("file", current.Name), options);
            foreach (string w in result.Warnings) context.Warn(w);

            if (parsed.GetValue(format) == "json") WriteJson(result, baseline.Name, current.Name, context.Output);
            else WriteText(result, baseline.Name, current.Name, unit, context.Output);
            PlotOutput.Write(parsed.GetValue(png), parsed.GetValue(svg),
                () => CompareFigures.Build(result, unit, kind == ReferenceKind.Pair
                    ? $"{current.Name} against reference pair {baseline.Name}"
                    : $"{current.Name} against baseline {baseline.Name}"), context);
            return result.Pass ? CliApp.Success : CliApp.CheckFailed;
        });
        return command;
    }

    private static void WriteText(CompareResult r, string baselineName, string currentName, DistanceUnit unit, TextWriter o)
    {
        var s = r.Settings;
        bool pair = r.ReferenceKind == ReferenceKind.Pair;
        o.WriteLine(pair ? I($"pair check: {currentName} against reference pair {baselineName}") : I($"repair check: {currentName} against baseline {baselineName}"));
        o.WriteLine(I($"  cable: VF {s.VelocityFactor:0.###} ({s.VelocityFactorSource}), Z0 {s.ImpedanceOhms:0.#} Ω ({s.ImpedanceSource}); rise {r.BaselineRiseTimeSeconds * 1e9:0.###} / {r.CurrentRiseTimeSeconds * 1e9:0.###} ns{(r.RiseMatched ? " (matched)" : "")}"));
        o.WriteLine(pair
            ? I($"verdict: {(r.Pass ? "PASS — matches the reference pair within the pair tolerances" : "FAIL — differs from the reference pair")}")
            : I($"verdict: {(r.Pass ? "PASS" : "FAIL")}"));
        if (pair && r.Spread is { } spread)
            o.WriteLine(I($"  pair spread: electrical length {(spread.LengthDifferenceFraction is double l ? Signed(l * 100, 2) + " %" : "not fitted (no common far end)")}, Z0 {(spread.CurrentImpedanceOhms is double z ? I($"{z:0.0} Ω ({Signed(spread.ImpedanceOffsetOhms!.Value, 1)} Ω, {Signed(spread.ImpedanceOffsetFraction!.Value * 100, 1)} %)") : "not estimated")} against the reference pair"));
        if (!r.Pass && r.FirstDifferenceMeters is double first)
            o.WriteLine(I($"  first difference at {unit.Format(first)}"));
        var failing = r.Events.Where(e => e.ExceedsTolerance).ToList();
        foreach (var e in failing) o.WriteLine("  - " + Line(e, unit));
        foreach (var g in r.Regions.Where(g => !g.Explained && g.StartMeters > r.BlindZoneMeters && Math.Abs(g.PeakDifference) > r.Tolerances.Reflection))
            o.WriteLine(pair
                ? I($"  - departs from the reference pair at {unit.Format(g.StartMeters)}: differs by up to {Signed(g.PeakDifference, 3)}, most at {unit.Format(g.PeakDistanceMeters)} (to {unit.Format(g.EndMeters)})")
                : I($"  - unexplained difference of {Signed(g.PeakDifference, 3)} at {unit.Format(g.PeakDistanceMeters)} ({unit.Format(g.StartMeters)} to {unit.Format(g.EndMeters)})"));
        foreach (string reason in r.Reasons.Where(x => x.Contains("impedance reads", StringComparison.Ordinal))) o.WriteLine("  - " + reason);
        if (r.Pass) o.WriteLine(I($"  every event within ±{DistanceTolerance(r.Tolerances, unit)} and ±{r.Tolerances.Reflection:0.###} reflection; nothing new or gone above the tolerance"));
        o.WriteLine("events (by distance):");
        if (r.Events.Count == 0) o.WriteLine("  none found on either trace");
        foreach (var e in r.Events) o.WriteLine("  " + Line(e, unit));
        int outside = r.Regions.Count;
        o.WriteLine(outside == 0
            ? I($"difference: within the noise band (±{r.NoiseBand:0.0000} of the incident step) everywhere")
            : I($"difference: {outside} stretch(es) outside the noise band (±{r.NoiseBand:0.0000} of the step); largest {Signed(r.Regions.MaxBy(g => Math.Abs(g.PeakDifference))!.PeakDifference, 3)} at {unit.Format(r.Regions.MaxBy(g => Math.Abs(g.PeakDifference))!.PeakDistanceMeters)}"));
        o.WriteLine(I($"tolerances: reflection ±{r.Tolerances.Reflection:0.###}, distance ±{DistanceTolerance(r.Tolerances, unit)} (--tolerance-reflection, --tolerance-distance-m{(r.Tolerances.DistanceFraction > 0 ? ", --tolerance-distance-pct" : "")}); blind zone {unit.Format(r.BlindZoneMeters)}"));
        if (pair)
            o.WriteLine(I($"  pair allowances: length ±{r.Tolerances.LengthFraction * 100:0.#} % (--tolerance-length-pct), Z0 ±{(r.Tolerances.ImpedanceFraction ?? 0) * 100:0.#} % (--tolerance-z0-pct)"));
    }

    private static string DistanceTolerance(CompareTolerances t, DistanceUnit unit) => t.DistanceFraction > 0
        ? I($"max({unit.Format(t.DistanceMeters)}, {t.DistanceFraction * 100:0.##} % of the distance)")
        : unit.Format(t.DistanceMeters);

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
            ["reference_kind"] = ReferenceKindNames.ToName(r.ReferenceKind),
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
                ["distance_pct"] = r.Tolerances.DistanceFraction * 100,
                ["length_pct"] = r.Tolerances.LengthFraction * 100,
                ["z0_pct"] = r.Tolerances.ImpedanceFraction * 100,
            },
            ["pair"] = r.ReferenceKind != ReferenceKind.Pair || r.Spread is not { } spread ? null : new Dictionary<string, object?>
            {
                ["length_fitted"] = spread.LengthFitted,
                ["length_difference_pct"] = spread.LengthDifferenceFraction * 100,
                ["length_fit_distance_m"] = spread.LengthFitDistanceMeters,
                ["z0_reference_ohms"] = spread.ReferenceImpedanceOhms,
                ["z0_estimate_ohms"] = spread.CurrentImpedanceOhms,
                ["z0_offset_ohms"] = spread.ImpedanceOffsetOhms,
                ["z0_offset_pct"] = spread.ImpedanceOffsetFraction * 100,
            },
            ["first_difference_m"] = r.FirstDifferenceMeters,
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
