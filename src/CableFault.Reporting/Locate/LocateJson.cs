using System.Text.Json;
using System.Text.Json.Nodes;
using CableFault.Analysis;

namespace CableFault.Reporting.Locate;

/// <summary>
/// The JSON object of DESIGN.md §4 (keys and meanings are a contract: add, never rename). Distances are always metres
/// in the *_m keys; with feet asked for, *_ft twins are added.
/// </summary>
public static class LocateJson
{
    /// <summary>The result as a JSON node.</summary>
    public static JsonObject ToNode(LocateResult result, string traceName, DistanceUnit unit)
    {
        var c = result.Characteristics;
        var o = result.Options;
        var events = new JsonArray();
        foreach (var e in result.Events)
        {
            var node = new JsonObject
            {
                ["distance_m"] = Round(e.DistanceMeters, 4),
                ["distance_sigma_m"] = Round(e.DistanceSigmaMeters, 4),
                ["kind"] = EventKindNames.ToJsonName(e.Kind),
                ["reflection"] = Round(e.Reflection, 5),
                ["impedance_ohms"] = e.ImpedanceOhms is double z ? Round(z, 3) : null,
                ["value"] = e.Value is double v ? JsonValue.Create(v) : null,
                ["confidence"] = Round(e.Confidence, 3),
                ["round_trip_s"] = e.RoundTripSeconds,
            };
            if (unit == DistanceUnit.Feet)
            {
                node["distance_ft"] = Round(unit.FromMeters(e.DistanceMeters), 4);
                node["distance_sigma_ft"] = Round(unit.FromMeters(e.DistanceSigmaMeters), 4);
            }
            events.Add(node);
        }
        var root = new JsonObject
        {
            ["trace"] = traceName,
            ["vf"] = o.VelocityFactor,
            ["vf_source"] = o.VelocityFactorSource,
            ["vf_relative_sigma"] = o.VelocityFactorRelativeSigma,
            ["z0_ohms"] = o.ImpedanceOhms,
            ["source_ohms"] = o.SourceImpedanceOhms,
            ["rise_s"] = c.RiseTimeSeconds,
            ["noise_v"] = c.NoiseRmsVolts,
            ["incident_v"] = c.IncidentAmplitudeVolts,
            ["blind_zone_m"] = Round(result.BlindZoneMeters, 4),
            ["units"] = unit.Symbol,
            ["events"] = events,
            ["fit"] = new JsonObject
            {
                ["converged"] = result.Fit.Converged,
                ["iterations"] = result.Fit.Iterations,
                ["residual_rms_v"] = result.Fit.ResidualRmsVolts,
                ["parameters"] = result.Fit.ParameterCount,
                ["criterion"] = result.Fit.Criterion,
                ["message"] = result.Fit.Message,
            },
            ["warnings"] = new JsonArray(result.Warnings.Select(w => (JsonNode?)JsonValue.Create(w)).ToArray()),
            // Added to the contract: how the distances were worked out, in words (callers that know more replace it).
            ["distance_method"] = DistanceMethod.Describe(o, null, null, unit),
        };
        return root;
    }

    /// <summary>The result as indented JSON text.</summary>
    public static string Render(LocateResult result, string traceName, DistanceUnit unit) =>
        ToNode(result, traceName, unit).ToJsonString(new JsonSerializerOptions { WriteIndented = true, Encoder = System.Text.Encodings.Web.JavaScriptEncoder.UnsafeRelaxedJsonEscaping });

    private static double Round(double value, int digits) => Math.Round(value, digits);
}
