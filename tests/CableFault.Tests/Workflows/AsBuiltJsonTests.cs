using System.Text;
using CableFault.Analysis;
using CableFault.Tests.Cli;
using CableFault.Workflows;

namespace CableFault.Tests.Workflows;

/// <summary>The as-built reader: the shipped demo list reads, and a bad list is refused with every problem and its path.</summary>
public sealed class AsBuiltJsonTests
{
    private static AsBuiltList Read(string json) => AsBuiltJson.Read(new MemoryStream(Encoding.UTF8.GetBytes(json)), "test.json");

    [Fact]
    public void TheDemoListReads()
    {
        string path = Path.Combine(CliRunner.RepositoryRoot(), "traces", "quillon-bay", "mast-feeder.asbuilt.json");
        using var stream = File.OpenRead(path);
        var list = AsBuiltJson.Read(stream, "mast-feeder.asbuilt.json");
        // The layout of traces/quillon-bay/mast-feeder.network.json: a connector pair 12.0 m out, open end at 42.5 m.
        Assert.Equal("QB-01 mast feeder", list.RunId);
        Assert.Equal(2, list.Entries.Count);
        Assert.Equal("connector", list.Entries[0].Kind);
        Assert.Equal(12.0, list.Entries[0].DistanceMeters);
        Assert.Equal(0.5, list.Entries[0].ToleranceMeters);
        Assert.Contains(EventKind.Inductive, list.Entries[0].AcceptedKinds);
        Assert.Equal(42.5, list.Entries[1].DistanceMeters);
        Assert.Equal(1.0, list.Entries[1].ToleranceMeters);
        Assert.Contains(EventKind.Open, list.Entries[1].AcceptedKinds);
    }

    [Fact]
    public void FeetAreConvertedAndEntriesSortedAndTheDefaultToleranceApplies()
    {
        var list = Read("""
            { "schema": "cablefault-asbuilt/1", "features": [
              { "kind": "end", "distance_ft": 100 },
              { "kind": "SPLICE", "distance_m": 3, "label": " S1 ", "tolerance_ft": 1 },
              { "kind": "impedance_drop", "distance_m": 5 } ] }
            """);
        Assert.Equal([3.0, 5.0, 30.48], list.Entries.Select(e => Math.Round(e.DistanceMeters, 6)));
        Assert.Equal("splice", list.Entries[0].Kind);
        Assert.Equal("S1", list.Entries[0].Label);
        Assert.Equal(0.3048, list.Entries[0].ToleranceMeters, 12);
        Assert.Equal(AsBuiltList.DefaultToleranceMeters, list.Entries[1].ToleranceMeters);
        // An event kind listed by name accepts that kind only.
        Assert.Equal([EventKind.ImpedanceDrop], list.Entries[1].AcceptedKinds);
    }

    [Fact]
    public void EveryProblemIsNamedWithItsPathOnOneLine()
    {
        var error = Assert.Throws<InputException>(() => Read("""
            { "schema": "cablefault-asbuilt/1", "colour": "red", "tolerance_m": -1, "features": [
              { "kind": "weld", "distance_m": 3 },
              { "kind": "splice" },
              { "kind": "splice", "distance_m": 4, "distance_ft": 13 },
              { "kind": "tap", "distance_m": "twelve", "lable": "T1" },
              7 ] }
            """));
        string message = error.Message;
        Assert.DoesNotContain('\n', message);
        Assert.StartsWith("test.json: 8 problems", message, StringComparison.Ordinal);
        Assert.Contains("$.colour: unknown field", message, StringComparison.Ordinal);
        Assert.Contains("$.tolerance_m: -1 is out of range", message, StringComparison.Ordinal);
        Assert.Contains("$.features[0].kind: 'weld' is not a feature kind", message, StringComparison.Ordinal);
        Assert.Contains("$.features[1]: 'distance_m' (or 'distance_ft') is missing", message, StringComparison.Ordinal);
        Assert.Contains("$.features[2].distance_ft: give the distance once", message, StringComparison.Ordinal);
        Assert.Contains("$.features[3].lable: unknown field", message, StringComparison.Ordinal);
        Assert.Contains("$.features[3].distance_m: expected a number", message, StringComparison.Ordinal);
        Assert.Contains("$.features[4]: expected an object", message, StringComparison.Ordinal);
    }

    [Fact]
    public void TheSchemaTagIsRequiredAndChecked()
    {
        var missing = Assert.Throws<InputException>(() => Read("""{ "features": [] }"""));
        Assert.Contains("'schema' is missing", missing.Message, StringComparison.Ordinal);
        var wrong = Assert.Throws<InputException>(() => Read("""{ "schema": "cablefault-job/1", "features": [] }"""));
        Assert.Contains("$.schema: 'cablefault-job/1' is not understood", wrong.Message, StringComparison.Ordinal);
        // A run description handed over by mistake is told apart.
        var network = Assert.Throws<InputException>(() => Read("""{ "run": [ { "type": "end", "end": "open" } ] }"""));
        Assert.Contains("'features' is missing", network.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void OversizeAndBrokenFilesAreRefused()
    {
        var big = new StringBuilder("""{ "schema": "cablefault-asbuilt/1", "notes": " """);
        big.Append('x', (int)AsBuiltJson.MaximumBytes).Append("\", \"features\": [] }");
        Assert.Contains("limit", Assert.Throws<InputException>(() => Read(big.ToString())).Message, StringComparison.Ordinal);
        Assert.Contains("limit", Assert.Throws<InputException>(() => AsBuiltJson.Read(new StringReader(big.ToString()), "t.json")).Message, StringComparison.Ordinal);
        Assert.Contains("line 2", Assert.Throws<InputException>(() => Read("{ \"schema\": \"cablefault-asbuilt/1\",\n \"features\": [ { \"kind\" \"end\" } ] }")).Message, StringComparison.Ordinal);
        Assert.Contains("empty", Assert.Throws<InputException>(() => Read("")).Message, StringComparison.Ordinal);
    }

    [Fact]
    public void TheTextReaderGivesTheSameList()
    {
        const string json = """{ "schema": "cablefault-asbuilt/1", "features": [ { "kind": "tap", "distance_m": 7.5, "label": "T1" } ] }""";
        var list = AsBuiltJson.Read(new StringReader(json), "t.json");
        Assert.Equal("tap T1", list.Entries.Single().Name);
        Assert.Equal(7.5, list.Entries.Single().DistanceMeters);
    }
}
