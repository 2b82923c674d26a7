using CableFault.Analysis;
using CableFault.Reporting;
using CableFault.Reporting.Html;

namespace CableFault.Tests.Report;

/// <summary>Precision, ordering and escaping rules of the report, on hand-made events.</summary>
public class ReportWordingTests
{
    private static LocatedEvent Event(double meters, EventKind kind, double sigma = 0.1) =>
        new(meters, sigma, kind, 0.5, null, null, 0.95, 0);

    [Theory]
    // One significant digit of the σ sets the decimals; a σ starting with 1 keeps two digits (common practice for
    // quoting uncertainties: the last shown digit is the uncertain one).
    [InlineData(0.4, 1)]
    [InlineData(0.04, 2)]
    [InlineData(0.14, 2)]
    [InlineData(2.5, 0)]
    [InlineData(1.2, 1)]
    [InlineData(30, 0)]
    [InlineData(0.0001, 3)]
    public void DecimalsFollowTheUncertainty(double sigma, int decimals) => Assert.Equal(decimals, ReportNumbers.DecimalsFor(sigma));

    [Fact]
    public void HeadlineReadsLikeTheIssueExample()
    {
        var finding = FindingWords.Rank([Event(143.2, EventKind.Open, 0.4)], null).Single();
        Assert.StartsWith("Open at 143.2 m ± 0.4 m from the connector", FindingWords.Headline(finding, DistanceUnit.Meters));
    }

    [Fact]
    public void FaultsComeBeforeTheRecordedEndAndEchoesComeLast()
    {
        var events = new[] { Event(5, EventKind.Inductive), Event(20, EventKind.ImpedanceDrop), Event(40, EventKind.Open), Event(45, EventKind.ImpedanceRise) };
        var ranked = FindingWords.Rank(events, expectedLengthMeters: 40);
        Assert.Equal([2, 1, 3, 4], ranked.Select(f => f.Number));
        Assert.Equal([FindingRole.Attention, FindingRole.Attention, FindingRole.Expected, FindingRole.BeyondEnd], ranked.Select(f => f.Role));
    }

    [Fact]
    public void AnOpenShortOfTheRecordedLengthIsABreak()
    {
        var ranked = FindingWords.Rank([Event(12, EventKind.Inductive), Event(30, EventKind.Open)], expectedLengthMeters: 40);
        Assert.Equal(EventKind.Open, ranked[0].Event.Kind);
        Assert.Equal(FindingRole.Attention, ranked[0].Role);
    }

    [Fact]
    public void MetresInLibraryMessagesBecomeFeet()
    {
        // 0.3048 m is exactly 1 ft (international foot, 1959 agreement); the shown decimals are kept.
        Assert.Equal("blind zone (1.0000 ft); add a lead", ReportNumbers.ConvertMeters("blind zone (0.3048 m); add a lead", DistanceUnit.Feet));
        Assert.Equal("noise 5 mV stays", ReportNumbers.ConvertMeters("noise 5 mV stays", DistanceUnit.Feet));
    }

    [Fact]
    public void EscapeCoversTheFiveSpecialCharacters() =>
        Assert.Equal("&lt;a href=&quot;x&quot; title=&#39;y&#39;&gt;&amp;±é", HtmlText.Escape("<a href=\"x\" title='y'>&±é\u0001"));

    [Fact]
    public void JobFileReportsEveryProblemAtOnce()
    {
        using var stream = new MemoryStream("""{ "site": 3, "vf": 1.5, "expected_length_m": 10, "expected_length_ft": 30, "misspelt": "x" }"""u8.ToArray());
        var error = Assert.Throws<InputException>(() => JobSheetJson.Read(stream, "job.json"));
        Assert.Contains("job.json: 4 problems", error.Message);
        foreach (string field in new[] { "site", "vf", "expected_length_ft", "misspelt" }) Assert.Contains(field, error.Message);
    }

    [Fact]
    public void JobFileLengthInFeetIsStoredInMetres()
    {
        using var stream = new MemoryStream("""{ "expected_length_ft": 100, "instrument": { "name": "unit 2", "averaging": 64 } }"""u8.ToArray());
        var sheet = JobSheetJson.Read(stream, "job.json");
        Assert.Equal(30.48, sheet.ExpectedLengthMeters!.Value, 9);
        Assert.Equal([new("Instrument", "unit 2"), new("averaging", "64")], sheet.Instrument!);
    }
}
