using System.Globalization;
using System.Text.Json;

namespace CableFault.Reporting.Html;

/// <summary>
/// Reads a job file (our own small JSON schema; every field optional):
/// <code>
/// { "schema": "cablefault-job/1",
///   "site": "Quillon Bay relay station", "run_id": "QB-01", "cable_type": "RG-213",
///   "technician": "R. Example", "measured_at": "2026-11-27T14:30",
///   "customer": "...", "work_order": "...",
///   "expected_length_m": 42.5,            // or "expected_length_ft"
///   "vf": 0.66, "z0_ohms": 50,
///   "instrument": { "name": "bench TDR #2", "averaging": 64, "lead": "1 m launch cable" },
///   "notes": "...",
///   "as_built": "mast-feeder.asbuilt.json" }   // the run's as-built list, relative to the job file
/// </code>
/// Unknown fields are errors (a misspelt field would otherwise be silently lost); every problem is reported at once.
/// </summary>
public static class JobSheetJson
{
    /// <summary>The schema tag this reader understands.</summary>
    public const string SchemaTag = "cablefault-job/1";

    /// <summary>Largest job file accepted, bytes (a job sheet is a few hundred bytes).</summary>
    public const int MaximumBytes = 256 * 1024;

    private static readonly string[] Fields =
    [
        "schema", "site", "run_id", "cable_type", "technician", "measured_at", "customer", "work_order",
        "expected_length_m", "expected_length_ft", "vf", "z0_ohms", "instrument", "notes", "as_built",
    ];

    /// <summary>Reads and validates a job file; throws one <see cref="InputException"/> listing every problem.</summary>
    public static JobSheet Read(Stream stream, string sourceName)
    {
        ArgumentNullException.ThrowIfNull(stream);
        var buffer = new MemoryStream();
        var chunk = new byte[8192];
        int read;
        while ((read = stream.Read(chunk, 0, chunk.Length)) > 0)
        {
            if (buffer.Length + read > MaximumBytes)
                throw new InputException($"{sourceName}: job file is over {MaximumBytes / 1024} kB; is this the right file?");
            buffer.Write(chunk, 0, read);
        }
        if (buffer.Length == 0) throw new InputException($"{sourceName}: job file is empty; expected a JSON object (see README, 'Job files')");
        buffer.Position = 0;
        JsonDocument document;
        try
        {
            document = JsonDocument.Parse(buffer, new JsonDocumentOptions { AllowTrailingCommas = true, CommentHandling = JsonCommentHandling.Skip });
        }
        catch (JsonException e)
        {
            string where = e.LineNumber is long line ? $"line {line + 1}, column {(e.BytePositionInLine ?? 0) + 1}" : "somewhere";
            throw new InputException($"{sourceName}: not valid JSON at {where}; check for a missing comma, quote or bracket", e);
        }
        using (document)
        {
            var root = document.RootElement;
            if (root.ValueKind != JsonValueKind.Object)
                throw new InputException($"{sourceName}: expected a JSON object such as {{ \"site\": \"...\", \"run_id\": \"...\" }}");
            var problems = new List<string>();
            foreach (var property in root.EnumerateObject())
                if (!Fields.Contains(property.Name))
                    problems.Add($"{property.Name}: unknown field; expected one of {string.Join(", ", Fields)}");

            string? schema = Text(root, "schema", problems);
            if (schema is not null && schema != SchemaTag)
                problems.Add($"schema: '{schema}' is not understood; this version reads '{SchemaTag}'");
            double? lengthM = Number(root, "expected_length_m", problems, 0, double.PositiveInfinity);
            double? lengthFt = Number(root, "expected_length_ft", problems, 0, double.PositiveInfinity);
            if (lengthM is not null && lengthFt is not null) problems.Add("expected_length_ft: give the length once, in metres or in feet");
            double? vf = Number(root, "vf", problems, 0, 1);
            double? z0 = Number(root, "z0_ohms", problems, 0, double.PositiveInfinity);
            var sheet = new JobSheet(
                Site: Text(root, "site", problems),
                RunId: Text(root, "run_id", problems),
                CableType: Text(root, "cable_type", problems),
                Technician: Text(root, "technician", problems),
                MeasuredAt: Text(root, "measured_at", problems),
                Customer: Text(root, "customer", problems),
                WorkOrder: Text(root, "work_order", problems),
                ExpectedLengthMeters: lengthM ?? lengthFt * PhysicalConstants.MetersPerFoot,
                VelocityFactor: vf,
                ImpedanceOhms: z0,
                Instrument: Instrument(root, problems),
                Notes: Text(root, "notes", problems),
                AsBuiltFile: Text(root, "as_built", problems));
            if (problems.Count > 0)
                throw new InputException($"{sourceName}: {problems.Count} problem{(problems.Count == 1 ? "" : "s")}: {string.Join("; ", problems.Take(8))}{(problems.Count > 8 ? $"; and {problems.Count - 8} more" : "")}");
            return sheet;
        }
    }

    private static string? Text(JsonElement root, string name, List<string> problems)
    {
        if (!root.TryGetProperty(name, out var value) || value.ValueKind == JsonValueKind.Null) return null;
        if (value.ValueKind == JsonValueKind.String) return value.GetString();
        problems.Add($"{name}: expected a string in quotes");
        return null;
    }

    private static double? Number(JsonElement root, string name, List<string> problems, double lowExclusive, double highInclusive)
    {
        if (!root.TryGetProperty(name, out var value) || value.ValueKind == JsonValueKind.Null) return null;
        if (value.ValueKind != JsonValueKind.Number || !value.TryGetDouble(out double number) || !double.IsFinite(number))
        {
            problems.Add($"{name}: expected a number");
            return null;
        }
        if (!(number > lowExclusive && number <= highInclusive))
        {
            problems.Add(string.Create(CultureInfo.InvariantCulture,
                $"{name}: {number} is out of range; it must be above {lowExclusive}{(double.IsPositiveInfinity(highInclusive) ? "" : $" and at most {highInclusive}")}"));
            return null;
        }
        return number;
    }

    private static List<KeyValuePair<string, string>> Instrument(JsonElement root, List<string> problems)
    {
        var pairs = new List<KeyValuePair<string, string>>();
        if (!root.TryGetProperty("instrument", out var value) || value.ValueKind == JsonValueKind.Null) return pairs;
        if (value.ValueKind != JsonValueKind.Object)
        {
            problems.Add("instrument: expected an object of label/value pairs, e.g. { \"name\": \"bench TDR #2\", \"averaging\": 64 }");
            return pairs;
        }
        foreach (var property in value.EnumerateObject())
        {
            string label = property.Name == "name" ? "Instrument" : property.Name;
            switch (property.Value.ValueKind)
            {
                case JsonValueKind.String: pairs.Add(new(label, property.Value.GetString() ?? "")); break;
                case JsonValueKind.Number or JsonValueKind.True or JsonValueKind.False: pairs.Add(new(label, property.Value.GetRawText())); break;
                default: problems.Add($"instrument.{property.Name}: expected a string, number or true/false"); break;
            }
        }
        return pairs;
    }
}
