using System.Globalization;
using CableFault.Workflows;

namespace CableFault.Reporting.Locate;

/// <summary>Words for an as-built comparison, shared by the locate text and the HTML report: unexpected events first.</summary>
public static class AsBuiltWording
{
    /// <summary>The status of one event: "expected: splice S2 at 12.0 m" or "UNEXPECTED" (with a note when a listed
    /// feature is there but the event does not look like it).</summary>
    public static string Status(AsBuiltEventMatch match, DistanceUnit unit)
    {
        ArgumentNullException.ThrowIfNull(match);
        ArgumentNullException.ThrowIfNull(unit);
        if (match.Entry is { } entry) return $"expected: {entry.Name} at {unit.Format(entry.DistanceMeters, 1)}";
        if (match.BeyondFullReflection is { } wall) return $"echo beyond the {EventWording.KindWords(wall.Kind)} at {unit.Format(wall.DistanceMeters)}, not on the cable";
        if (match.NearbyEntry is { } near) return $"UNEXPECTED (at listed {near.Name}, which should not look like this)";
        return "UNEXPECTED";
    }

    /// <summary>Why a listed feature was not found, in <paramref name="unit"/>.</summary>
    public static string Missing(AsBuiltMissing missing, DistanceUnit unit)
    {
        ArgumentNullException.ThrowIfNull(missing);
        ArgumentNullException.ThrowIfNull(unit);
        string head = $"{missing.Entry.Name} listed at {unit.Format(missing.Entry.DistanceMeters, 1)}";
        return missing.Reason switch
        {
            AsBuiltMissReason.KindDiffers when missing.NearbyEvent is { } e =>
                $"{head}: the event there ({unit.Format(e.DistanceMeters)}) is {EventWording.KindWords(e.Kind)}, which a {missing.Entry.Kind.Replace('_', ' ')} is not",
            AsBuiltMissReason.BeyondRecord => $"{head}: beyond the end of the record; record a longer trace to see it",
            AsBuiltMissReason.BeyondFullReflection => $"{head}: behind an open or short found nearer; the run ends early or is broken there",
            _ => $"{head}: not found within its tolerance; moved, removed, or too small to see",
        };
    }

    /// <summary>
    /// The summary lines: a count line, then each unexpected event, then each missing feature, then the expected ones.
    /// </summary>
    public static IReadOnlyList<string> Summary(AsBuiltMatch match, DistanceUnit unit)
    {
        ArgumentNullException.ThrowIfNull(match);
        var inv = CultureInfo.InvariantCulture;
        var lines = new List<string>
        {
            string.Create(inv, $"{Count(match.Unexpected.Count, "UNEXPECTED event")}, {Count(match.ExpectedCount, "listed feature")} found as expected, {Count(match.Missing.Count, "listed feature")} not found"),
        };
        foreach (var m in match.Unexpected)
            lines.Add($"UNEXPECTED  {EventWording.Sentence(m.Event, unit)}{(m.NearbyEntry is { } near ? $" (where {near.Name} is listed)" : "")}");
        foreach (var missing in match.Missing)
            lines.Add($"not found   {Missing(missing, unit)}");
        foreach (var m in match.Events.Where(e => e.Expected))
            lines.Add($"expected    {m.Entry!.Name} at {unit.Format(m.Entry.DistanceMeters, 1)}: {EventWording.KindWords(m.Event.Kind)} at {unit.Format(m.Event.DistanceMeters)}");
        if (match.Echoes.Count > 0)
            lines.Add($"echoes      {Count(match.Echoes.Count, "unlisted event")} beyond an open or short: re-reflections, not places on the cable");
        return lines;
    }

    /// <summary>"1 listed feature", "3 listed features".</summary>
    public static string Count(int count, string noun) => count.ToString(CultureInfo.InvariantCulture) + " " + noun + (count == 1 ? "" : "s");

    /// <summary>Machine-readable name of a miss reason for JSON.</summary>
    public static string ReasonName(AsBuiltMissReason reason) => reason switch
    {
        AsBuiltMissReason.KindDiffers => "kind_differs",
        AsBuiltMissReason.BeyondRecord => "beyond_record",
        AsBuiltMissReason.BeyondFullReflection => "beyond_full_reflection",
        _ => "not_seen",
    };
}
