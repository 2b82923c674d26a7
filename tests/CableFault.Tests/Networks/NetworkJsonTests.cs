using System.Text;
using CableFault.Cables;
using CableFault.Networks;

namespace CableFault.Tests.NetworkFiles;

public class NetworkJsonTests
{
    private static CableNetwork Read(string json) =>
        NetworkJson.Read(new MemoryStream(Encoding.UTF8.GetBytes(json)), "run.json", CableLibrary.BuiltIn);

    [Fact]
    public void ReadsEveryElementKind()
    {
        var network = Read("""
        { "name": "demo", "run": [
          { "type": "segment", "length_m": 10, "cable": "RG-58", "label": "first" },
          { "type": "shunt_c", "capacitance_pf": 5 },
          { "type": "series_l", "inductance_nh": 20 },
          { "type": "shunt_r", "resistance_ohms": 200 },
          { "type": "series_r", "resistance_ohms": 2 },
          { "type": "segment", "length_ft": 10, "z0_ohms": 75, "vf": 0.8, "loss": [ { "mhz": 100, "db_per_100m": 7 } ] },
          { "type": "junction", "branches": [
            [ { "type": "segment", "length_m": 3, "cable": "RG-58" }, { "type": "end", "end": "open" } ],
            [ { "type": "segment", "length_m": 4, "cable": "RG-58" }, { "type": "end", "end": "rc", "resistance_ohms": 75, "capacitance_pf": 10 } ] ] } ] }
        """);
        var elements = network.Run.Elements;
        Assert.Equal("demo", network.Name);
        Assert.Equal(7, elements.Count);
        Assert.Equal("first", elements[0].Label);
        Assert.Equal(5e-12, ((ShuntCapacitor)elements[1]).CapacitanceFarads, 1e-24);
        Assert.Equal(20e-9, ((SeriesInductor)elements[2]).InductanceHenries, 1e-21);
        Assert.Equal(3.048, ((CableSegment)elements[5]).LengthMeters, 12); // 1 ft = 0.3048 m exactly
        var junction = (Junction)elements[6];
        Assert.Equal(2, junction.Branches.Count);
        var rc = (RunEnd)junction.Branches[1].Elements[1];
        Assert.Equal(EndKind.ResistorParallelCapacitor, rc.Kind);
    }

    [Fact]
    public void ReportsEveryProblemAtOnceWithItsPlace()
    {
        var error = Assert.Throws<InputException>(() => Read("""
        { "run": [
          { "type": "segment", "length_m": -3, "cable": "RG-58" },
          { "type": "segment", "length_m": 5, "cable": "NOPE" },
          { "type": "shunt_c", "capacitance_pf": "lots" },
          { "type": "wormhole" },
          { "type": "junction", "branches": [ [ { "type": "segment", "length_m": 2, "cable": "RG-58" } ] ] } ] }
        """));
        string message = error.Message;
        Assert.DoesNotContain('\n', message);
        Assert.Contains("run[0].length_m", message);
        Assert.Contains("NOPE", message);
        Assert.Contains("run[2].capacitance_pf", message);
        Assert.Contains("wormhole", message);
    }

    [Fact]
    public void BranchWithoutEndIsReported()
    {
        var error = Assert.Throws<InputException>(() => Read("""{ "run": [ { "type": "segment", "length_m": 5, "cable": "RG-58" } ] }"""));
        Assert.Contains("does not finish with an end", error.Message);
    }

    [Fact]
    public void BadJsonNamesTheLine()
    {
        var error = Assert.Throws<InputException>(() => Read("{\n \"run\": [\n { \"type\": \"end\" \"end\": \"open\" } ] }"));
        Assert.Contains("line 3", error.Message);
    }

    [Fact]
    public void InlineCableTypesCanBeDefined()
    {
        var network = Read("""
        { "cables": [ { "designation": "YARD-COAX", "z0_ohms": 93, "vf": 0.84 } ],
          "run": [ { "type": "segment", "length_m": 5, "cable": "yard-coax" }, { "type": "end", "end": "short" } ] }
        """);
        var segment = (CableSegment)network.Run.Elements[0];
        Assert.Equal(93, segment.Medium.ImpedanceOhms);
        Assert.Equal("YARD-COAX", segment.CableDesignation);
    }

    [Fact]
    public void EmptyFileIsAClearError()
    {
        var error = Assert.Throws<InputException>(() => Read(""));
        Assert.Contains("empty", error.Message);
    }

    [Fact]
    public void DeeplyNestedJunctionsAreRefusedNotOverflowed()
    {
        var json = new StringBuilder("{\"run\":");
        const int depth = 70; // deeper than the 64 allowed, shallower than the JSON parser's own limit
        for (int i = 0; i < depth; i++) json.Append("[{\"type\":\"junction\",\"branches\":[");
        json.Append("[{\"type\":\"end\",\"end\":\"open\"}]");
        for (int i = 0; i < depth; i++) json.Append("]}]");
        json.Append('}');
        var error = Assert.Throws<InputException>(() => Read(json.ToString()));
        Assert.Contains("nested", error.Message);
    }
}
