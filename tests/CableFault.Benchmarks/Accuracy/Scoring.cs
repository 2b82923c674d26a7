using CableFault.Analysis;

namespace CableFault.Benchmarks.Accuracy;

/// <summary>One event a method reported: where, and (for <c>locate</c>) what kind, with its confidence.</summary>
public sealed record FoundEvent(double DistanceMeters, EventKind? Kind, double Confidence);

/// <summary>How one true or reported event came out.</summary>
public enum Outcome
{
    /// <summary>A true event with a reported event matched to it.</summary>
    Matched,
    /// <summary>A true event nothing was matched to.</summary>
    Missed,
    /// <summary>A reported event matched to no true event.</summary>
    False,
    /// <summary>A reported open at the end of a tap's branch: a real end, off the main line, so neither a main-line
    /// match nor a false event.</summary>
    BranchEnd,
}

/// <summary>One row of the score: a matched pair, a missed true event or a false report.</summary>
/// <param name="Outcome">Matched, missed or false.</param>
/// <param name="Truth">The true event (null for a false one).</param>
/// <param name="Found">The reported event (null for a missed one).</param>
/// <param name="FalseClass">For a false event: "split" (within tolerance of a true event already matched: one event
/// reported twice), "echo" (at a re-reflection or a tap branch's end), "beyond-end" (past the last true event),
/// "nothing-there" (on a run with no event), else "extra".</param>
/// <param name="InClosePair">The true event has a neighbour closer than <see cref="RunGenerator.ClearGapUnits"/>·u.</param>
public sealed record ScoredEvent(Outcome Outcome, TruthEvent? Truth, FoundEvent? Found, string FalseClass, bool InClosePair)
{
    /// <summary>Signed distance error found − true, m (NaN unless matched).</summary>
    public double ErrorMeters => Outcome == Outcome.Matched ? Found!.DistanceMeters - Truth!.DistanceMeters : double.NaN;

    /// <summary>True when the kind is right (matched events of <c>locate</c> only).</summary>
    public bool? KindCorrect => Outcome == Outcome.Matched && Found!.Kind is EventKind k ? Truth!.IsRightKind(k) : null;
}

/// <summary>Matches reported events to the truth one-to-one by distance, nearest pairs first, within a tolerance of
/// <see cref="ToleranceUnits"/>·u (u = v·t_rise/2).</summary>
public static class Scoring
{
    /// <summary>Match tolerance in u: an event placed more than 3 resolution units away is not the same event (a careful
    /// reader of a trace would not confuse them), while close pairs (1–3 u) still compete for their own match.</summary>
    public const double ToleranceUnits = 3;

    public static List<ScoredEvent> Score(AccuracyCase c, IReadOnlyList<FoundEvent> found)
    {
        double tolerance = ToleranceUnits * c.ResolutionMeters;
        var pairs = new List<(int T, int F, double Error)>();
        for (int t = 0; t < c.Truth.Count; t++)
            for (int f = 0; f < found.Count; f++)
            {
                double error = Math.Abs(found[f].DistanceMeters - c.Truth[t].DistanceMeters);
                if (error <= tolerance) pairs.Add((t, f, error));
            }
        var truthMatch = new int[c.Truth.Count];
        var foundMatch = new int[found.Count];
        Array.Fill(truthMatch, -1);
        Array.Fill(foundMatch, -1);
        foreach (var (t, f, _) in pairs.OrderBy(p => p.Error))
        {
            if (truthMatch[t] >= 0 || foundMatch[f] >= 0) continue;
            truthMatch[t] = f;
            foundMatch[f] = t;
        }

        var rows = new List<ScoredEvent>();
        for (int t = 0; t < c.Truth.Count; t++)
        {
            bool close = c.Truth.Where((_, k) => k != t)
                .Any(o => Math.Abs(o.DistanceMeters - c.Truth[t].DistanceMeters) < RunGenerator.ClearGapUnits * c.ResolutionMeters);
            rows.Add(truthMatch[t] >= 0
                ? new ScoredEvent(Outcome.Matched, c.Truth[t], found[truthMatch[t]], "", close)
                : new ScoredEvent(Outcome.Missed, c.Truth[t], null, "", close));
        }
        double last = c.Truth.Count > 0 ? c.Truth.Max(e => e.DistanceMeters) : 0;
        for (int f = 0; f < found.Count; f++)
        {
            if (foundMatch[f] >= 0) continue;
            double d = found[f].DistanceMeters;
            if (found[f].Kind == EventKind.Open && (c.BranchEndDistancesMeters ?? []).Any(b => Math.Abs(b - d) <= tolerance))
            {
                rows.Add(new ScoredEvent(Outcome.BranchEnd, null, found[f], "", false));
                continue;
            }
            string cls = c.Truth.Count == 0 ? "nothing-there"
                : c.Truth.Any(e => Math.Abs(e.DistanceMeters - d) <= tolerance) ? "split"
                : c.EchoDistancesMeters.Any(e => Math.Abs(e - d) <= tolerance) ? "echo"
                : d > last + tolerance ? "beyond-end"
                : "extra";
            rows.Add(new ScoredEvent(Outcome.False, null, found[f], cls, false));
        }
        return rows;
    }
}
