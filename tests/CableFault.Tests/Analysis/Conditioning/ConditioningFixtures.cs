using CableFault.Cables;
using CableFault.Networks;
using CableFault.Simulation;
using CableFault.Traces;

namespace CableFault.Tests.Analysis.Conditioning;

/// <summary>Networks with known answers, simulated by the forward model (the ground truth is the network built).</summary>
internal static class ConditioningFixtures
{
    public const double VelocityFactor = 0.66;

    public static CableMedium Line(double ohms, CableLossModel? loss = null) => new(ohms, VelocityFactor, loss);

    public static CableNetwork Run(params NetworkElement[] elements) => new(new NetworkBranch(elements), "test run");

    /// <summary>50 → 75 → 35 → 50 Ω, sections 20 m, 10 m, 10 m, then 20 m of 50 Ω into a matched end.</summary>
    public static CableNetwork Staircase() => Run(
        new CableSegment(20, Line(50)), new CableSegment(10, Line(75)), new CableSegment(10, Line(35)),
        new CableSegment(20, Line(50)), RunEnd.Matched);

    public static InstrumentSettings Settings(CableNetwork network, double noiseVolts = 0, int seed = 1, double riseSeconds = 1e-9)
        => InstrumentSettings.DefaultFor(network, riseSeconds) with { NoiseRmsVolts = noiseVolts, NoiseSeed = seed };

    public static Trace Simulate(CableNetwork network, double noiseVolts = 0, int seed = 1) =>
        ForwardModel.Simulate(network, Settings(network, noiseVolts, seed));

    /// <summary>One-way round-trip time to distance <paramref name="meters"/> at the fixtures' velocity factor.</summary>
    public static double RoundTrip(double meters) => 2 * meters / (VelocityFactor * PhysicalConstants.SpeedOfLightMetersPerSecond);
}
