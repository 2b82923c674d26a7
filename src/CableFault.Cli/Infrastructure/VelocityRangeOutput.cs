using System.Globalization;
using System.Text;
using System.Text.Json.Nodes;
using CableFault.Analysis;
using CableFault.Cables;
using CableFault.Reporting;
using CableFault.Workflows;

namespace CableFault.Cli.Infrastructure;

/// <summary>
/// Locate output when no VF was given anywhere (vf_source "default"): each event's round trip, electrical length and
/// distance interval for the insulation class's VF range, in the text and as extra JSON fields.
/// </summary>
public static class VelocityRangeOutput
{
    /// <summary>True when the VF was assumed, so that one distance would claim a precision the run does not have.</summary>
    public static bool Applies(LocateResult result) => result.Options.VelocityFactorSource == "default";

    /// <summary>The text block appended after the events table.</summary>
    public static string Text(LocateResult result, InsulationClass insulation, DistanceUnit unit)
    {
        var (low, high) = InsulationClassRanges.VelocityFactorRange(insulation);
        var text = new StringBuilder();
        text.AppendLine(string.Create(CultureInfo.InvariantCulture,
            $"VF not known (the distances above assume {result.Options.VelocityFactor:0.###}): for {Describe(insulation)} (VF {low:0.00}–{high:0.00}) the events lie within"));
        foreach (var e in VelocityFactorRange.For(result, insulation))
            text.AppendLine(string.Create(CultureInfo.InvariantCulture,
                $"  {EventKindNames.ToJsonName(e.Event.Kind),-16} {unit.Format(e.LowMeters)} – {unit.Format(e.HighMeters)}   round trip {e.RoundTripSeconds * 1e9:0.###} ns, electrical length {unit.Format(e.ElectricalLengthMeters)} (v = c)"));
        text.AppendLine("Give --vf, --cable, or calibrate on a run of known length for one distance.");
        return text.ToString();
    }

    /// <summary>Adds "distance_range_m", "electrical_length_m" (and the VF range used) to the DESIGN.md §4 object.</summary>
    public static void AddJson(JsonObject node, LocateResult result, InsulationClass insulation)
    {
        var (low, high) = InsulationClassRanges.VelocityFactorRange(insulation);
        node["vf_range"] = new JsonArray(low, high);
        node["insulation"] = InsulationClassRanges.Name(insulation);
        var entries = VelocityFactorRange.For(result, insulation);
        if (node["events"] is not JsonArray events) return;
        for (int i = 0; i < events.Count && i < entries.Count; i++)
        {
            if (events[i] is not JsonObject e) continue;
            e["distance_range_m"] = new JsonArray(Math.Round(entries[i].LowMeters, 4), Math.Round(entries[i].HighMeters, 4));
            e["electrical_length_m"] = Math.Round(entries[i].ElectricalLengthMeters, 4);
        }
    }

    private static string Describe(InsulationClass insulation) => insulation == Cables.InsulationClass.Unknown
        ? "an unknown insulation (common cables)"
        : $"{InsulationClassRanges.Name(insulation)} insulation";
}
