using CableFault.Analysis;
using CableFault.Cables;
using CableFault.Networks;
using static CableFault.Tests.Analysis.Locate.LocateFixtures;

namespace CableFault.Tests.Analysis.Locate;

/// <summary>
/// A corroded joint, then a crushed spot (a shunt C), then a short, on a thin lossy 75 Ω drop cable with a fast edge. The fit
/// may bend the spot into a stretch of a few ohms a fifth of a rise long (a low-impedance line that short is a shunt C of
/// (τ/2)(1/Z₁ − Z₁/Z²): Pozar, <i>Microwave Engineering</i>, 4th ed., §8.6, from memory), which would be reported as a short
/// and an open 8 mm apart in the middle of the run. Tried as the spot it stands for, the short beyond must keep its echo's
/// time: such a stretch already delays what passes it nearly as much as the spot does, and a trial that moved the short
/// earlier by the whole spot delay (about 2.4 rise times here) started too far off to win. The network is the truth (accuracy
/// benchmark run 171 of seed 20240611, rounded).
/// </summary>
public class SpotBehindJointTests
{
    private const double JointAt = 0.54, SpotAt = 1.166, EndAt = 2.694, JointOhms = 34.1, SpotFarads = 18.2e-12, RiseSeconds = 0.486e-9;

    [Theory]
    // Seeds 4 and 14 were read as a short and an open 8 mm apart before the fix; 1 was read right.
    [InlineData(1)]
    [InlineData(4)]
    [InlineData(14)]
    public void CapacitiveSpotBehindAJointIsOneSpot(int seed)
    {
        var drop = new CableMedium(75, 0.623, CableLossModel.FromDatasheet(7.5, 100e6, dcResistanceOhmsPerMeter: 0.042));
        var network = Run(new CableSegment(JointAt, drop), new SeriesResistor(JointOhms), new CableSegment(SpotAt - JointAt, drop),
            new ShuntCapacitor(SpotFarads), new CableSegment(EndAt - SpotAt, drop), RunEnd.Short);
        var result = LocateOnCable(network, drop, RiseSeconds, 2048, 1.28e-3, seed);
        string found = Describe(result);

        Assert.True(result.Events.Count == 3, $"expected the joint, the spot and the short; found: {found}");
        Assert.True(result.Events[0].Kind == EventKind.SeriesResistance, $"expected the joint first; found: {found}");
        var spot = result.Events[1];
        // The spot's size to 10 %: its peak of −τ·dv/dt is 0.39 of the step here (τ = Z·C/2), read against 1.3 mV of
        // noise on the 1 V step, and a tenth of C moves the peak by 0.04 V.
        Assert.True(spot.Kind == EventKind.Capacitive && spot.Value is double c && Math.Abs(c / SpotFarads - 1) < 0.1,
            $"expected a capacitive spot of {SpotFarads * 1e12} pF; found: {found}");
        Assert.InRange(spot.DistanceMeters, SpotAt - DistanceTolerance(SpotAt), SpotAt + DistanceTolerance(SpotAt));
        var end = result.Events[2];
        Assert.True(end.Kind == EventKind.Short, $"expected a short at the end; found: {found}");
        Assert.InRange(end.DistanceMeters, EndAt - DistanceTolerance(EndAt), EndAt + DistanceTolerance(EndAt));
    }
}
