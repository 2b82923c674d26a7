using System.Text.Json.Nodes;
using CableFault.Workflows;

namespace CableFault.Reporting.Locate;

/// <summary>
/// Adds the as-built comparison to the DESIGN.md §4 locate object without touching its fields: an "as_built" object
/// on each event, and top-level "as_built_missing" and "as_built_summary".
/// </summary>
public static class AsBuiltJsonOutput
{
    /// <summary>Adds the fields; the events of <paramref name="node"/> must be those of the matched result, in order.</summary>
    public static void Add(JsonObject node, AsBuiltMatch match, DistanceUnit unit, string? listName = null)
    {
        ArgumentNullException.ThrowIfNull(node);
        ArgumentNullException.ThrowIfNull(match);
        ArgumentNullException.ThrowIfNull(unit);
        bool feet = unit == DistanceUnit.Feet;
        if (node["events"] is JsonArray events)
        {
            for (int i = 0; i < events.Count && i < match.Events.Count; i++)
            {
                if (events[i] is not JsonObject e) continue;
                var m = match.Events[i];
                var status = new JsonObject { ["status"] = m.Expected ? "expected" : "unexpected" };
                if (m.BeyondFullReflection is { } wall) status["echo_beyond_m"] = Math.Round(wall.DistanceMeters, 4);
                if (m.Entry is { } entry)
                {
                    Describe(status, entry, feet, unit);
                    status["offset_m"] = Math.Round(m.OffsetMeters ?? 0, 4);
                }
                else if (m.NearbyEntry is { } near)
                {
                    var listed = new JsonObject();
                    Describe(listed, near, feet, unit);
                    status["at_listed"] = listed;
                }
                e["as_built"] = status;
            }
        }
        var missing = new JsonArray();
        foreach (var miss in match.Missing)
        {
            var item = new JsonObject();
            Describe(item, miss.Entry, feet, unit);
            item["reason"] = AsBuiltWording.ReasonName(miss.Reason);
            item["explanation"] = AsBuiltWording.Missing(miss, unit);
            missing.Add(item);
        }
        node["as_built_missing"] = missing;
        node["as_built_summary"] = new JsonObject
        {
            ["list"] = listName,
            ["run_id"] = match.List.RunId,
            ["expected"] = match.ExpectedCount,
            ["unexpected"] = match.Unexpected.Count,
            ["missing"] = match.Missing.Count,
            ["echoes"] = match.Echoes.Count,
        };
    }

    private static void Describe(JsonObject node, AsBuiltEntry entry, bool feet, DistanceUnit unit)
    {
        node["feature"] = entry.Kind;
        node["label"] = entry.Label;
        node["listed_distance_m"] = Math.Round(entry.DistanceMeters, 4);
        node["tolerance_m"] = Math.Round(entry.ToleranceMeters, 4);
        if (feet) node["listed_distance_ft"] = Math.Round(unit.FromMeters(entry.DistanceMeters), 4);
    }
}
