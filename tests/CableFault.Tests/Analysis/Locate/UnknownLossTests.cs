using CableFault.Analysis;
using CableFault.Cables;
using CableFault.Networks;
using static CableFault.Tests.Analysis.Locate.LocateFixtures;

namespace CableFault.Tests.Analysis.Locate;

/// <summary>
/// A lossy run located with only VF and Z₀ known: the fit estimates the loss instead of inventing events to explain the
/// rounded edges and the DC-resistance slope. Ground truth is the simulated network.
/// </summary>
public class UnknownLossTests
{
    /// <summary>16 dB/100 m at 100 MHz, all skin effect, and 0.04 Ω/m loop resistance: a thin 50 Ω coax (typical data-sheet
    /// figures, from memory).</summary>
    private static readonly CableLossModel ThinCoaxLoss = CableLossModel.FromDatasheet(16, 100e6, dcResistanceOhmsPerMeter: 0.04);

    private static CableSegment Lossy(double meters) => new(meters, new CableMedium(ImpedanceOhms, VelocityFactor, ThinCoaxLoss));

    [Fact]
    public void ASpliceAndAShortAreFoundWithoutInventedEvents()
    {
        // A 6 Ω series resistance (a corroded splice) at 60 m and a short at 120 m.
        var network = Run(Lossy(60), new SeriesResistor(6), Lossy(60), RunEnd.Short);
        var result = Locator.Locate(Simulate(network), Options() with { EstimateLoss = true });
        string found = string.Join("; ", result.Events.Select(e => $"{e.Kind} {e.DistanceMeters:0.###} m ρ {e.Reflection:0.###} Z {e.ImpedanceOhms} v {e.Value} c {e.Confidence:0.##}")) + " | " + string.Join(" | ", result.Warnings);
        Assert.True(result.Events.Count == 2, $"expected the splice and the short, found: {found}");
        Assert.True(result.Events[0].Kind == EventKind.SeriesResistance, found);
        Assert.InRange(result.Events[0].DistanceMeters, 60 - DistanceTolerance(60), 60 + DistanceTolerance(60));
        Assert.Equal(EventKind.Short, result.Events[1].Kind);
        Assert.InRange(result.Events[1].DistanceMeters, 120 - DistanceTolerance(120), 120 + DistanceTolerance(120));
        // The size of the splice: ρ = R/(R + 2Z₀) = 6/106 (DESIGN.md §2), to the 10 % a lumped reading of a lossy trace holds.
        Assert.InRange(result.Events[0].Value!.Value, 6 * 0.9, 6 * 1.1);
        Assert.Contains(result.Warnings, w => w.Contains("estimated", StringComparison.Ordinal));
    }

    [Fact]
    public void ALosslessRunIsReadAsLossless()
    {
        // 80 m of lossless line to an open: no loss is there to find, and none may be invented.
        var result = Locator.Locate(Simulate(Run(Segment(80), RunEnd.Open)), Options() with { EstimateLoss = true });
        var end = Assert.Single(result.Events);
        Assert.Equal(EventKind.Open, end.Kind);
        Assert.InRange(end.DistanceMeters, 80 - DistanceTolerance(80), 80 + DistanceTolerance(80));
        Assert.Contains(result.Warnings, w => w.Contains("read as lossless", StringComparison.Ordinal));
    }

    /// <summary>
    /// While the loss is estimated, the selection runs ahead beside the probe and is kept when the probe finds no loss
    /// (Speculation). On a lossless run with a spot and a step, that reading must be bit for bit the one the probe and
    /// then the selection give one after the other, and the one given when the run is told lossless.
    /// </summary>
    [Fact]
    public void TheSelectionRunAheadOfTheProbeIsTheOneRunAfterIt()
    {
        var trace = Simulate(Run(Segment(30), new ShuntCapacitor(6e-12), Segment(25), Segment(40, 75), RunEnd.Open));
        var ahead = Locator.Locate(trace, Options() with { EstimateLoss = true });
        var afterwards = Locator.Locate(trace, Options() with { EstimateLoss = true, SelectAheadOfLossProbe = false });
        var told = Locator.Locate(trace, Options());
        string Reading(LocateResult r) => string.Join("; ", r.Events.Select(e =>
            $"{e.Kind} {e.DistanceMeters:R} m ±{e.DistanceSigmaMeters:R} ρ {e.Reflection:R} Z {e.ImpedanceOhms:R} v {e.Value:R}"));
        Assert.Equal(3, ahead.Events.Count);
        Assert.Equal(Reading(afterwards), Reading(ahead));
        Assert.Equal(Reading(told), Reading(ahead));
    }
}
