using System.Text.Json;
using CableFault.Networks;
using CableFault.Tests.Cli;
using CableFault.Traces;
using static CableFault.Tests.Comparison.CompareFixtures;

namespace CableFault.Tests.Comparison;

/// <summary><c>cablefault compare</c>: exit codes (DESIGN.md §4: 0 pass, 1 fail, 2 bad input), JSON shape, outputs.</summary>
public class CompareCliTests : IDisposable
{
    private readonly TraceFolder _traces = new("cf-compare-");

    public void Dispose() => _traces.Dispose();

    private string Write(string name, Trace trace) => _traces.Write(name, trace);

    private static CableNetwork WithBump() =>
        Run(Segment(8), new SeriesInductor(4e-9), Segment(12), new SeriesInductor(3e-9), Segment(10), RunEnd.Open);

    private static void AssertOneCleanErrorLine(CliRunner.Result result)
    {
        Assert.Equal(2, result.ExitCode);
        Assert.Single(result.Error.Split('\n', StringSplitOptions.RemoveEmptyEntries), l => !l.StartsWith("warning:"));
        Assert.DoesNotContain("   at ", result.Error);
        Assert.DoesNotContain("Exception", result.Error);
    }

    [Fact]
    public void UnchangedRunPassesWithExitZero()
    {
        string a = Write("a.csv", Capture(Installed(), 1e-3, 1));
        string b = Write("b.csv", Capture(Installed(), 1e-3, 2));
        var result = CliRunner.Run("compare", a, b);
        Assert.True(result.ExitCode == 0, result.Output + result.Error);
        Assert.Contains("verdict: PASS", result.Output);
        Assert.Contains(" m", result.Output);
    }

    [Fact]
    public void SpliceBumpFailsWithExitOneAndJsonDescribesIt()
    {
        string a = Write("a.csv", Capture(Installed(), 1e-3, 1));
        string b = Write("b.csv", Capture(WithBump(), 1e-3, 3));
        var result = CliRunner.Run("compare", a, b, "--format", "json");
        Assert.True(result.ExitCode == 1, result.Output + result.Error);

        using var json = JsonDocument.Parse(result.Output);
        var root = json.RootElement;
        Assert.Equal("fail", root.GetProperty("verdict").GetString());
        Assert.Equal("a.csv", root.GetProperty("baseline").GetString());
        Assert.Equal(0.03, root.GetProperty("tolerances").GetProperty("reflection").GetDouble());
        Assert.Equal(0.25, root.GetProperty("tolerances").GetProperty("distance_m").GetDouble());
        Assert.Equal(0.66, root.GetProperty("vf").GetDouble());
        Assert.NotEmpty(root.GetProperty("reasons").EnumerateArray());
        var events = root.GetProperty("events").EnumerateArray().ToList();
        var bump = Assert.Single(events, e => e.GetProperty("change").GetString() == "new");
        Assert.Equal(20, bump.GetProperty("distance_m").GetDouble(), 0.25);
        Assert.True(bump.GetProperty("exceeds_tolerance").GetBoolean());
        Assert.Equal(JsonValueKind.Null, bump.GetProperty("baseline").ValueKind);
        Assert.Equal(JsonValueKind.Null, bump.GetProperty("shift_m").ValueKind);
        Assert.Equal("inductive", bump.GetProperty("current").GetProperty("kind").GetString());
        var unchanged = events.First(e => e.GetProperty("change").GetString() == "unchanged");
        Assert.Equal(JsonValueKind.Number, unchanged.GetProperty("shift_m").ValueKind);
        Assert.True(root.GetProperty("noise_band").GetDouble() > 0);
    }

    [Fact]
    public void LooserToleranceLetsTheSameBumpPass()
    {
        // The bump's peak is about 0.06 of the step (see RepairCheckTests); a tolerance of 0.1 accepts it.
        string a = Write("a.csv", Capture(Installed(), 1e-3, 1));
        string b = Write("b.csv", Capture(WithBump(), 1e-3, 3));
        var result = CliRunner.Run("compare", a, b, "--tolerance-reflection", "0.1", "--units", "ft");
        Assert.True(result.ExitCode == 0, result.Output + result.Error);
        Assert.Contains(" ft", result.Output);
        Assert.Contains("new:", result.Output);
    }

    [Fact]
    public void DifferentVelocityFactorsAreBadInputUntilOneIsGiven()
    {
        string a = Write("a.csv", Capture(Installed(), 1e-3, 1));
        string b = Write("b.csv", Capture(Installed(), 1e-3, 2).WithMetadata("vf", "0.80"));
        var refused = CliRunner.Run("compare", a, b);
        AssertOneCleanErrorLine(refused);
        Assert.Contains("--vf", refused.Error);
        Assert.Equal(0, CliRunner.Run("compare", a, b, "--vf", "0.66").ExitCode);
    }

    [Fact]
    public void MissingFileAndBadToleranceAreBadInput()
    {
        string a = Write("a.csv", Capture(Installed(), 1e-3, 1));
        AssertOneCleanErrorLine(CliRunner.Run("compare", a, Path.Combine(_traces.Folder, "nope.csv")));
        AssertOneCleanErrorLine(CliRunner.Run("compare", a, a, "--tolerance-distance-m", "-1"));
        AssertOneCleanErrorLine(CliRunner.Run("compare", a));
    }

    [Fact]
    public void PngAndSvgAreWritten()
    {
        string a = Write("a.csv", Capture(Installed(), 1e-3, 1));
        string b = Write("b.csv", Capture(WithBump(), 1e-3, 3));
        string png = Path.Combine(_traces.Folder, "cmp.png"), svg = Path.Combine(_traces.Folder, "cmp.svg");
        var result = CliRunner.Run("compare", a, b, "--png", png, "--svg", svg);
        Assert.Equal(1, result.ExitCode);
        byte[] bytes = File.ReadAllBytes(png);
        Assert.Equal(new byte[] { 0x89, (byte)'P', (byte)'N', (byte)'G' }, bytes[..4]); // PNG signature (ISO/IEC 15948, 5.2)
        Assert.StartsWith("<svg", File.ReadAllText(svg));
        Assert.Contains("noise band", File.ReadAllText(svg));
    }
}
