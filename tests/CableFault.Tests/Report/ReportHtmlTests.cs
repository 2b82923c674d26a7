using System.Globalization;
using System.Text.RegularExpressions;
using AngleSharp.Dom;
using CableFault.Reporting;
using CableFault.Reporting.Html;

namespace CableFault.Tests.Report;

/// <summary>The rendered report, read back with a real HTML5 parser (AngleSharp): numbers, rows, escaping.</summary>
public class ReportHtmlTests
{
    /// <summary>
    /// How far a reported distance may sit from the network's true one: three of the report's own 1-σ figures (a
    /// 3σ miss is a 0.3 % event for a Gaussian error) plus half of the last shown digit (the rounding of the display).
    /// </summary>
    private const double SigmasAllowed = 3;

    /// <summary>Relative tolerance on the measured rise time of the simulated 1 ns edge: IEEE 181 10–90 % reading on
    /// a noisy, sampled edge (125 ps samples, 1 mV noise) lands within a few per cent.</summary>
    private const double RiseTolerance = 0.05;

    /// <summary>How close a listed change must be to the boundary that made it: the located events sit within a few
    /// centimetres of the truth here (0.5 m σ is almost all VF uncertainty, which both traces share).</summary>
    private const double ChangeWindowMeters = 0.5;

    private static IDocument Render(DistanceUnit unit, JobSheet? job = null, RepairCheckPart? repair = null) =>
        ReportFixtures.Parse(HtmlReport.Render(ReportFixtures.Input(unit, job, repair)));

    private static List<(double Distance, double Sigma, string Kind, string Status)> Rows(IDocument document) =>
        document.QuerySelectorAll("table.events tbody tr").Select(row =>
        {
            var cells = row.QuerySelectorAll("td").Select(c => c.TextContent.Trim()).ToArray();
            return (double.Parse(cells[1], CultureInfo.InvariantCulture), double.Parse(cells[2], CultureInfo.InvariantCulture),
                row.QuerySelector("td .kind")!.TextContent, cells[7]);
        }).ToList();

    private static void AssertNear(double trueMeters, DistanceUnit unit, (double Distance, double Sigma, string Kind, string Status) row)
    {
        string shown = row.Distance.ToString(CultureInfo.InvariantCulture);
        int decimals = shown.Contains('.') ? shown.Length - shown.IndexOf('.') - 1 : 0;
        double slack = SigmasAllowed * row.Sigma + 0.5 * Math.Pow(10, -decimals);
        Assert.InRange(row.Distance, unit.FromMeters(trueMeters) - slack, unit.FromMeters(trueMeters) + slack);
    }

    [Fact]
    public void EventTableHasTheNetworksBoundariesInMetres()
    {
        var rows = Rows(Render(DistanceUnit.Meters));
        var drop = rows.Single(r => r.Kind == "Impedance drop");
        var rise = rows.Single(r => r.Kind == "Impedance rise" && Math.Abs(r.Distance - ReportFixtures.RiseMeters) < 1.5);
        var open = rows.First(r => r.Kind == "Open");
        AssertNear(ReportFixtures.DropMeters, DistanceUnit.Meters, drop);
        AssertNear(ReportFixtures.RiseMeters, DistanceUnit.Meters, rise);
        AssertNear(ReportFixtures.OpenMeters, DistanceUnit.Meters, open);
        // Rows are numbered nearest first.
        Assert.True(rows.Zip(rows.Skip(1)).All(p => p.First.Distance <= p.Second.Distance));
    }

    [Fact]
    public void SummaryPutsTheFaultFirstWhenTheRunLengthIsOnRecord()
    {
        var document = Render(DistanceUnit.Meters, new JobSheet(ExpectedLengthMeters: ReportFixtures.OpenMeters));
        string headline = document.QuerySelector(".summary .headline")!.TextContent;
        // The wet section is the fault; the open at the recorded length is the run's end.
        Assert.StartsWith("Impedance drop", headline);
        var match = Regex.Match(headline, @"at (\d+\.?\d*) m ± (\d+\.?\d*) m from the connector");
        Assert.True(match.Success, headline);
        double distance = double.Parse(match.Groups[1].Value, CultureInfo.InvariantCulture);
        double sigma = double.Parse(match.Groups[2].Value, CultureInfo.InvariantCulture);
        Assert.InRange(distance, ReportFixtures.DropMeters - SigmasAllowed * sigma - 0.05, ReportFixtures.DropMeters + SigmasAllowed * sigma + 0.05);
        var open = Rows(document).First(r => r.Kind == "Open");
        Assert.Equal("run end, as recorded", open.Status);
    }

    [Fact]
    public void FeetAreUsedEverywhere()
    {
        var document = Render(DistanceUnit.Feet, new JobSheet(ExpectedLengthMeters: ReportFixtures.OpenMeters));
        var rows = Rows(document);
        AssertNear(ReportFixtures.DropMeters, DistanceUnit.Feet, rows.Single(r => r.Kind == "Impedance drop"));
        AssertNear(ReportFixtures.OpenMeters, DistanceUnit.Feet, rows.First(r => r.Kind == "Open"));
        string text = document.Body!.TextContent;
        // No distance in metres anywhere in the visible text: a number followed by the metre symbol.
        Assert.DoesNotMatch(new Regex(@"\d\s?m\b"), text);
        Assert.Contains("Distance (ft)", text);
        Assert.Contains("dB/100 ft", text.Contains("dB/100") ? text : "dB/100 ft");
    }

