using System.Globalization;
using System.Text;
using CableFault.Analysis;

namespace CableFault.Benchmarks.Accuracy;

/// <summary>The readable summary table.</summary>
public static class Summary
{
    private const double TargetP95Percent = 0.5, TargetKindAccuracy = 0.95, TargetResolvedFraction = 0.90, TargetSpeedSeconds = 0.5;

    /// <summary>The issue's median target for one event: max(0.1 % of the distance, 2 cm), m.</summary>
    public static double MedianTargetMeters(double distanceMeters) => Math.Max(0.001 * distanceMeters, 0.02);

    public static string Render(IReadOnlyList<CaseResult> results, (IReadOnlyList<LocateSpeed.TraceSpeed> Traces, double AllProcessSeconds, double? AllNativeSeconds)? speed, string commit)
    {
        var s = new StringBuilder();
        var main = results.Where(r => r.Case.Family == "random").ToList();
        s.AppendLine();
        s.AppendLine($"== locate accuracy, {main.Count} random runs ({main.Count(r => r.Case.Source == TraceSource.Ngspice)} ngspice), source at {commit} ==");
        s.AppendLine("u = v·t_rise/2. Errors are |found − true| of matched events (match within " +
            F($"{Scoring.ToleranceUnits} u). 'vs target' = median of |error| / max(0.1 % of d, 2 cm) (≤ 1 meets the median target)."));
        s.AppendLine(Header());
        Row(s, "locate  all", main, r => r.Locate, _ => true);
        Row(s, "locate  model", main.Where(r => r.Case.Source == TraceSource.Model), r => r.Locate, _ => true);
        Row(s, "locate  ngspice", main.Where(r => r.Case.Source == TraceSource.Ngspice), r => r.Locate, _ => true);
        Row(s, "locate  lossless", main.Where(r => !r.Case.IsLossy), r => r.Locate, _ => true);
        Row(s, "locate  lossy", main.Where(r => r.Case.IsLossy), r => r.Locate, _ => true);
        Row(s, "locate  rise < 0.6 ns", main.Where(r => r.Case.RiseSeconds < 0.6e-9), r => r.Locate, _ => true);
        Row(s, "locate  rise ≥ 0.6 ns", main.Where(r => r.Case.RiseSeconds >= 0.6e-9), r => r.Locate, _ => true);
        Row(s, "locate  close-pair evts", main, r => r.Locate, e => e.InClosePair, countFalse: false);
        Row(s, "locate  not timed out", main.Where(r => !r.IsTimedOut), r => r.Locate, _ => true);
        Row(s, "naive   all", main, r => r.Naive, _ => true);
        Row(s, "naive   model", main.Where(r => r.Case.Source == TraceSource.Model), r => r.Naive, _ => true);
        Row(s, "naive   ngspice", main.Where(r => r.Case.Source == TraceSource.Ngspice), r => r.Naive, _ => true);

        s.AppendLine();
        s.AppendLine("-- by true kind (locate) --");
        s.AppendLine(Header());
        foreach (var kind in Enum.GetValues<EventKind>())
            if (main.Any(r => r.Locate.Any(e => e.Truth?.Kind == kind)))
                Row(s, "  " + EventKindNames.ToJsonName(kind), main, r => r.Locate, e => e.Truth?.Kind == kind, countFalse: false);

        var locateErrors = Errors(main, r => r.Locate, _ => true);
        var naiveErrors = Errors(main, r => r.Naive, _ => true);
        // Ratio on the events both methods matched, so that a method is not flattered by missing the hard ones.
        var both = main.SelectMany(r => r.Locate.Zip(r.Naive.Take(r.Locate.Count))
            .Where(p => p.First.Outcome == Outcome.Matched && p.Second.Outcome == Outcome.Matched && p.First.Truth == p.Second.Truth)
            .Select(p => (L: Math.Abs(p.First.ErrorMeters), N: Math.Abs(p.Second.ErrorMeters)))).ToList();
        s.AppendLine();
        s.AppendLine("-- naive / locate --");
        s.AppendLine(F($"all matched:        median error ratio {Ratio(Percentile(naiveErrors.Select(e => e.Meters), 0.5), Percentile(locateErrors.Select(e => e.Meters), 0.5))}, 95th percentile ratio {Ratio(Percentile(naiveErrors.Select(e => e.Meters), 0.95), Percentile(locateErrors.Select(e => e.Meters), 0.95))}"));
        s.AppendLine(F($"matched by both ({both.Count}): median error ratio {Ratio(Percentile(both.Select(b => b.N), 0.5), Percentile(both.Select(b => b.L), 0.5))}, 95th percentile ratio {Ratio(Percentile(both.Select(b => b.N), 0.95), Percentile(both.Select(b => b.L), 0.95))}"));

        s.AppendLine();
        s.AppendLine("-- locate failure patterns --");
        var wrongKinds = main.SelectMany(r => r.Locate).Where(e => e.KindCorrect == false)
            .GroupBy(e => $"{Name(e.Truth!.Kind)} → {Name(e.Found!.Kind!.Value)}").OrderByDescending(g => g.Count());
        s.AppendLine("wrong kind (true → reported): " + Join(wrongKinds.Select(g => $"{g.Key} ×{g.Count()}")));
        var missed = main.SelectMany(r => r.Locate).Where(e => e.Outcome == Outcome.Missed).ToList();
        s.AppendLine("missed by kind: " + Join(missed.GroupBy(e => Name(e.Truth!.Kind)).OrderByDescending(g => g.Count()).Select(g => $"{g.Key} ×{g.Count()}")) +
            F($"; of them in a close pair: {missed.Count(e => e.InClosePair)}"));
        var falses = main.SelectMany(r => r.Locate).Where(e => e.Outcome == Outcome.False).ToList();
        s.AppendLine(F($"tap branch ends reported as opens (real ends off the main line; neither matched nor false): {main.Sum(r => r.Locate.Count(e => e.Outcome == Outcome.BranchEnd))} of {main.Sum(r => r.Case.BranchEndDistancesMeters?.Count ?? 0)} branches"));
        s.AppendLine("false by class: " + Join(falses.GroupBy(e => e.FalseClass).OrderByDescending(g => g.Count()).Select(g => $"{g.Key} ×{g.Count()}")));
        s.AppendLine("false by reported kind: " + Join(falses.GroupBy(e => Name(e.Found!.Kind ?? EventKind.Unknown)).OrderByDescending(g => g.Count()).Select(g => $"{g.Key} ×{g.Count()}")));
        s.AppendLine(F($"false events' confidence: median {Percentile(falses.Select(e => e.Found!.Confidence), 0.5):0.00}, matched events' median {Percentile(main.SelectMany(r => r.Locate).Where(e => e.Outcome == Outcome.Matched).Select(e => e.Found!.Confidence), 0.5):0.00}"));
        foreach (var r in main.Where(r => r.Refusal is not null || (r.Failure is not null && !r.IsTimedOut)).Take(10))
            s.AppendLine(F($"case {r.Case.Index} ({r.Case.Source}) {(r.Failure is null ? "refused" : "FAILED")}: {r.Failure ?? r.Refusal}"));
        s.AppendLine(F($"refused {main.Count(r => r.Refusal is not null)}, failed {main.Count(r => r.Failure is not null && !r.IsTimedOut)}, timed out {main.Count(r => r.IsTimedOut)} (holding {main.Where(r => r.IsTimedOut).Sum(r => r.Case.Truth.Count)} true events, all counted missed) of {main.Count} runs"));
        var slow = main.Where(r => r.IsTimedOut).ToList();
        if (slow.Count > 0)
            s.AppendLine(F($"timed-out runs: {slow.Count(r => r.Case.Source == TraceSource.Ngspice)} ngspice, {slow.Count(r => r.Case.IsLossy)} lossy; true events per run {Join(slow.GroupBy(r => r.Case.Truth.Count).OrderBy(g => g.Key).Select(g => F($"{g.Key}: ×{g.Count()}")))}; all runs: {Join(main.GroupBy(r => r.Case.Truth.Count).OrderBy(g => g.Key).Select(g => F($"{g.Key}: ×{g.Count()}")))}"));

        // Close pairs: resolved when one reported event lies in [d1 − u, mid) and another in [mid, d2 + u].
        var pairs = results.Where(r => r.Case.Family == "close-pair").ToList();
        int resolved = pairs.Count(r =>
        {
            double u = r.Case.ResolutionMeters, d1 = r.Case.Truth[0].DistanceMeters, d2 = r.Case.Truth[1].DistanceMeters, mid = (d1 + d2) / 2;
            var found = r.Locate.Where(e => e.Found is not null).Select(e => e.Found!.DistanceMeters).ToList();
            return found.Any(d => d >= d1 - u && d < mid) && found.Any(d => d >= mid && d <= d2 + u);
        });
        int seenOne = pairs.Count(r => r.Locate.Any(e => e.Found is not null && Math.Abs(e.Found.DistanceMeters - r.Case.Truth[0].DistanceMeters) <= 2 * r.Case.ResolutionMeters));
        s.AppendLine();
        s.AppendLine("-- targets (VF known) --");
        double medianVsTarget = Percentile(locateErrors.Select(e => e.Meters / MedianTargetMeters(e.Distance)), 0.5);
        double p95 = Percentile(locateErrors.Select(e => 100 * e.Meters / e.Distance), 0.95);
        var matchedKinds = main.SelectMany(r => r.Locate).Where(e => e.KindCorrect is not null).ToList();
        double kindAccuracy = matchedKinds.Count == 0 ? double.NaN : (double)matchedKinds.Count(e => e.KindCorrect == true) / matchedKinds.Count;
        s.AppendLine(Target(F($"median distance error ≤ max(0.1 % of d, 2 cm): median |error|/target = {medianVsTarget:0.###}"), medianVsTarget <= 1));
        s.AppendLine(Target(F($"95th percentile ≤ {TargetP95Percent} % of distance: {p95:0.###} %"), p95 <= TargetP95Percent));
        int byEquivalence = matchedKinds.Count(e => e.KindCorrect == true && e.Found!.Kind != e.Truth!.Kind);
        s.AppendLine(Target(F($"kind accuracy ≥ {TargetKindAccuracy:P0}: {kindAccuracy:P1} of {matchedKinds.Count} matched events ({byEquivalence} by an indistinguishable equivalent: a resistor or step before a matched end named as a termination; {(matchedKinds.Count == 0 ? double.NaN : (double)(matchedKinds.Count(e => e.KindCorrect == true) - byEquivalence) / matchedKinds.Count):P1} without them)"), kindAccuracy >= TargetKindAccuracy));
        foreach (var family in new[] { "noise-only", "matched-line" })
        {
            var set = results.Where(r => r.Case.Family == family).ToList();
            int count = set.Sum(r => r.Locate.Count(e => e.Outcome == Outcome.False));
            int refused = set.Count(r => r.Refusal is not null), failed = set.Count(r => r.Failure is not null);
            string kinds = Join(set.SelectMany(r => r.Locate).Where(e => e.Outcome == Outcome.False)
                .GroupBy(e => Name(e.Found!.Kind ?? EventKind.Unknown)).Select(g => $"{g.Key} ×{g.Count()}"));
            s.AppendLine(Target(F($"no false events on {family} traces: {count} false in {set.Count(r => r.Locate.Any(e => e.Outcome == Outcome.False))} of {set.Count} traces ({kinds}); refused {refused}, failed {failed}; naive: {set.Sum(r => r.Naive.Count(e => e.Outcome == Outcome.False))} false"), count == 0 && failed == 0));
        }
        // Not a target of the issue: how often the end of a lossy run into its own impedance is found (see
        // RunGenerator.MatchedEnd), and what else is listed there.
        var ends = results.Where(r => r.Case.Family == "matched-end").ToList();
        if (ends.Count > 0)
        {
            var endEvents = ends.SelectMany(r => r.Locate).ToList();
            int named = endEvents.Count(e => e.KindCorrect == true);
            var errors = endEvents.Where(e => e.KindCorrect == true).Select(e => Math.Abs(e.ErrorMeters) / e.Truth!.DistanceMeters * 100).ToList();
            s.AppendLine(F($"lossy runs into a matched resistor (not a target): end found as a termination in {named} of {ends.Count} (within {Scoring.ToleranceUnits} u; median error {Percentile(errors, 0.5):0.###} % of distance), missed {endEvents.Count(e => e.Outcome == Outcome.Missed)}, false {endEvents.Count(e => e.Outcome == Outcome.False)}; refused {ends.Count(r => r.Refusal is not null)}, failed {ends.Count(r => r.Failure is not null)}"));
        }
        double resolvedFraction = pairs.Count == 0 ? double.NaN : (double)resolved / pairs.Count;
        s.AppendLine(Target(F($"two equal reflections 0.5 u apart at 40 dB SNR resolved ≥ {TargetResolvedFraction:P0}: {resolved}/{pairs.Count} ({resolvedFraction:P0}); at least one found within 2 u: {seenOne}/{pairs.Count}"), resolvedFraction >= TargetResolvedFraction));
        if (speed is { } sp)
        {
            var stated = sp.Traces[0];
            s.AppendLine(Target(F($"`cablefault locate` on a {LocateSpeed.SampleCount}-sample trace, whole process (JIT dll), median of {LocateSpeed.Repeats}: {stated.ProcessSeconds:0.###} s (≤ {TargetSpeedSeconds} s; ratio {stated.ProcessSeconds / TargetSpeedSeconds:0.##}); in process {stated.InProcessSeconds:0.###} s; {stated.Events} event(s)"), stated.ProcessSeconds <= TargetSpeedSeconds));
            foreach (var t in sp.Traces)
                s.AppendLine(F($"    {t.Name}: process median {t.ProcessSeconds:0.###} s{(t.NativeSeconds is double n ? F($" (native {n:0.###} s)") : "")}, in process {t.InProcessSeconds:0.###} s, {t.Events} event(s)"));
            s.AppendLine(F($"    median over all {sp.Traces.Count} traces' process runs: {sp.AllProcessSeconds:0.###} s (ratio {sp.AllProcessSeconds / TargetSpeedSeconds:0.##} of the target)"));
            if (sp.AllNativeSeconds is double native)
                s.AppendLine(Target(F($"native build, stated trace: {sp.Traces[0].NativeSeconds:0.###} s (ratio {sp.Traces[0].NativeSeconds / TargetSpeedSeconds:0.##}); median over all {sp.Traces.Count} traces: {native:0.###} s (ratio {native / TargetSpeedSeconds:0.##})"),
                    sp.Traces[0].NativeSeconds <= TargetSpeedSeconds));
        }
        var times = main.Select(r => r.LocateSeconds).ToList();
        s.AppendLine(F($"(in-process Locate time over the random runs: median {Percentile(times, 0.5):0.###} s, 95th percentile {Percentile(times, 0.95):0.###} s, longest {times.DefaultIfEmpty(0).Max():0.###} s)"));
        return s.ToString();
    }

    private static string Header() =>
        string.Format(CultureInfo.InvariantCulture, "{0,-24} {1,6} {2,7} {3,6} {4,6} {5,7} {6,9} {7,8} {8,8} {9,7} {10,9}",
            "", "true", "matched", "missed", "false", "kind ok", "median %", "p95 %", "median u", "p95 u", "vs target");

    private static void Row(StringBuilder s, string label, IEnumerable<CaseResult> results, Func<CaseResult, List<ScoredEvent>> pick,
        Func<ScoredEvent, bool> filter, bool countFalse = true)
    {
        var rows = results.SelectMany(r => pick(r).Select(e => (Event: e, Case: r.Case))).ToList();
        var truths = rows.Where(x => x.Event.Truth is not null && filter(x.Event)).ToList();
        int matched = truths.Count(x => x.Event.Outcome == Outcome.Matched);
        int missed = truths.Count - matched;
        string falseCount = countFalse ? rows.Count(x => x.Event.Outcome == Outcome.False).ToString(CultureInfo.InvariantCulture) : "";
        var kinds = truths.Where(x => x.Event.KindCorrect is not null).ToList();
        string kindOk = kinds.Count == 0 ? "n/a" : F($"{100.0 * kinds.Count(x => x.Event.KindCorrect == true) / kinds.Count:0.0}%");
        var errors = truths.Where(x => x.Event.Outcome == Outcome.Matched)
            .Select(x => (Meters: Math.Abs(x.Event.ErrorMeters), Distance: x.Event.Truth!.DistanceMeters, U: x.Case.ResolutionMeters)).ToList();
        var percent = errors.Select(e => 100 * e.Meters / e.Distance).ToList();
        var units = errors.Select(e => e.Meters / e.U).ToList();
        var vsTarget = errors.Select(e => e.Meters / MedianTargetMeters(e.Distance)).ToList();
        s.AppendLine(string.Format(CultureInfo.InvariantCulture, "{0,-24} {1,6} {2,7} {3,6} {4,6} {5,7} {6,9:0.0000} {7,8:0.000} {8,8:0.000} {9,7:0.00} {10,9:0.000}",
            label, truths.Count, matched, missed, falseCount, kindOk, Percentile(percent, 0.5), Percentile(percent, 0.95),
            Percentile(units, 0.5), Percentile(units, 0.95), Percentile(vsTarget, 0.5)));
    }

    private static List<(double Meters, double Distance)> Errors(IEnumerable<CaseResult> results, Func<CaseResult, List<ScoredEvent>> pick,
        Func<ScoredEvent, bool> filter) =>
        results.SelectMany(pick).Where(e => e.Outcome == Outcome.Matched && filter(e))
            .Select(e => (Math.Abs(e.ErrorMeters), e.Truth!.DistanceMeters)).ToList();

    /// <summary>Nearest-rank percentile (q in 0…1); NaN for no values.</summary>
    public static double Percentile(IEnumerable<double> values, double q)
    {
        var sorted = values.Where(double.IsFinite).OrderBy(x => x).ToArray();
        if (sorted.Length == 0) return double.NaN;
        int rank = (int)Math.Ceiling(q * sorted.Length);
        return sorted[Math.Clamp(rank - 1, 0, sorted.Length - 1)];
    }

    private static string Ratio(double a, double b) => b > 0 ? F($"{a / b:0.0}×") : "n/a";

    private static string Target(string text, bool met) => (met ? "[met]    " : "[NOT met] ") + text;

    private static string Name(EventKind kind) => EventKindNames.ToJsonName(kind);

    private static string Join(IEnumerable<string> parts)
    {
        string text = string.Join(", ", parts);
        return text.Length == 0 ? "none" : text;
    }

    private static string F(FormattableString s) => s.ToString(CultureInfo.InvariantCulture);
}
