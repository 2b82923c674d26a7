using System.Globalization;
using System.Text;
using CableFault.Analysis;
using CableFault.Reporting;
using CableFault.Reporting.Locate;

namespace CableFault.Cli.Infrastructure;

/// <summary>
/// The table that ends a batch: one row per input with the run's title, the number of events, the worst event and its
/// distance; skipped inputs say so.
/// </summary>
public static class BatchSummary
{
    private const int MaxColumnChars = 36;

    /// <summary>One row: a located trace (Result set) or a skipped input (Result null).</summary>
    public sealed record Row(string Path, string? Run, LocateResult? Result);

    /// <summary>
    /// The worst event: the most severe kind by <see cref="EventWording.Severity"/> (shorts, then opens, then lossy and
    /// capacitive faults, then rises, inductive spots and taps, then unknown, then terminations), among those the
    /// largest |ρ|, then the nearest; null when there are no events. An open or a short can be the ordinary far end of
    /// the run: compare its distance with the run's length.
    /// </summary>
    public static LocatedEvent? WorstEvent(IReadOnlyList<LocatedEvent> events) =>
        events.OrderBy(EventWording.Severity).ThenByDescending(e => Math.Abs(e.Reflection)).ThenBy(e => e.DistanceMeters).FirstOrDefault();

    /// <summary>Renders the table.</summary>
    public static string Render(IReadOnlyList<Row> rows, DistanceUnit unit)
    {
        var inv = CultureInfo.InvariantCulture;
        var table = new List<string[]> { new[] { "file", "run", "events", "worst event", $"distance ({unit.Symbol})" } };
        foreach (var row in rows)
        {
            if (row.Result is null)
            {
                table.Add([Fit(row.Path), "", "", "skipped (bad input)", ""]);
                continue;
            }
            var worst = WorstEvent(row.Result.Events);
            string kind = worst is null ? "none" : string.Create(inv, $"{EventWording.KindWords(worst.Kind)} (ρ {worst.Reflection:+0.000;-0.000;0.000})");
            string distance = worst is null ? "" : string.Create(inv, $"{unit.FromMeters(worst.DistanceMeters):F2} ± {unit.FromMeters(worst.DistanceSigmaMeters):F2}");
            table.Add([Fit(row.Path), Fit(row.Run ?? ""), row.Result.Events.Count.ToString(inv), kind, distance]);
        }
        int located = rows.Count(r => r.Result is not null);
        var text = new StringBuilder();
        text.AppendLine($"Summary: {rows.Count} input{(rows.Count == 1 ? "" : "s")}, {located} located, {rows.Count - located} skipped");
        int[] widths = Enumerable.Range(0, 5).Select(c => table.Max(r => r[c].Length)).ToArray();
        foreach (var r in table)
        {
            string line = $"  {r[0].PadRight(widths[0])}  {r[1].PadRight(widths[1])}  {r[2].PadLeft(widths[2])}  {r[3].PadRight(widths[3])}  {r[4]}";
            text.AppendLine(line.TrimEnd());
        }
        return text.ToString();
    }

    private static string Fit(string text) => text.Length <= MaxColumnChars ? text : "…" + text[^(MaxColumnChars - 1)..];
}
