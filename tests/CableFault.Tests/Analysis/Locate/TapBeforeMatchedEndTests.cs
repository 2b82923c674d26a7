using CableFault.Analysis;
using CableFault.Cables;
using CableFault.Networks;
using static CableFault.Tests.Analysis.Locate.LocateFixtures;

namespace CableFault.Tests.Analysis.Locate;

/// <summary>
/// A kinked spot (a shunt C), then a tap with a short open branch, on a lossy 100 Ω pair that runs on into a matched
/// load. A matched end of a lossy line loads it with the line's own Z_c(s) = √((R′ + sL′)/(G′ + sC′)), which climbs above
/// nominal at low frequencies (the lossy-line telegrapher's solution; Pozar, <i>Microwave Engineering</i>, 4th ed., §2.7,
/// section from memory), so a resistor of nominal Z₀ there leaves a different slow tail. On the first, still poor fit the
/// resistor won, and held: the tap was then read as a drop with stand-ins (a series R, a short and an open) for the tail
/// it could not match. The network is the truth (accuracy benchmark seed 7, run 64, rounded).
/// </summary>
public class TapBeforeMatchedEndTests
{
    private const double SpotAt = 1.574, TapAt = 3.173, BranchMeters = 1.305, EndAt = 4.655, RiseSeconds = 1.032e-9;

    [Theory]
    // All three were read as a drop with stand-ins before the continuing line was tried again (8 of noise seeds 1–12).
    [InlineData(1)]
    [InlineData(2)]
    [InlineData(3)]
    public void TapOnALossyPairIntoAMatchedLoadIsATap(int seed)
    {
        var pair = new CableMedium(100, 0.763, CableLossModel.FromDatasheet(8.1, 100e6, dcResistanceOhmsPerMeter: 0.036));
        var network = Run(new CableSegment(SpotAt, pair), new ShuntCapacitor(22.2e-12), new CableSegment(TapAt - SpotAt, pair),
            new Junction([new NetworkBranch(new CableSegment(EndAt - TapAt, pair), RunEnd.Matched),
                new NetworkBranch(new CableSegment(BranchMeters, pair), RunEnd.Open)]));
        var result = LocateOnCable(network, pair, RiseSeconds, 2048, 0.52e-3, seed);
        string found = Describe(result);

        var tap = Near(result, TapAt);
        Assert.True(tap.Kind == EventKind.Tap, $"expected a tap at {TapAt} m; found: {found}");
        Assert.InRange(tap.DistanceMeters, TapAt - DistanceTolerance(TapAt), TapAt + DistanceTolerance(TapAt));
        Assert.True(Near(result, SpotAt).Kind == EventKind.Capacitive, $"expected the spot at {SpotAt} m; found: {found}");
        // The spot, the tap and the branch's open end (reported at the junction plus the branch): nothing else.
        double branchEnd = TapAt + BranchMeters;
        Assert.Contains(result.Events, e => e.Kind == EventKind.Open && Math.Abs(e.DistanceMeters - branchEnd) <= DistanceTolerance(branchEnd));
        Assert.True(result.Events.Count == 3, $"expected the spot, the tap and the branch end; found: {found}");
    }
}
