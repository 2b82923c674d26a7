using CableFault.Cli.Infrastructure;

namespace CableFault.Tests.Hardening;

/// <summary>
/// Spreadsheet safety of exported cells. The dangerous leading characters (=, +, -, @, tab, CR) are those spreadsheet
/// programs treat as the start of a formula (common practice: the usual advice on "CSV injection"); RFC 4180 gives the
/// quoting rules.
/// </summary>
public class SpreadsheetCsvTests
{
    [Theory]
    [InlineData("=SUM(A1)", "'=SUM(A1)")]
    [InlineData("+1+cmd", "'+1+cmd")]
    [InlineData("-2+3", "'-2+3")]
    [InlineData("@import", "'@import")]
    [InlineData("\tindent", "'\tindent")]
    [InlineData("=HYPERLINK(\"x\")", "\"'=HYPERLINK(\"\"x\"\")\"")]
    [InlineData("\r=1", "\"'\r=1\"")]
    [InlineData("-", "'-")]
    [InlineData("-e5", "'-e5")]
    [InlineData("-Infinity", "'-Infinity")]
    public void Formula_starts_get_an_apostrophe(string cell, string expected) => Assert.Equal(expected, SpreadsheetCsv.Cell(cell));

    [Theory]
    [InlineData("-0.158")]
    [InlineData("+3.9E-09")]
    [InlineData("-1")]
    [InlineData("-.5")]
    [InlineData("42")]
    [InlineData("1.0107899372543033E-07")]
    public void Plain_numbers_stay_numbers(string cell) => Assert.Equal(cell, SpreadsheetCsv.Cell(cell));

    [Theory]
    [InlineData("a,b", "\"a,b\"")]
    [InlineData("say \"hi\"", "\"say \"\"hi\"\"\"")]
    [InlineData("two\nlines", "\"two\nlines\"")]
    [InlineData("mast feeder", "mast feeder")]
    [InlineData("", "")]
    public void Delimiters_quotes_and_line_breaks_are_quoted(string cell, string expected) => Assert.Equal(expected, SpreadsheetCsv.Cell(cell));

    [Fact]
    public void A_line_joins_cells_with_commas() =>
        Assert.Equal("a,'=1,-0.5,\"x,y\",", SpreadsheetCsv.Line(["a", "=1", "-0.5", "x,y", null]));
}
