using System.Globalization;
using System.Text;
using System.Text.Json;
using System.Text.Json.Nodes;
using CableFault.Analysis;
using CableFault.Reporting;
using CableFault.Workflows;

namespace CableFault.Cli.Commands;

/// <summary>
/// <c>cablefault locate --from-both-ends TRACE_A TRACE_B --length L</c>: the faults of one run from traces taken at its
/// two ends, placed by x = L·t_A/(t_A + t_B), free of the velocity factor, with the VF the pair implies.
/// </summary>
public static class BothEndsLocate
{
    /// <summary>Text: the pair's VF, then one line per event with its distance from A and from B.</summary>
    public static string Text(BothEndsResult result, string nameA, string nameB, double singleEndedVf, DistanceUnit unit)
    {
        var text = new StringBuilder();
        text.AppendLine($"Run measured from both ends: A = {nameA}, B = {nameB}, length {unit.Format(result.LengthMeters, 3)}");
        text.AppendLine(string.Create(CultureInfo.InvariantCulture,
            $"End-to-end round trip {result.EndToEndRoundTripSeconds * 1e9:0.###} ns; the pair implies VF {result.ImpliedVelocityFactor:0.0000} ± {result.ImpliedVelocityFactorSigma:0.0000} (1 σ; {singleEndedVf:0.###} was stated)"));
        if (result.Events.Count == 0) text.AppendLine("No faults between the ends.");
        foreach (var e in result.Events)
        {
            string kind = EventKindNames.ToJsonName((e.FromA ?? e.FromB)!.Kind);
            string seen = e.SeenFrom switch { SeenFrom.BothEnds => "both ends", SeenFrom.EndAOnly => "A ONLY", _ => "B ONLY" };
            text.AppendLine(string.Create(CultureInfo.InvariantCulture,
                $"  {kind,-16} {unit.Format(e.DistanceFromAMeters, 3)} ± {unit.Format(e.DistanceSigmaMeters, 3)} from A, {unit.Format(result.LengthMeters - e.DistanceFromAMeters, 3)} from B   seen from {seen}"));
        }
        foreach (string warning in result.Warnings) text.AppendLine("warning: " + warning);
        return text.ToString();
    }

    /// <summary>JSON object (its own shape; the single-trace contract of DESIGN.md §4 is unchanged).</summary>
    public static string Json(BothEndsResult result, string nameA, string nameB, DistanceUnit unit)
    {
        var events = new JsonArray();
        foreach (var e in result.Events)
        {
            events.Add(new JsonObject
            {
                ["distance_m"] = Math.Round(e.DistanceFromAMeters, 4),
                ["distance_sigma_m"] = Math.Round(e.DistanceSigmaMeters, 4),
                ["distance_from_b_m"] = Math.Round(result.LengthMeters - e.DistanceFromAMeters, 4),
                ["seen_from"] = e.SeenFrom switch { SeenFrom.BothEnds => "both", SeenFrom.EndAOnly => "a_only", _ => "b_only" },
                ["kind_from_a"] = e.FromA is { } a ? EventKindNames.ToJsonName(a.Kind) : null,
                ["kind_from_b"] = e.FromB is { } b ? EventKindNames.ToJsonName(b.Kind) : null,
                ["round_trip_a_s"] = e.FromA?.RoundTripSeconds,
                ["round_trip_b_s"] = e.FromB?.RoundTripSeconds,
            });
        }
        var root = new JsonObject
        {
            ["trace_a"] = nameA,
            ["trace_b"] = nameB,
            ["length_m"] = result.LengthMeters,
            ["units"] = unit.Symbol,
            ["end_to_end_round_trip_s"] = result.EndToEndRoundTripSeconds,
            ["end_to_end_round_trip_sigma_s"] = result.EndToEndRoundTripSigmaSeconds,
            ["implied_vf"] = result.ImpliedVelocityFactor,
            ["implied_vf_sigma"] = result.ImpliedVelocityFactorSigma,
            ["events"] = events,
            ["warnings"] = new JsonArray(result.Warnings.Select(w => (JsonNode?)JsonValue.Create(w)).ToArray()),
        };
        return root.ToJsonString(new JsonSerializerOptions { WriteIndented = true, Encoder = System.Text.Encodings.Web.JavaScriptEncoder.UnsafeRelaxedJsonEscaping });
    }
}
