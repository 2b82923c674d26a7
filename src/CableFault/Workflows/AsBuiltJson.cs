using System.Globalization;
using System.Text;
using System.Text.Json;
using CableFault.Json;

namespace CableFault.Workflows;

/// <summary>
/// Reads an as-built list (our own JSON schema, documented in the README):
/// <code>
/// { "schema": "cablefault-asbuilt/1",
///   "run_id": "QB-01 mast feeder",              // optional
///   "tolerance_m": 0.5,                          // optional default for the entries (or tolerance_ft)
///   "notes": "...",                              // optional
///   "features": [
///     { "kind": "connector", "distance_m": 12.0, "label": "roof-entry bulkhead", "tolerance_m": 0.3 },
///     { "kind": "end", "distance_ft": 139.4, "label": "mast head" } ] }
/// </code>
/// <c>kind</c> is a feature word (connector, splice, tap, cable_change, end) or an event kind of DESIGN.md §4; see
/// <see cref="AsBuiltKinds"/>. Unknown fields are errors (a misspelt field would otherwise be lost silently) and every
/// problem is reported at once with its JSON path.
/// </summary>
public static class AsBuiltJson
{
    /// <summary>The schema tag this reader understands.</summary>
    public const string SchemaTag = "cablefault-asbuilt/1";

    /// <summary>Largest as-built file accepted, bytes (a list of a few hundred features is tens of kB).</summary>
    public const long MaximumBytes = 1_000_000;

    /// <summary>Most features accepted in one list (a guard against generated nonsense).</summary>
    public const int MaximumEntries = 10_000;

    /// <summary>Largest tolerance accepted, m: 1 km. Wider than that matches anything and is a unit slip.</summary>
    public const double MaximumToleranceMeters = 1_000;

    private static readonly string[] RootFields = ["schema", "run_id", "tolerance_m", "tolerance_ft", "notes", "features"];
    private static readonly string[] EntryFields = ["kind", "distance_m", "distance_ft", "label", "tolerance_m", "tolerance_ft"];

    /// <summary>Reads and validates a list from UTF-8 JSON; every problem is reported at once as one <see cref="InputException"/>.</summary>
    public static AsBuiltList Read(Stream stream, string sourceName)
    {
        ArgumentNullException.ThrowIfNull(stream);
        using var document = JsonProblems.Parse(stream, sourceName, MaximumBytes);
        return Read(document.RootElement, sourceName);
    }

    /// <summary>Reads and validates a list from JSON text.</summary>
    public static AsBuiltList Read(TextReader reader, string sourceName)
    {
        ArgumentNullException.ThrowIfNull(reader);
        // The size limit applies to the characters read, before any of it is held as bytes.
        var buffer = new char[8192];
        var text = new StringBuilder();
        int read;
        while ((read = reader.Read(buffer, 0, buffer.Length)) > 0)
        {
            if (text.Length + read > MaximumBytes)
                throw new InputException($"{sourceName}: file is over the {MaximumBytes / 1e6:F0} MB limit for JSON files; is this the right file?");
            text.Append(buffer, 0, read);
        }
        using var stream = new MemoryStream(Encoding.UTF8.GetBytes(text.ToString()));
        return Read(stream, sourceName);
    }

    private static AsBuiltList Read(JsonElement root, string sourceName)
    {
        if (root.ValueKind != JsonValueKind.Object)
            throw new InputException($"{sourceName}: expected a JSON object such as {{ \"schema\": \"{SchemaTag}\", \"features\": [ ... ] }}");
        var problems = new JsonProblems();
        problems.RejectUnknown(root, "$", RootFields);
        string? schema = problems.Text(root, "schema", "$", required: true);
        if (schema is not null && schema != SchemaTag)
            problems.Add("$.schema", $"'{schema}' is not understood; this version reads '{SchemaTag}'");
        string? runId = problems.Text(root, "run_id", "$", required: false);
        string? notes = problems.Text(root, "notes", "$", required: false);
        double defaultTolerance = Length(root, "tolerance", "$", problems, tolerance: true) ?? AsBuiltList.DefaultToleranceMeters;

        var entries = new List<AsBuiltEntry>();
        if (!root.TryGetProperty("features", out var features) || features.ValueKind != JsonValueKind.Array)
        {
            problems.Add("$", "'features' is missing or not an array; list the run's known features, e.g. [ { \"kind\": \"splice\", \"distance_m\": 12.0 } ]");
        }
        else if (features.GetArrayLength() > MaximumEntries)
        {
            problems.Add("$.features", $"{features.GetArrayLength()} entries, over the limit of {MaximumEntries}");
        }
        else
        {
            int index = 0;
            foreach (var item in features.EnumerateArray())
            {
                string path = $"$.features[{index++}]";
                if (item.ValueKind != JsonValueKind.Object) { problems.Add(path, $"expected an object, found {JsonProblems.Describe(item)}"); continue; }
                if (ReadEntry(item, path, problems, defaultTolerance) is { } entry) entries.Add(entry);
            }
        }
        problems.ThrowIfAny(sourceName);
        return new AsBuiltList(entries.OrderBy(e => e.DistanceMeters).ToList(), runId, notes);
    }

    private static AsBuiltEntry? ReadEntry(JsonElement item, string path, JsonProblems problems, double defaultTolerance)
    {
        problems.RejectUnknown(item, path, EntryFields);
        string? kind = problems.Text(item, "kind", path, required: true);
        IReadOnlyList<Analysis.EventKind> accepted = [];
        if (kind is not null && !AsBuiltKinds.TryAccepted(kind, out accepted))
        {
            problems.Add($"{path}.kind", $"'{kind}' is not a feature kind; use one of {string.Join(", ", AsBuiltKinds.AllNames)}");
            kind = null;
        }
        int before = problems.Problems.Count;
        double? distance = Length(item, "distance", path, problems, tolerance: false);
        if (distance is null && problems.Problems.Count == before)
            problems.Add(path, "'distance_m' (or 'distance_ft') is missing");
        double tolerance = Length(item, "tolerance", path, problems, tolerance: true) ?? defaultTolerance;
        string? label = problems.Text(item, "label", path, required: false);
        if (kind is null || distance is null) return null;
        return new AsBuiltEntry(kind.Trim().ToLowerInvariant(), distance.Value, string.IsNullOrWhiteSpace(label) ? null : label.Trim(), tolerance, accepted);
    }

    /// <summary>Reads NAME_m or NAME_ft (not both) in metres; null when absent or wrong.</summary>
    private static double? Length(JsonElement obj, string name, string path, JsonProblems problems, bool tolerance)
    {
        double max = tolerance ? MaximumToleranceMeters : Networks.NetworkJson.MaximumSegmentLengthMeters;
        double? meters = problems.Number(obj, name + "_m", path, required: false, min: 0, max: max, exclusiveMin: tolerance);
        double? feet = problems.Number(obj, name + "_ft", path, required: false, min: 0, max: max / PhysicalConstants.MetersPerFoot, exclusiveMin: tolerance);
        if (obj.TryGetProperty(name + "_m", out _) && obj.TryGetProperty(name + "_ft", out _))
        {
            problems.Add($"{path}.{name}_ft", string.Create(CultureInfo.InvariantCulture, $"give the {name} once, in metres ({name}_m) or in feet ({name}_ft)"));
            return null;
        }
        return meters ?? feet * PhysicalConstants.MetersPerFoot;
    }
}