    [Fact]
    public void UserTextIsEscapedAndShownAsText()
    {
        string html = HtmlReport.Render(ReportFixtures.Input(DistanceUnit.Meters,
            new JobSheet(Technician: "<img src=x onerror=alert(2)>", Notes: "</style><b>bold?</b>",
                Instrument: [new("<i>label</i>", "\"quoted\" & 'single'")])));
        var document = ReportFixtures.Parse(html);
        Assert.Empty(document.QuerySelectorAll("script"));
        Assert.Empty(document.QuerySelectorAll("img[onerror], b, i"));
        Assert.Equal(ReportFixtures.HostileRunId, document.QuerySelector("h1")!.TextContent);
        Assert.Contains(ReportFixtures.HostileRunId, document.Title);
        string body = document.Body!.TextContent;
        Assert.Contains("<img src=x onerror=alert(2)>", body);
        Assert.Contains("</style><b>bold?</b>", body);
        Assert.Contains("\"quoted\" & 'single'", body);
        Assert.Single(document.QuerySelectorAll("style"));
    }

    [Fact]
    public void DocumentIsSelfContained()
    {
        var document = Render(DistanceUnit.Meters);
        Assert.Empty(document.QuerySelectorAll("script, link, iframe, object, embed"));
        foreach (var element in document.QuerySelectorAll("[src], [href]"))
        {
            string url = element.GetAttribute("src") ?? element.GetAttribute("href") ?? "";
            Assert.True(url.StartsWith("data:", StringComparison.Ordinal) || url.StartsWith('#'), $"external reference: {url[..Math.Min(60, url.Length)]}");
        }
        string css = document.QuerySelector("style")!.TextContent;
        Assert.DoesNotContain("url(", css);
        Assert.DoesNotContain("@import", css);
        Assert.Contains("@page", css);
        Assert.Contains("@media print", css);
        Assert.NotNull(document.QuerySelector("meta[name=viewport]"));
        // The figure is there, as an SVG that parses.
        string src = document.QuerySelector("figure img")!.GetAttribute("src")!;
        Assert.StartsWith("data:image/svg+xml;base64,", src);
        var svg = System.Xml.Linq.XDocument.Parse(System.Text.Encoding.UTF8.GetString(Convert.FromBase64String(src["data:image/svg+xml;base64,".Length..])));
        Assert.Equal("svg", svg.Root!.Name.LocalName);
    }

    [Fact]
    public void SettingsMethodAndCautionsArePresent()
    {
        var document = Render(DistanceUnit.Meters);
        string settings = document.QuerySelector("dl.settings")!.TextContent;
        Assert.Contains("0.660 ± 2 % (1σ), from the trace file", settings);
        Assert.Contains("50 Ω, from the trace file", settings);
        // Rise time measured on the trace: the simulation used 1 ns (10–90 %).
        var rise = Regex.Match(settings, @"Rise time \(10–90 %, measured\)\s*(\d+\.?\d*) (ps|ns)");
        Assert.True(rise.Success, settings);
        double riseSeconds = double.Parse(rise.Groups[1].Value, CultureInfo.InvariantCulture) * (rise.Groups[2].Value == "ps" ? 1e-12 : 1e-9);
        Assert.InRange(riseSeconds, 1e-9 * (1 - RiseTolerance), 1e-9 * (1 + RiseTolerance));
        string text = document.Body!.TextContent;
        Assert.Contains("δd/d = δVF/VF", text);
        Assert.Contains("de-energised", text);
        Assert.Contains("lock-out", text);
        Assert.Contains("local codes and licensed practice", text);
    }

    [Fact]
    public void JobHeaderTakesTheTraceMetadataWhenNothingElseIsGiven()
    {
        var document = Render(DistanceUnit.Meters);
        var fields = document.QuerySelectorAll(".job > div").ToDictionary(d => d.QuerySelector("dt")!.TextContent, d => d.QuerySelector("dd")!.TextContent);
        Assert.Equal("Test yard 3", fields["Site"]);
        Assert.Equal("A. Tester", fields["Technician"]);
        Assert.Equal("2031-04-05T09:15", fields["Measured"]);
        Assert.Equal("not recorded", fields["Cable type"]);
    }

    [Fact]
    public void MissingRepairCheckSaysSo()
    {
        var document = Render(DistanceUnit.Meters, repair: new RepairCheckPart("before.csv", null, "not in this build"));
        var section = document.QuerySelector("#repair")!;
        Assert.Contains("not available", document.Body!.TextContent);
        Assert.Contains("before.csv", document.Body!.TextContent);
        Assert.Null(Render(DistanceUnit.Meters).QuerySelector("#repair"));
        Assert.NotNull(section);
    }

    [Fact]
    public void RepairCheckShowsTheVerdictAndTheChangesWhereTheWaterGotIn()
    {
        var document = Render(DistanceUnit.Meters, repair: new RepairCheckPart("before.csv", ReportFixtures.Comparison));
        Assert.Equal("Verdict: FAIL — the run differs from its baseline beyond the tolerances below.", document.QuerySelector(".verdict")!.TextContent);
        Assert.StartsWith("Repair check: FAIL.", document.QuerySelector(".summary .repair-line")!.TextContent);
        var failing = document.QuerySelectorAll("table.changes tbody tr.attention")
            .Select(r => double.Parse(r.QuerySelectorAll("td")[1].TextContent, CultureInfo.InvariantCulture)).ToList();
        // The baseline has no boundary at 25 m or 28 m (the network built in the fixture): both are new there.
        Assert.Contains(failing, d => Math.Abs(d - ReportFixtures.DropMeters) < ChangeWindowMeters);
        Assert.Contains(failing, d => Math.Abs(d - ReportFixtures.RiseMeters) < ChangeWindowMeters);
        Assert.Equal(2, document.QuerySelectorAll("figure img").Length);
    }
}
