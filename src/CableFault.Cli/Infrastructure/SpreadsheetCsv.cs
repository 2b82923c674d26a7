using System.Text;
using System.Text.RegularExpressions;

namespace CableFault.Cli.Infrastructure;

/// <summary>
/// CSV cells that are safe to open in a spreadsheet. A cell that a spreadsheet would read as a formula (it begins with
/// <c>=</c>, <c>+</c>, <c>-</c>, <c>@</c>, a tab or a carriage return) gets a leading apostrophe, which spreadsheets
/// show as text and do not evaluate — except a plain decimal number such as <c>-0.158</c> or <c>+3.9E-09</c>, which is
/// left alone so that it stays a number (a number cannot carry a formula). Cells holding the delimiter, a quote or a
/// line break are quoted (RFC 4180).
/// </summary>
public static partial class SpreadsheetCsv
{
    /// <summary>A plain decimal number: optional sign, digits with an optional point, optional exponent. Nothing else.</summary>
    [GeneratedRegex(@"^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$", RegexOptions.CultureInvariant)]
    private static partial Regex PlainNumber();

    /// <summary>True when <paramref name="cell"/> is a plain decimal number (kept as is).</summary>
    public static bool IsPlainNumber(string cell) => PlainNumber().IsMatch(cell);

    /// <summary>The cell made safe: neutralised when it could start a formula, then quoted when needed.</summary>
    public static string Cell(string? value)
    {
        string text = value ?? "";
        if (text.Length > 0 && text[0] is '=' or '+' or '-' or '@' or '\t' or '\r' && !IsPlainNumber(text))
            text = "'" + text;
        bool quote = text.IndexOfAny([',', '"', '\n', '\r']) >= 0;
        return quote ? "\"" + text.Replace("\"", "\"\"") + "\"" : text;
    }

    /// <summary>One CSV line (without the line end) from raw cell values.</summary>
    public static string Line(IEnumerable<string?> cells)
    {
        var line = new StringBuilder();
        bool first = true;
        foreach (string? cell in cells)
        {
            if (!first) line.Append(',');
            line.Append(Cell(cell));
            first = false;
        }
        return line.ToString();
    }
}
