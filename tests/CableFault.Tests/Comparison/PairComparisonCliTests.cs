using System.Text.Json;
using CableFault.Comparison;
using CableFault.Networks;
using CableFault.Tests.Cli;
using CableFault.Traces;
using static CableFault.Tests.Comparison.PairComparisonFixtures;

namespace CableFault.Tests.Comparison;

/// <summary><c>cablefault compare REFERENCE SUSPECT --reference-kind pair</c>: exit codes (DESIGN.md §4), the JSON
/// additions, the wording, and explicit tolerances over the pair defaults.</summary>
public class PairComparisonCliTests : IDisposable
{
    /// <summary>The other healthy pair: Z0 3 % higher, VF 1.5 % lower than the reference pair (see PairComparisonTests).</summary>
    private const double OtherOhms = NominalOhms * 1.03, OtherVelocityFactor = NominalVelocityFactor * (1 - 0.015);

    /// <summary>Fitted length difference against VF_ref/VF_other − 1 = 1.52 %, in percentage points: 0.2 (the library
    /// test's 0.002, for the same reasons).</summary>
    private const double LengthDifferenceTolerancePct = 0.2;

    private readonly TraceFolder _traces = new("cf-pair-");

    public void Dispose() => _traces.Dispose();

    private string Write(string name, Trace trace) => _traces.Write(name, trace);

    private string Reference() => Write("pair1.csv", Capture(Pair(NominalOhms, NominalVelocityFactor, rippleSeed: 1), 1e-3, 11, "pair 1"));

    private string Healthy() => Write("pair2.csv", Capture(Pair(OtherOhms, OtherVelocityFactor, rippleSeed: 2), 1.5e-3, 12, "pair 2"));

    [Fact]
    public void HealthyPairPassesAndJsonCarriesTheSpread()
    {
        var result = CliRunner.Run("compare", Reference(), Healthy(), "--reference-kind", "pair", "--format", "json");
        Assert.True(result.ExitCode == 0, result.Output + result.Error);
        using var json = JsonDocument.Parse(result.Output);
        var root = json.RootElement;
        Assert.Equal("pair", root.GetProperty("reference_kind").GetString());
        Assert.Equal("pass", root.GetProperty("verdict").GetString());
        Assert.Equal(CompareTolerances.PairReflection, root.GetProperty("tolerances").GetProperty("reflection").GetDouble());
        Assert.Equal(CompareTolerances.PairDistanceFraction * 100, root.GetProperty("tolerances").GetProperty("distance_pct").GetDouble(), 1e-9);
        var pair = root.GetProperty("pair");
        Assert.True(pair.GetProperty("length_fitted").GetBoolean());
        double expectedPct = (NominalVelocityFactor / OtherVelocityFactor - 1) * 100;
        Assert.Equal(expectedPct, pair.GetProperty("length_difference_pct").GetDouble(), LengthDifferenceTolerancePct);
        // Z0 3 % above the reference pair's; the ripple of the first piece (±1 % each) is what the step sees.
        Assert.InRange(pair.GetProperty("z0_offset_pct").GetDouble(), 3 - 2 * RippleFraction * 100 - 0.5, 3 + 2 * RippleFraction * 100 + 0.5);
        Assert.Equal(JsonValueKind.Null, root.GetProperty("first_difference_m").ValueKind);
    }

    /// <summary>
    /// With feet asked for, the warnings speak feet too: the length fit's "around X" point is the metre figure over
    /// 0.3048 m/ft (the international foot, exact by definition), to the two decimals printed, and no warning (the
    /// comparison's own or the locator's, passed on) names a distance in metres.
    /// </summary>
    [Fact]
    public void WarningsGiveTheirDistancesInFeetWhenAsked()
    {
        string reference = Reference(), healthy = Healthy();
        var inMeters = CliRunner.Run("compare", reference, healthy, "--reference-kind", "pair");
        var inFeet = CliRunner.Run("compare", reference, healthy, "--reference-kind", "pair", "--units", "ft");
        Assert.True(inFeet.ExitCode is 0 or 1, inFeet.Output + inFeet.Error);

        double meters = StretchPoint(inMeters.Error, "m"), feet = StretchPoint(inFeet.Error, "ft");
        Assert.InRange(feet, meters / 0.3048 - 0.02, meters / 0.3048 + 0.02);
        Assert.DoesNotMatch(@"\d m\b", inFeet.Error);
    }

