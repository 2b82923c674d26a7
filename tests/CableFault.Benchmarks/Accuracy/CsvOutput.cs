using System.Globalization;
using CableFault.Analysis;

namespace CableFault.Benchmarks.Accuracy;

/// <summary>One CSV row per true or reported event of every case and method (a case with neither gets one "clean" row).</summary>
public static class CsvOutput
{
    private const string Header =
        "case,family,source,lossy,rise_ns,noise_mv,z0_ohms,vf,u_m,method,outcome,truth_kind,truth_m,truth_seen,truth_element,close_pair," +
        "found_kind,found_m,confidence,error_m,error_pct,error_u,kind_ok,false_class,locate_s,note,description";

    public static void Write(IReadOnlyList<CaseResult> results, TextWriter writer)
    {
        writer.WriteLine(Header);
        foreach (var r in results)
        {
            foreach (var (method, rows) in new[] { ("locate", r.Locate), ("naive", r.Naive) })
            {
                string note = method == "locate" ? r.Failure ?? r.Refusal ?? "" : "";
                if (rows.Count == 0) writer.WriteLine(Line(r, method, null, note));
                foreach (var e in rows) writer.WriteLine(Line(r, method, e, note));
            }
        }
    }

    private static string Line(CaseResult r, string method, ScoredEvent? e, string note)
    {
        var c = r.Case;
        var t = e?.Truth;
        var f = e?.Found;
        double error = e?.ErrorMeters ?? double.NaN;
        string[] fields =
        [
            N(c.Index), c.Family, c.Source.ToString().ToLowerInvariant(), c.IsLossy ? "1" : "0", N(c.RiseSeconds * 1e9),
            N(c.NoiseRmsVolts * 1e3), N(c.ImpedanceOhms), N(c.VelocityFactor), N(c.ResolutionMeters), method,
            e is null ? "clean" : e.Outcome.ToString().ToLowerInvariant(),
            t is null ? "" : EventKindNames.ToJsonName(t.Kind), t is null ? "" : N(t.DistanceMeters), t is null ? "" : N(t.SeenSize),
            t?.Element ?? "", e is { InClosePair: true } ? "1" : "0",
            f?.Kind is EventKind k ? EventKindNames.ToJsonName(k) : "", f is null ? "" : N(f.DistanceMeters),
            f is null || double.IsNaN(f.Confidence) ? "" : N(f.Confidence),
            double.IsNaN(error) ? "" : N(error), double.IsNaN(error) ? "" : N(100 * Math.Abs(error) / t!.DistanceMeters),
            double.IsNaN(error) ? "" : N(Math.Abs(error) / c.ResolutionMeters),
            e?.KindCorrect is bool ok ? (ok ? "1" : "0") : "", e?.FalseClass ?? "", N(r.LocateSeconds), note, c.Description,
        ];
        return string.Join(",", fields.Select(Quote));
    }

    private static string N(double x) => x.ToString("G6", CultureInfo.InvariantCulture);

    private static string Quote(string field) =>
        field.IndexOfAny([',', '"', '\n', '\r']) >= 0 ? "\"" + field.Replace("\"", "\"\"").Replace('\n', ' ').Replace('\r', ' ') + "\"" : field;
}
