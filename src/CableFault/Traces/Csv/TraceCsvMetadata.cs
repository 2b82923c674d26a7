using System.Globalization;
using System.Text.RegularExpressions;

namespace CableFault.Traces.Csv;

/// <summary>
/// Collects <c># key=value</c> comments. Keys are lower-cased, values trimmed; a key must look like an identifier
/// (letters, digits, '_', '-', '.') so prose such as "# note: a=b" stays a plain comment. The numeric keys other
/// parts of the program rely on are checked here, where the line number is still known.
/// </summary>
internal sealed partial class TraceCsvMetadata
{
    private readonly string _source;
    private readonly List<string> _warnings;
    private readonly Dictionary<string, string> _values = new(StringComparer.Ordinal);
    private readonly Dictionary<string, int> _lineOf = new(StringComparer.Ordinal);

    public TraceCsvMetadata(string sourceName, List<string> warnings)
    {
        _source = sourceName;
        _warnings = warnings;
    }

    public IReadOnlyDictionary<string, string> Values => _values;

    [GeneratedRegex(@"^[a-z_][a-z0-9_.\-]*$")]
    private static partial Regex KeyPattern();

    /// <summary>Reads a comment line (starting with '#'); stores it when it is key=value.</summary>
    public void ReadComment(string line, int ln)
    {
        string body = line.TrimStart('#');
        int eq = body.IndexOf('=');
        if (eq < 0) return;
        string key = body[..eq].Trim().ToLowerInvariant();
        if (!KeyPattern().IsMatch(key)) return;
        string value = body[(eq + 1)..].Trim();
        Check(key, value, ln);
        if (_lineOf.TryGetValue(key, out int earlier))
            _warnings.Add($"{_source}: line {ln}: metadata '{key}' already given on line {earlier}; used the later value.");
        _values[key] = value;
        _lineOf[key] = ln;
    }

    /// <summary>Sets a value the reader derives from the file's shape (e.g. unit=rho), warning if the file said otherwise.</summary>
    public void SetDerived(string key, string value)
    {
        if (_values.TryGetValue(key, out string? given) && !string.Equals(given, value, StringComparison.OrdinalIgnoreCase))
            _warnings.Add($"{_source}: line {_lineOf[key]}: metadata {key}={given} contradicts the header; used {key}={value}.");
        _values[key] = value;
    }

    private void Check(string key, string value, int ln)
    {
        (double Min, bool MinOpen, double Max, string Example)? range = key switch
        {
            TraceMetadataKeys.VelocityFactor => (0, true, 1, "vf=0.66"),
            TraceMetadataKeys.CharacteristicImpedanceOhms => (0, true, double.MaxValue, "z0=50"),
            TraceMetadataKeys.RiseTimeSeconds => (0, true, double.MaxValue, "rise_s=1e-9"),
            TraceMetadataKeys.SourceImpedanceOhms => (0, false, double.MaxValue, "source_ohms=50"),
            _ => null,
        };
        if (range is not { } r) return;
        bool parsed = double.TryParse(value, NumberStyles.Float, CultureInfo.InvariantCulture, out double x);
        bool inRange = parsed && double.IsFinite(x) && (r.MinOpen ? x > r.Min : x >= r.Min) && x <= r.Max;
        if (inRange) return;
        string bound = r.Max == double.MaxValue
            ? (r.MinOpen ? "a positive number" : "a number not below zero")
            : $"a number in ({r.Min}, {r.Max}]";
        throw new InputException(
            $"{_source}: line {ln}: metadata {key}='{value}' is not {bound}; write it with a decimal point, e.g. # {r.Example}.");
    }
}
