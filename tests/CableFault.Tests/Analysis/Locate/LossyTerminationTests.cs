using CableFault.Analysis;
using CableFault.Cables;
using CableFault.Networks;
using CableFault.Simulation;
using static CableFault.Tests.Analysis.Locate.LocateFixtures;

namespace CableFault.Tests.Analysis.Locate;

/// <summary>
/// A lossy run that ends in a resistor (a terminator, a camera, a sensor) is one event: the termination. On such a
/// cable a resistor and a line of the same nominal impedance that goes on beyond the record differ: the line's
/// Z_c(s) = √((R′ + sL′)/(G′ + sC′)) climbs above nominal at low frequencies (the lossy-line telegrapher's solution;
/// Pozar, <i>Microwave Engineering</i>, 4th ed., §2.7, section from memory), so the resistor's level creeps away from
/// the continuing line's. Read as the wrong one, the difference came out as extra events near the end (the 47 Ω load:
/// a partial short, a "termination" 6 m beyond it and a fit at its iteration limit), or as a series resistor and a
/// near-short a few centimetres apart (the 330 Ω load). The truth is the network simulated here.
/// </summary>
public class LossyTerminationTests
{
    /// <summary>The built-in category 5e pair: 100 Ω, VF 0.68, 22 dB/100 m at 100 MHz, with its loop resistance.</summary>
    private static readonly CableMedium ThinPair = BuiltInCableTypes.All.First(t => t.Designation == "CAT5E").Medium;

    [Theory]
    [InlineData(330.0, 25.0)]
    [InlineData(47.0, 18.0)]
    public void ResistorAtTheEndOfALossyPairIsOneTermination(double loadOhms, double lengthMeters)
    {
        var network = new CableNetwork(new NetworkBranch(new CableSegment(lengthMeters, ThinPair), RunEnd.Resistor(loadOhms)));
        var settings = InstrumentSettings.DefaultFor(network, RiseSeconds) with
        {
            SourceImpedanceOhms = 100, NoiseRmsVolts = QuietNoiseVolts, NoiseSeed = 3, SampleIntervalSeconds = RiseSeconds / 8,
        };
        settings = settings with
        {
            SampleCount = (int)Math.Ceiling((settings.PreTriggerSeconds + 6 * network.LongestDelaySeconds()) / settings.SampleIntervalSeconds),
        };
        var result = Locator.Locate(ForwardModel.Simulate(network, settings), new LocateOptions
        {
            VelocityFactor = ThinPair.VelocityFactor, ImpedanceOhms = 100, SourceImpedanceOhms = 100, Loss = ThinPair.Loss,
        });

        var only = Assert.Single(result.Events);
        Assert.True(only.Kind == EventKind.Termination, Describe(result));
        Assert.InRange(only.DistanceMeters, lengthMeters - DistanceTolerance(lengthMeters), lengthMeters + DistanceTolerance(lengthMeters));
        // The load's size to 5 %: R = Z₀(1 + ρ)/(1 − ρ), and with 1 mV of noise on the 1 V step the fit reads ρ to
        // better than 0.01, about 2 % of either load.
        Assert.InRange(only.ImpedanceOhms ?? only.Value ?? double.NaN, 0.95 * loadOhms, 1.05 * loadOhms);
    }
}
