using CableFault.Networks;
using CableFault.Simulation;
using static CableFault.Tests.Physics.PhysicsFixtures;

namespace CableFault.Tests.Physics;

/// <summary>Invariants of the forward model on seeded random networks.</summary>
public sealed class NetworkPropertyTests
{
    /// <summary>|Γ| ≤ 1 is exact for a passive load and a real positive reference; 1e-12 allows for rounding.</summary>
    private const double PassivityTolerance = 1e-12;

    /// <summary>Two simulations of the same continuous response on different FFT grids differ by round-off amplified by
    /// e^(σt) (≤ 1e8 at the record's end, so ≈ 1e-8 V) plus the 1e-12 wrap-around: 1e-6 V is a safe bound.</summary>
    private const double SameResponseToleranceVolts = 1e-6;

    private static readonly double[] Frequencies =
        Enumerable.Range(0, 300).Select(i => Math.Pow(10, 2 + 8 * i / 299.0)).ToArray(); // 100 Hz … 10 GHz

    [Theory]
    [InlineData(11)]
    [InlineData(12)]
    [InlineData(13)]
    [InlineData(14)]
    [InlineData(15)]
    [InlineData(16)]
    [InlineData(17)]
    [InlineData(18)]
    public void PassiveNetworksNeverReflectMoreThanTheyReceive(int seed)
    {
        // A passive one-port has Re Z_in ≥ 0, hence |Γ| = |Z − R|/|Z + R| ≤ 1 for any real R > 0 (Pozar, Microwave
        // Engineering, 4th ed., §4.3 and §2.3).
        var generator = new RandomNetworks(seed, lossless: false);
        for (int n = 0; n < 20; n++)
        {
            var network = generator.Network();
            foreach (double reference in new[] { 25.0, 50.0, 120.0 })
            {
                var gamma = ForwardModel.ReflectionCoefficients(network, Frequencies, reference);
                for (int i = 0; i < gamma.Length; i++)
                {
                    Assert.True(double.IsFinite(gamma[i].Real) && double.IsFinite(gamma[i].Imaginary), $"seed {seed} network {n}: Γ = {gamma[i]} at {Frequencies[i]:E3} Hz");
                    Assert.True(gamma[i].Magnitude <= 1 + PassivityTolerance,
                        $"seed {seed} network {n}: |Γ| = {gamma[i].Magnitude:R} at {Frequencies[i]:E3} Hz (Z_ref {reference} Ω)");
                }
            }
        }
    }

    [Theory]
    [InlineData(21)]
    [InlineData(22)]
    [InlineData(23)]
    [InlineData(24)]
    public void LengtheningTheFirstSegmentOnlyDelaysTheEchoes(int seed)
    {
        // With a matched source and a lossless first segment, V_port = V_i(1 + e^(−2sl₁/v)·Γ_rest(s)): every echo is the
        // same function of time shifted by 2l₁/v, so adding Δl shifts the whole reflected part by 2Δl/v. Δl is chosen so
        // that the shift is a whole number of samples and the two traces compare sample by sample.
        var generator = new RandomNetworks(seed, lossless: false);
        const double rise = 1e-9;
        for (int n = 0; n < 3; n++)
        {
            var rest = generator.Network().Run.Elements;
            var first = new CableSegment(8, Lossless(50, 0.7));
            var original = new CableNetwork(new NetworkBranch(new NetworkElement[] { first }.Concat(rest).ToArray()));
            var settings = Settings(rise, 2 * original.LongestDelaySeconds() + 200e-9);
            const int shiftSamples = 37;
            double deltaMeters = shiftSamples * settings.SampleIntervalSeconds * first.Medium.VelocityMetersPerSecond / 2;
            var longer = new CableNetwork(new NetworkBranch(new NetworkElement[] { first with { LengthMeters = 8 + deltaMeters } }.Concat(rest).ToArray()));

            var a = ForwardModel.Simulate(original, settings);
            var b = ForwardModel.Simulate(longer, settings);
            double firstEcho = 2 * first.DelaySeconds - 6 * rise; // everything before this is the incident step only
            double worst = 0;
            for (int i = 0; i + shiftSamples < a.Length; i++)
            {
                if (a.TimeAt(i) < firstEcho) continue;
                worst = Math.Max(worst, Math.Abs(b.SamplesVolts[i + shiftSamples] - a.SamplesVolts[i]));
            }
            Assert.True(worst < SameResponseToleranceVolts, $"seed {seed} network {n}: shifted traces differ by {worst:E3} V");
            // The flat stretch before the first echo is the same in both.
            Assert.True(MaxDeviation(b, settings.IncidentAmplitudeVolts, 5 * rise, firstEcho) < SameResponseToleranceVolts);
        }
    }

    [Theory]
    [InlineData(31, EdgeShape.Gaussian, 8)]
    [InlineData(32, EdgeShape.Gaussian, 2)]
    [InlineData(33, EdgeShape.Linear, 8)]
    [InlineData(34, EdgeShape.Linear, 3)]
    public void HalvingTheSampleIntervalKeepsTheTrace(int seed, EdgeShape shape, int samplesPerRise)
    {
        // The simulator samples the continuous response; on common samples a record at Δt/2 must agree with one at Δt.
        // (The internal grid is oversampled to the edge's bandwidth, so there is no interpolation between them at all.)
        var generator = new RandomNetworks(seed, lossless: false);
        const double rise = 1e-9;
        for (int n = 0; n < 3; n++)
        {
            var network = generator.Network();
            var coarse = Settings(rise, 2.5 * 2 * network.LongestDelaySeconds() + 50e-9, samplesPerRise, shape);
            var fine = coarse with { SampleIntervalSeconds = coarse.SampleIntervalSeconds / 2, SampleCount = 2 * coarse.SampleCount - 1 };
            var a = ForwardModel.Simulate(network, coarse);
            var b = ForwardModel.Simulate(network, fine);
            double worst = 0;
            for (int i = 0; i < a.Length; i++) worst = Math.Max(worst, Math.Abs(a.SamplesVolts[i] - b.SamplesVolts[2 * i]));
            Assert.True(worst < SameResponseToleranceVolts, $"seed {seed} network {n}: Δt and Δt/2 differ by {worst:E3} V on common samples");
        }
    }
}
