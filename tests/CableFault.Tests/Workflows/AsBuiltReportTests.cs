using AngleSharp.Dom;
using CableFault.Reporting;
using CableFault.Reporting.Html;
using CableFault.Tests.Report;
using CableFault.Workflows;

namespace CableFault.Tests.Workflows;

/// <summary>
/// The HTML report with an as-built list, read back with AngleSharp. The run is the report fixtures' (a wet section
/// from 25 m to 28 m, open end at 40 m, simulated by the forward model); the list names only the end, so the wet
/// section's two boundaries are the unlisted fault.
/// </summary>
public sealed class AsBuiltReportTests
{
    private static AsBuiltEntry Entry(string kind, double meters, string? label = null)
    {
        Assert.True(AsBuiltKinds.TryAccepted(kind, out var kinds));
        return new AsBuiltEntry(kind, meters, label, AsBuiltList.DefaultToleranceMeters, kinds);
    }

    private static IDocument Render(params AsBuiltEntry[] entries)
    {
        var match = AsBuiltMatcher.Match(ReportFixtures.Result, new AsBuiltList(entries));
        var input = ReportFixtures.Input(DistanceUnit.Meters) with { AsBuilt = match, AsBuiltName = "yard-run.asbuilt.json" };
        return ReportFixtures.Parse(HtmlReport.Render(input));
    }

    private static List<(double Distance, string Kind, string AsBuilt)> Rows(IDocument document) =>
        document.QuerySelectorAll("table.events tbody tr").Select(row =>
            (double.Parse(row.QuerySelectorAll("td")[1].TextContent, System.Globalization.CultureInfo.InvariantCulture),
             row.QuerySelector("td .kind")!.TextContent,
             row.QuerySelector("td.as-built")!.TextContent.Trim())).ToList();

    [Fact]
    public void TheUnlistedFaultIsMarkedAndNamedFirst()
    {
        var document = Render(Entry("end", ReportFixtures.OpenMeters, "far box"));
        var rows = Rows(document);
        Assert.Equal("As built", document.QuerySelectorAll("table.events thead th").Last().TextContent);
        var drop = rows.Single(r => r.Kind == "Impedance drop");
        Assert.Equal("UNEXPECTED", drop.AsBuilt);
        Assert.InRange(drop.Distance, ReportFixtures.DropMeters - 1.5, ReportFixtures.DropMeters + 1.5);
        var open = rows.First(r => r.Kind == "Open");
        Assert.Equal("expected: end (far box) at 40.0 m", open.AsBuilt);

        string headline = document.QuerySelector(".summary .headline")!.TextContent;
        Assert.StartsWith("Unexpected: impedance drop", headline, StringComparison.Ordinal);
        Assert.Contains("not on the as-built list", headline, StringComparison.Ordinal);
        var summary = document.QuerySelector(".summary")!;
        // The listed end is mentioned after the unexpected events, as a count.
        Assert.Contains("1 listed feature found as expected: end (far box)", summary.QuerySelector(".as-built-found")!.TextContent, StringComparison.Ordinal);
        Assert.DoesNotContain(summary.QuerySelectorAll(".others li"), li => li.TextContent.Contains("Open", StringComparison.Ordinal));
        Assert.Contains("How the distances were found: single-ended, VF 0.660 from the trace file", document.QuerySelector(".method")!.TextContent, StringComparison.Ordinal);
    }

    [Fact]
    public void AListedFeatureThatIsNotThereIsNamed()
    {
        var document = Render(Entry("splice", 10, "S1"), Entry("end", ReportFixtures.OpenMeters));
        var missing = document.QuerySelector(".summary .as-built-missing")!.TextContent;
        Assert.Contains("splice S1 listed at 10.0 m", missing, StringComparison.Ordinal);
        Assert.Contains("not found within its tolerance", missing, StringComparison.Ordinal);
    }

    [Fact]
    public void WhenEverythingIsListedNothingIsUnexpected()
    {
        // List the wet section's two boundaries as cable changes too: then the list explains every event.
        var document = Render(Entry("cable_change", ReportFixtures.DropMeters), Entry("cable_change", ReportFixtures.RiseMeters),
            Entry("end", ReportFixtures.OpenMeters));
        var rows = Rows(document);
        Assert.All(rows.Where(r => r.Distance < ReportFixtures.OpenMeters + 1), r => Assert.StartsWith("expected", r.AsBuilt, StringComparison.Ordinal));
        Assert.StartsWith("Nothing unexpected", document.QuerySelector(".summary .headline")!.TextContent, StringComparison.Ordinal);
        Assert.Contains(" calm", " " + document.QuerySelector(".summary")!.ClassName, StringComparison.Ordinal);
    }
}
