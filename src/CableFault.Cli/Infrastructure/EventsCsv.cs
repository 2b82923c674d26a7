using System.Globalization;
using CableFault.Analysis;
using CableFault.Reporting;

namespace CableFault.Cli.Infrastructure;

/// <summary>
/// The event tables of one or more located traces as one CSV (one row per event, SI units in the column names, the
/// same quantities as the JSON of DESIGN.md §4), with every cell made spreadsheet-safe by <see cref="SpreadsheetCsv"/>.
/// </summary>
public static class EventsCsv
{
    /// <summary>One located trace: the path as given, the file name, the run title, the result and, when known, how
    /// its distances were worked out (<see cref="Reporting.Locate.DistanceMethod"/>).</summary>
    public sealed record Entry(string Path, string TraceName, string? Run, LocateResult Result, string? Method = null);

    /// <summary>Writes the header and one row per event (a trace with no events gets no rows).</summary>
    public static void Write(IEnumerable<Entry> entries, DistanceUnit unit, TextWriter writer)
    {
        bool feet = unit == DistanceUnit.Feet;
        var header = new List<string>
        {
            "path", "trace", "run", "event", "distance_m", "distance_sigma_m", "kind", "reflection", "impedance_ohms",
            "value", "confidence", "round_trip_s", "vf", "vf_source", "z0_ohms",
        };
        if (feet) header.AddRange(["distance_ft", "distance_sigma_ft"]);
        writer.Write(SpreadsheetCsv.Line(header));
        writer.Write("\r\n");
        foreach (var entry in entries)
        {
            var o = entry.Result.Options;
            int index = 1;
            foreach (var e in entry.Result.Events)
            {
                var cells = new List<string?>
                {
                    entry.Path, entry.TraceName, entry.Run, Number(index++), Number(e.DistanceMeters), Number(e.DistanceSigmaMeters),
                    EventKindNames.ToJsonName(e.Kind), Number(e.Reflection), Number(e.ImpedanceOhms), Number(e.Value),
                    Number(e.Confidence), Number(e.RoundTripSeconds), Number(o.VelocityFactor), o.VelocityFactorSource, Number(o.ImpedanceOhms),
                };
                if (feet) cells.AddRange([Number(unit.FromMeters(e.DistanceMeters)), Number(unit.FromMeters(e.DistanceSigmaMeters))]);
                writer.Write(SpreadsheetCsv.Line(cells));
                // CRLF: the line end RFC 4180 names, which every spreadsheet reads.
                writer.Write("\r\n");
            }
        }
    }

    /// <summary>Invariant shortest round-trip form; empty for null or non-finite values.</summary>
    private static string? Number(double? value) =>
        value is double v && double.IsFinite(v) ? v.ToString("R", CultureInfo.InvariantCulture) : null;
}
