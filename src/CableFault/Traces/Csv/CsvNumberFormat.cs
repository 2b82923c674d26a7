using System.Globalization;

namespace CableFault.Traces.Csv;

/// <summary>
/// The delimiter and decimal mark of one file, and the parsing of its fields. The delimiter is chosen from the first
/// data row (tab, then semicolon, then comma); the decimal mark is learnt from the first number that shows one. A
/// decimal comma is accepted only when the delimiter is a semicolon or a tab, and a file may not mix the two marks:
/// "1.500" in a decimal-comma file could be a thousands-grouped 1500, so guessing would be unsafe.
/// </summary>
internal sealed class CsvNumberFormat
{
    private readonly string _sourceName;
    private char _decimalMark; // '\0' until a number shows one
    private int _decimalMarkLine;

    public CsvNumberFormat(char delimiter, string sourceName)
    {
        Delimiter = delimiter;
        _sourceName = sourceName;
    }

    /// <summary>Column delimiter: ',', ';' or '\t'.</summary>
    public char Delimiter { get; }

    /// <summary>True once a number with a decimal comma has been read.</summary>
    public bool UsesDecimalComma => _decimalMark == ',';

    /// <summary>The delimiter a line most likely uses, or null when it has none of the three.</summary>
    public static char? DetectDelimiter(string line) =>
        line.Contains('\t') ? '\t' : line.Contains(';') ? ';' : line.Contains(',') ? ',' : null;

    /// <summary>Human name of a delimiter for messages.</summary>
    public static string NameOf(char delimiter) => delimiter switch
    {
        '\t' => "tab",
        ';' => "semicolon",
        _ => "comma",
    };

    /// <summary>
    /// Splits a line into trimmed fields, removing one pair of surrounding double quotes from each and dropping empty
    /// fields at the end (many exporters end every row with a delimiter).
    /// </summary>
    public static List<string> Split(string line, char delimiter)
    {
        var fields = new List<string>(line.Split(delimiter));
        for (int i = 0; i < fields.Count; i++)
        {
            string f = fields[i].Trim();
            if (f.Length >= 2 && f[0] == '"' && f[^1] == '"') f = f[1..^1].Trim();
            fields[i] = f;
        }
        while (fields.Count > 0 && fields[^1].Length == 0) fields.RemoveAt(fields.Count - 1);
        return fields;
    }

    /// <summary>
    /// A cheap test used before the data starts: does the field look like a number (digits, sign, marks, exponent,
    /// or a spelled-out NaN/infinity)? Malformed numbers are left for <see cref="TryParse"/> to report with a line.
    /// </summary>
    public static bool LooksNumeric(string field)
    {
        if (IsNonFiniteWord(field, out _)) return true;
        bool digit = false;
        foreach (char c in field)
        {
            if (char.IsAsciiDigit(c)) digit = true;
            else if (c is not ('+' or '-' or '.' or ',' or 'e' or 'E')) return false;
        }
        return digit;
    }

    /// <summary>
    /// Parses a field in the invariant culture (or with a decimal comma, see the type remarks). Returns false when
    /// the field is not a number; NaN and infinities are returned as such for the caller to reject. Throws
    /// <see cref="InputException"/> when the decimal mark is ambiguous or changes within the file.
    /// </summary>
    public bool TryParse(string field, int lineNumber, out double value)
    {
        if (IsNonFiniteWord(field, out value)) return true;
        bool hasComma = field.Contains(',');
        bool hasPoint = field.Contains('.');
        if (hasComma && hasPoint)
            throw new InputException(
                $"{_sourceName}: line {lineNumber}: '{field}' has both '.' and ','; digit grouping is not supported, write numbers without thousands separators.");
        if (hasComma)
        {
            if (field.IndexOf(',') != field.LastIndexOf(','))
                throw new InputException(
                    $"{_sourceName}: line {lineNumber}: '{field}' has more than one ','; write numbers without thousands separators.");
            NoteMark(',', lineNumber, field);
            field = field.Replace(',', '.');
        }
        else if (hasPoint)
        {
            NoteMark('.', lineNumber, field);
        }
        return double.TryParse(field, NumberStyles.Float, CultureInfo.InvariantCulture, out value);
    }

    /// <summary>
    /// The quick reading of a plain field (digits, sign, exponent and a decimal point where the file's mark is already
    /// known to be a point): true with a finite value, or false for <see cref="TryParse"/> to decide, note a mark or
    /// report. What it accepts, <see cref="TryParse"/> would read as the same number.
    /// </summary>
    public bool TryParsePlain(ReadOnlySpan<char> field, out double value)
    {
        value = 0;
        if (field.IsEmpty || field.Contains(',') || field.Contains('#') || (field.Contains('.') && _decimalMark != '.')) return false;
        var body = field.TrimStart("+-");
        if (body.IsEmpty || !(char.IsAsciiDigit(body[0]) || body[0] == '.')) return false;
        return double.TryParse(field, NumberStyles.Float, CultureInfo.InvariantCulture, out value) && double.IsFinite(value);
    }

    private void NoteMark(char mark, int lineNumber, string field)
    {
        if (_decimalMark == '\0')
        {
            _decimalMark = mark;
            _decimalMarkLine = lineNumber;
            return;
        }
        if (_decimalMark != mark)
            throw new InputException(
                $"{_sourceName}: line {lineNumber}: '{field}' uses a decimal '{mark}' but line {_decimalMarkLine} uses '{_decimalMark}'; use one decimal mark throughout the file.");
    }

    private static bool IsNonFiniteWord(string field, out double value)
    {
        value = 0;
        // Fast path for the usual case: a number starts with a digit or a mark after any sign.
        var span = field.AsSpan().Trim().TrimStart("+-");
        if (span.IsEmpty || ((char.IsAsciiDigit(span[0]) || span[0] is '.' or ',') && !span.Contains('#'))) return false;
        string f = field.Trim().ToLowerInvariant();
        bool negative = f.StartsWith('-');
        string body = f.TrimStart('+', '-');
        value = body switch
        {
            "nan" => double.NaN,
            "inf" or "infinity" or "∞" or "1.#inf" => negative ? double.NegativeInfinity : double.PositiveInfinity,
            _ => 0,
        };
        return body is "nan" or "inf" or "infinity" or "∞" or "1.#inf";
    }
}
