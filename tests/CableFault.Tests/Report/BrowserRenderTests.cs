using CableFault.Reporting;
using CableFault.Reporting.Html;

namespace CableFault.Tests.Report;

/// <summary>The report in a real browser (Debian's chromium, headless): it prints to a PDF of a sensible length and
/// draws a page that is not blank, on a desktop window and on a phone-sized one.</summary>
public class BrowserRenderTests
{
    /// <summary>Most pages a one-job report of a few events may take on A4 or Letter: header and summary, table,
    /// figure, settings and cautions fit in about three; more than six means a layout runaway (an unscaled figure, a
    /// table breaking per row).</summary>
    private const int MaximumPages = 6;

    /// <summary>
    /// Least standard deviation of luminance (0…255) for a page that shows something: a blank or single-colour page
    /// has 0; dark text and lines on warm white over a few per cent of the area give well over 10.
    /// </summary>
    private const double MinimumLuminanceSpread = 10;

    /// <summary>Least share of pixels that differ from the page background: text, rules and the figure cover far more
    /// than 2 % of a screenful; a page that failed to render (or rendered only its background) covers none.</summary>
    private const double MinimumInkFraction = 0.02;

    private static string Html(DistanceUnit unit) => HtmlReport.Render(ReportFixtures.Input(unit,
        new JobSheet(ExpectedLengthMeters: ReportFixtures.OpenMeters, Instrument: [new("Instrument", "bench reflectometer 2")]),
        new RepairCheckPart("before.csv", ReportFixtures.Comparison)));

    [ChromiumTheory]
    // Chromium prints on Letter unless the page asks otherwise; the report asks for "auto" (the reader's paper), so
    // A4 is forced here by one extra rule. Sizes in PDF points (1/72 in): Letter 8.5 × 11 in, A4 210 × 297 mm
    // (ISO 216), i.e. 612 × 792 and 595.3 × 841.9.
    [InlineData("letter", "", 612, 792)]
    [InlineData("a4", "<style>@page { size: A4; }</style>", 595, 842)]
    public void PrintsToAFewPdfPages(string name, string pageRule, int widthPoints, int heightPoints)
    {
        string html = Html(DistanceUnit.Meters).Replace("</head>", pageRule + "</head>", StringComparison.Ordinal);
        var rendering = BrowserCheck.Render(html, "print-" + name, 1200, 1800);
        Assert.Equal("%PDF-", System.Text.Encoding.ASCII.GetString(rendering.Pdf, 0, 5));
        var (objects, treeCount) = BrowserCheck.CountPdfPages(rendering.Pdf);
        Assert.InRange(objects, 1, MaximumPages);
        if (treeCount is int count) Assert.Equal(objects, count);
        var boxes = BrowserCheck.MediaBoxes(rendering.Pdf);
        Assert.NotEmpty(boxes);
        // Within a point: PDF writers round the A4 size.
        Assert.All(boxes, box => Assert.True(Math.Abs(box.Width - widthPoints) <= 1 && Math.Abs(box.Height - heightPoints) <= 1, $"page {box.Width} × {box.Height} pt"));
    }

    [ChromiumFact]
    public void DesktopScreenshotIsNotBlank()
    {
        var rendering = BrowserCheck.Render(Html(DistanceUnit.Meters), "desktop-png", 1200, 1800);
        var (_, spread, ink, width, height) = BrowserCheck.Pixels(rendering.Png);
        Assert.Equal((1200, 1800), (width, height));
        Assert.True(spread > MinimumLuminanceSpread, $"luminance spread {spread:F1} looks blank");
        Assert.True(ink > MinimumInkFraction, $"only {ink:P1} of the page differs from the background");
    }

    [ChromiumFact]
    public void PhoneScreenshotIsNotBlank()
    {
        var rendering = BrowserCheck.Render(Html(DistanceUnit.Feet), "phone", 390, 1600);
        var (_, spread, ink, _, _) = BrowserCheck.Pixels(rendering.Png);
        Assert.True(spread > MinimumLuminanceSpread, $"luminance spread {spread:F1} looks blank");
        Assert.True(ink > MinimumInkFraction, $"only {ink:P1} of the page differs from the background");
    }
}
