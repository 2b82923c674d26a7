using CableFault.Analysis;
using CableFault.Cables;
using CableFault.Networks;
using CableFault.Reporting;
using CableFault.Reporting.Locate;
using MathNet.Numerics;
using static CableFault.Tests.Analysis.Locate.LocateFixtures;

namespace CableFault.Tests.Analysis.Locate;

/// <summary>
/// On a thin lossy cable an echo from far away settles over microseconds (skin effect), and the fit window must reach
/// past it: the level it settles to is what tells a short through the run's resistance from a mere change of line.
/// </summary>
public class LossyEchoWindowTests
{
    /// <summary>The built-in RG-174 (29 dB/100 m at 100 MHz and 100 at 1 GHz: typical data-sheet figures, from memory).</summary>
    private static readonly CableLossModel MiniatureCoaxLoss = CableLibrary.BuiltIn.Get("RG-174").Medium.Loss;

    private static CableSegment Lossy(double meters) => new(meters, new CableMedium(ImpedanceOhms, VelocityFactor, MiniatureCoaxLoss));

    /// <summary>The half-settling time is where the skin-effect step response erfc(a/(2√t)) of a line with loss e^(−a√s)
    /// reaches one half (the inverse Laplace transform of e^(−a√s)/s; e.g. Abramowitz and Stegun, Handbook of Mathematical
    /// Functions, 29.3.83); erfc from MathNet as the independent reference.</summary>
    [Theory]
    [InlineData(100.0)]
    [InlineData(1000.0)]
    public void TheWindowsTailIsTenHalfSettlingTimesOfTheSkinEffectStep(double meters)
    {
        double v = VelocityFactor * 299_792_458.0, roundTrip = 2 * meters / v;
        double a = MiniatureCoaxLoss.SkinLossNepersPerMeterPerRootHertz * 2 * meters / Math.Sqrt(Math.PI);
        double halfSeconds = Locator.LossySettlingSeconds(MiniatureCoaxLoss, v, roundTrip) / Locator.LossySettlingTimes;
        Assert.InRange(SpecialFunctions.Erfc(a / (2 * Math.Sqrt(halfSeconds))), 0.499, 0.501);
        Assert.Equal(0, Locator.LossySettlingSeconds(null, v, roundTrip));
    }

    [Fact]
    public void ASpliceAndAShortFarDownAThinLossyRunAreFoundWithTheLossTold()
    {
        // A 6 Ω series resistance (a corroded splice) at 60 m and a short at 120 m, whose echo settles over microseconds.
        var network = Run(Lossy(60), new SeriesResistor(6), Lossy(60), RunEnd.Short);
        var result = Locator.Locate(Simulate(network, noiseVolts: 2e-4), Options() with { Loss = MiniatureCoaxLoss });
        string found = Describe(result) + " | " + result.Fit.Message + " | " + string.Join(" | ", result.Warnings);
        Assert.True(result.Events.Count == 2, $"expected the splice and the short, found: {found}");
        Assert.True(result.Events[0].Kind == EventKind.SeriesResistance, found);
        Assert.InRange(result.Events[0].DistanceMeters, 60 - DistanceTolerance(60), 60 + DistanceTolerance(60));
        Assert.True(result.Events[1].Kind == EventKind.Short, found);
        Assert.InRange(result.Events[1].DistanceMeters, 120 - DistanceTolerance(120), 120 + DistanceTolerance(120));
    }

    /// <summary>With only VF and Z₀ given, the loss is estimated after the window was drawn: the window must then be
    /// drawn again past the last echo's settling, and the short found where it is. The estimate's skin part comes out
    /// below the data sheet's (here about 60 %; t₅₀ goes as its square), so the check is a quarter of the data-sheet tail:
    /// far above the lossless window's 24 rise times after the echo (3 % of it).</summary>
    /// <remarks>The splice is only required to be seen near its place, not read as a series resistance: with the loss
    /// estimated, how it is read turns on the noise. Over noise seeds 1–8 of this run (`simulate --noise-mv 0.2`, the
    /// native build) the fitter read it as a step of impedance, or added an event, on seeds 1, 3 and 8; the fitter before
    /// the Gauss–Newton products were carried through the secant updates did so on seeds 2, 3 and 8 (and spent two
    /// minutes on seed 1). A known weakness of locating without the cable's loss, not of the window.</remarks>
    [Fact]
    public void WithTheLossEstimatedTheWindowStillReachesPastTheShortsSettling()
    {
        var network = Run(Lossy(60), new SeriesResistor(6), Lossy(60), RunEnd.Short);
        var result = Locator.Locate(Simulate(network, noiseVolts: 2e-4), Options() with { EstimateLoss = true });
        string found = Describe(result) + " | " + result.Fit.Message;
        Assert.True(result.Events.Count >= 2 && result.Events[^1].Kind == EventKind.Short, found);
        Assert.InRange(result.Events[^1].DistanceMeters, 120 - DistanceTolerance(120), 120 + DistanceTolerance(120));
        Assert.Contains(result.Events, e => Math.Abs(e.DistanceMeters - 60) < 1);
        double v = VelocityFactor * 299_792_458.0, shortRoundTrip = 2 * 120 / v;
        double tail = Locator.LossySettlingSeconds(MiniatureCoaxLoss, v, shortRoundTrip);
        Assert.True(result.ModelTrace!.EndTimeSeconds >= shortRoundTrip + tail / 4,
            $"window ends {result.ModelTrace.EndTimeSeconds * 1e9:0} ns; the short's echo at {shortRoundTrip * 1e9:0} ns settles over {tail * 1e9:0} ns");
    }

    /// <summary>
    /// An empty event list must not be worded as a sound run when the level says otherwise. At 1 mV of noise a thin
    /// resistive run's short is smeared below the detector's one-rise-time box (no candidate at all, today) while the
    /// level falls by half the step: whatever is found, the text may not call the run uniform and matched. A plain
    /// matched line, which is, still gets that wording.
    /// </summary>
    [Fact]
    public void AnUnexplainedTraceIsNotCalledUniformAndMatched()
    {
        // A miniature coax with 0.3 Ω/m of loop resistance besides its skin loss (from memory, typical of 0.5 mm cores).
        var loss = CableLossModel.FromDatasheet(29, 100e6, dcResistanceOhmsPerMeter: 0.3);
        CableSegment Resistive(double meters) => new(meters, new CableMedium(ImpedanceOhms, VelocityFactor, loss));
        var lossy = Locator.Locate(Simulate(Run(Resistive(60), new SeriesResistor(6), Resistive(60), RunEnd.Short)), Options() with { Loss = loss });
        string lossyText = LocateText.Render(lossy, "lossy.csv", DistanceUnit.Meters);
        Assert.DoesNotContain("looks uniform and matched", lossyText);
        Assert.True(lossy.Events.Count > 0 || lossy.LeavesTraceUnexplained || lossy.LevelMovesWithoutEvent, Describe(lossy));

        var matched = Locator.Locate(Simulate(Run(Segment(50), RunEnd.Matched)), Options());
        Assert.Empty(matched.Events);
        Assert.False(matched.LeavesTraceUnexplained || matched.LevelMovesWithoutEvent, string.Join(" | ", matched.Warnings));
        Assert.Contains("looks uniform and matched", LocateText.Render(matched, "matched.csv", DistanceUnit.Meters));
    }
}
