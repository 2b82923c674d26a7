using System.Text.Json;

namespace CableFault.Json;

/// <summary>
/// Reads typed fields from a JSON element while collecting every problem with its path, so that a file with
/// several mistakes is reported in one go.
/// </summary>
internal sealed class JsonProblems
{
    private readonly List<string> _problems = [];

    internal IReadOnlyList<string> Problems => _problems;

    internal void Add(string path, string problem) => _problems.Add($"{path}: {problem}");

    /// <summary>Deepest nesting of arrays and objects accepted (the System.Text.Json default is 64; junctions need more).</summary>
    internal const int MaximumDepth = 256;

    /// <summary>Refuses UTF-16/UTF-32 and binary input with a message that says so, instead of "not valid JSON at column 1".</summary>
    private static void CheckEncoding(ReadOnlySpan<byte> bytes, string sourceName)
    {
        if (bytes.StartsWith(new byte[] { 0xFF, 0xFE }) || bytes.StartsWith(new byte[] { 0xFE, 0xFF }))
            throw new InputException($"{sourceName}: the file is UTF-16 (or UTF-32) text; save it as UTF-8");
        int nul = bytes[..Math.Min(bytes.Length, 4096)].IndexOf((byte)0);
        if (nul >= 0)
            throw new InputException($"{sourceName}: byte {nul + 1} is NUL, so this is binary data or UTF-16 without a byte-order mark, not JSON text; save the file as UTF-8 text");
        if (!System.Text.Unicode.Utf8.IsValid(bytes))
        {
            // Strings with broken UTF-8 would otherwise fail later, deep inside the JSON library, with no line.
            int at = 0;
            while (at < bytes.Length && System.Text.Rune.DecodeFromUtf8(bytes[at..], out _, out int used) == System.Buffers.OperationStatus.Done) at += used;
            int line = 1 + bytes[..at].Count((byte)'\n');
            throw new InputException($"{sourceName}: line {line}: byte {at + 1} is not valid UTF-8; save the file as UTF-8 text");
        }
    }

    internal static JsonDocument Parse(Stream stream, string sourceName, long maximumBytes)
    {
        if (stream.CanSeek && stream.Length > maximumBytes)
            throw new InputException($"{sourceName}: file is {stream.Length / 1e6:F1} MB, over the {maximumBytes / 1e6:F0} MB limit for JSON files; is this the right file?");
        try
        {
            using var limited = new MemoryStream();
            var buffer = new byte[81920];
            int read;
            while ((read = stream.Read(buffer, 0, buffer.Length)) > 0)
            {
                if (limited.Length + read > maximumBytes)
                    throw new InputException($"{sourceName}: file is over the {maximumBytes / 1e6:F0} MB limit for JSON files; is this the right file?");
                limited.Write(buffer, 0, read);
            }
            if (limited.Length == 0) throw new InputException($"{sourceName}: file is empty; expected a JSON object");
            CheckEncoding(limited.GetBuffer().AsSpan(0, (int)limited.Length), sourceName);
            limited.Position = 0;
            return JsonDocument.Parse(limited, new JsonDocumentOptions
            {
                AllowTrailingCommas = true,
                CommentHandling = JsonCommentHandling.Skip,
                MaxDepth = MaximumDepth,
            });
        }
        catch (JsonException e) when (e.Message.Contains("depth", StringComparison.OrdinalIgnoreCase))
        {
            string where = e.LineNumber is long line ? $"line {line + 1}" : "somewhere";
            throw new InputException($"{sourceName}: JSON nested more than {MaximumDepth} levels deep at {where}; a run description needs only a few levels, so check the brackets", e);
        }
        catch (JsonException e)
        {
            string where = e.LineNumber is long line ? $"line {line + 1}, column {(e.BytePositionInLine ?? 0) + 1}" : "somewhere";
            throw new InputException($"{sourceName}: not valid JSON at {where}; check for a missing comma, quote or bracket", e);
        }
    }

    internal double? Number(JsonElement obj, string name, string path, bool required, double min = double.NegativeInfinity,
        double max = double.PositiveInfinity, bool exclusiveMin = false)
    {
        if (!obj.TryGetProperty(name, out var value) || value.ValueKind == JsonValueKind.Null)
        {
            if (required) Add(path, $"'{name}' is missing");
            return null;
        }
        if (value.ValueKind != JsonValueKind.Number || !value.TryGetDouble(out double number) || !double.IsFinite(number))
        {
            Add($"{path}.{name}", $"expected a number, found {Describe(value)}");
            return null;
        }
        if (number < min || number > max || (exclusiveMin && number == min))
        {
            string range = double.IsPositiveInfinity(max) ? (exclusiveMin ? $"> {min}" : $"≥ {min}") : $"between {min} and {max}";
            Add($"{path}.{name}", $"{number} is out of range; it must be {range}");
            return null;
        }
        return number;
    }

    internal string? Text(JsonElement obj, string name, string path, bool required)
    {
        if (!obj.TryGetProperty(name, out var value) || value.ValueKind == JsonValueKind.Null)
        {
            if (required) Add(path, $"'{name}' is missing");
            return null;
        }
        if (value.ValueKind != JsonValueKind.String)
        {
            Add($"{path}.{name}", $"expected a string, found {Describe(value)}");
            return null;
        }
        return value.GetString();
    }

    internal void RejectUnknown(JsonElement obj, string path, IReadOnlyCollection<string> known)
    {
        foreach (var property in obj.EnumerateObject())
            if (!known.Contains(property.Name))
                Add($"{path}.{property.Name}", $"unknown field; expected one of {string.Join(", ", known)}");
    }

    internal static string Describe(JsonElement value) => value.ValueKind switch
    {
        JsonValueKind.String => $"the string \"{Truncate(value.GetString() ?? "")}\"",
        JsonValueKind.Number => $"the number {value.GetRawText()}",
        JsonValueKind.Array => "an array",
        JsonValueKind.Object => "an object",
        JsonValueKind.True or JsonValueKind.False => $"{value.GetRawText()}",
        _ => "null",
    };

    private static string Truncate(string text) => text.Length <= 40 ? text : text[..40] + "…";

    internal void ThrowIfAny(string sourceName)
    {
        if (_problems.Count == 0) return;
        const int shown = 8;
        string list = string.Join("; ", _problems.Take(shown));
        string more = _problems.Count > shown ? $"; and {_problems.Count - shown} more" : "";
        throw new InputException($"{sourceName}: {_problems.Count} problem{(_problems.Count == 1 ? "" : "s")}: {list}{more}");
    }
}