    /// <summary>The point the current trace was lined up around, from the length fit's warning, in <paramref name="unit"/>.</summary>
    private static double StretchPoint(string error, string unit)
    {
        var match = System.Text.RegularExpressions.Regex.Match(error, @"around ([0-9.]+) " + unit + @" \(electrical length");
        Assert.True(match.Success, $"no length-fit warning in {unit}: {error}");
        return double.Parse(match.Groups[1].Value, System.Globalization.CultureInfo.InvariantCulture);
    }

    [Fact]
    public void DefaultKindIsBaselineAndItsJsonHasNoPairBlock()
    {
        var result = CliRunner.Run("compare", Reference(), Healthy(), "--format", "json");
        Assert.True(result.ExitCode is 0 or 1, result.Output + result.Error);
        using var json = JsonDocument.Parse(result.Output);
        Assert.Equal("baseline", json.RootElement.GetProperty("reference_kind").GetString());
        Assert.Equal(JsonValueKind.Null, json.RootElement.GetProperty("pair").ValueKind);
        Assert.Equal(CompareTolerances.DefaultReflection, json.RootElement.GetProperty("tolerances").GetProperty("reflection").GetDouble());
    }

    [Fact]
    public void ExplicitToleranceOptionsWinAndTheWordingNamesTheReferencePair()
    {
        // No stretch and a fixed 0.25 m: the healthy pair's end, 1.2 m further electrically, now fails.
        string svg = Path.Combine(_traces.Folder, "pair.svg");
        var result = CliRunner.Run("compare", Reference(), Healthy(), "--reference-kind", "pair",
            "--tolerance-length-pct", "0", "--tolerance-distance-pct", "0", "--svg", svg);
        Assert.True(result.ExitCode == 1, result.Output + result.Error);
        Assert.Contains("pair check: pair2.csv against reference pair pair1.csv", result.Output);
        Assert.Contains("verdict: FAIL — differs from the reference pair", result.Output);
        Assert.Contains("length ±0 %", result.Output);
        Assert.Contains("against reference pair pair1.csv", File.ReadAllText(svg));
    }

    [Fact]
    public void LeakingPairFailsWithExitOneAndItsFirstDifferenceIsTheLeak()
    {
        const double leakMeters = 30;
        string suspect = Write("pair3.csv", Capture(Pair(OtherOhms, OtherVelocityFactor, rippleSeed: 2, new ShuntResistor(500), leakMeters), 1.5e-3, 14, "pair 3"));
        var result = CliRunner.Run("compare", Reference(), suspect, "--reference-kind", "pair", "--format", "json");
        Assert.True(result.ExitCode == 1, result.Output + result.Error);
        using var json = JsonDocument.Parse(result.Output);
        var root = json.RootElement;
        Assert.Equal("fail", root.GetProperty("verdict").GetString());
        double tolerance = Math.Max(CompareTolerances.DefaultDistanceMeters, CompareTolerances.PairDistanceFraction * leakMeters);
        Assert.Equal(leakMeters, root.GetProperty("first_difference_m").GetDouble(), tolerance);
    }

    [Fact]
    public void ReportCarriesThePairCheck()
    {
        string suspect = Write("pair3.csv", Capture(Pair(OtherOhms, OtherVelocityFactor, rippleSeed: 2, new ShuntResistor(500), 30), 1.5e-3, 14, "pair 3"));
        string html = Path.Combine(_traces.Folder, "pair3.html");
        var result = CliRunner.Run("report", suspect, "--baseline", Reference(), "--reference-kind", "pair", "-o", html);
        Assert.True(result.ExitCode == 1, result.Output + result.Error); // the report is written; the check inside it failed
        string text = File.ReadAllText(html);
        Assert.Contains("Pair check against a reference pair", text);
        Assert.Contains("Verdict: FAIL — the pair differs from the reference pair", text);
        Assert.Contains("Pair spread against the reference pair: electrical length +1.5", text);
    }

    [Fact]
    public void UnknownReferenceKindAndOutOfRangeAllowancesAreUsageErrors()
    {
        Assert.Equal(2, CliRunner.Run("compare", "a.csv", "b.csv", "--reference-kind", "neighbour").ExitCode);
        string reference = Reference();
        var result = CliRunner.Run("compare", reference, reference, "--reference-kind", "pair", "--tolerance-length-pct", "50");
        Assert.Equal(2, result.ExitCode);
        Assert.Contains("--tolerance-length-pct", result.Error);
        Assert.DoesNotContain("Exception", result.Error);
    }
}
