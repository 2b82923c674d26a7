using CableFault.Simulation;

namespace CableFault.Tests.Physics;

/// <summary>
/// A lossless one-port (lossless lines, L and C, ending only in opens and shorts) absorbs no power, so its input
/// impedance is purely reactive and |Γ(jω)| = 1 at every frequency for any real reference (Pozar, <i>Microwave
/// Engineering</i>, 4th ed., §4.1–4.3: lossless networks have a unitary scattering matrix; for a one-port |S₁₁| = 1).
/// </summary>
public sealed class EnergyConservationTests
{
    /// <summary>Each segment and junction costs a few ulps; trees of up to ~30 elements stay well inside 1e-9.</summary>
    private const double UnitMagnitudeTolerance = 1e-9;

    private static readonly double[] Frequencies =
        Enumerable.Range(0, 400).Select(i => 1e3 * Math.Pow(10, 6.5 * i / 399.0)).ToArray(); // 1 kHz … ≈3.2 GHz, log spaced

    [Theory]
    [InlineData(1)]
    [InlineData(2)]
    [InlineData(3)]
    [InlineData(4)]
    [InlineData(5)]
    [InlineData(6)]
    [InlineData(7)]
    [InlineData(8)]
    public void LosslessNetworkReflectsAllPower(int seed)
    {
        var generator = new RandomNetworks(seed, lossless: true);
        for (int n = 0; n < 10; n++)
        {
            var network = generator.Network();
            foreach (double reference in new[] { 50.0, 75.0, 100.0 })
            {
                var gamma = ForwardModel.ReflectionCoefficients(network, Frequencies, reference);
                for (int i = 0; i < gamma.Length; i++)
                    Assert.True(Math.Abs(gamma[i].Magnitude - 1) < UnitMagnitudeTolerance,
                        $"seed {seed} network {n}: |Γ| = {gamma[i].Magnitude:R} at {Frequencies[i]:E3} Hz (Z_ref {reference} Ω)");
            }
        }
    }

    /// <summary>Energy still trapped after the record plus the Riemann-sum error of a band-limited pulse sampled 8 times per
    /// rise. Near frequencies where the open stub is a quarter wave the junction looks like a short and the long branch
    /// rings for many laps, so the tail is slow: measured ≈ 5e-5 left after 6 µs, ≈ 6e-7 after 12 µs. 1e-4 with a 12 µs
    /// record; an energy error of the model (a gain or a loss in the network algebra) would show at the percent level.</summary>
    private const double EnergyRelativeTolerance = 1e-4;

    [Theory]
    [InlineData(false)]
    [InlineData(true)]
    public void ReflectedPulseCarriesTheIncidentEnergy(bool withParts)
    {
        // Parseval in the time domain: with a matched source the reflected wave is b = Γ ∗ a, and |Γ(jω)| = 1 makes
        // ∫|b′|² dt = ∫|a′|² dt for the edge's derivative a′ (a pulse of finite energy). b is the port voltage minus the
        // incident error-function step, written out here; the integrals are sums over the samples.
        const double rise = 1e-9;
        var medium = new Cables.CableMedium(50, 0.66);
        var trunk = withParts
            ? new List<Networks.NetworkElement> { new Networks.CableSegment(10, medium), new Networks.ShuntCapacitor(3e-12),
                new Networks.CableSegment(3, medium), new Networks.SeriesInductor(8e-9), new Networks.CableSegment(2, medium) }
            : new List<Networks.NetworkElement> { new Networks.CableSegment(15, medium) };
        trunk.Add(new Networks.Junction(new[]
        {
            new Networks.NetworkBranch(new Networks.CableSegment(5, medium), Networks.RunEnd.Open),
            new Networks.NetworkBranch(new Networks.CableSegment(30, medium), Networks.RunEnd.Short),
        }));
        var network = PhysicsFixtures.Run(trunk.ToArray());
        var settings = PhysicsFixtures.Settings(rise, 12e-6);
        var trace = ForwardModel.Simulate(network, settings);
        double sigma = rise / StimulusSpectrum.GaussianRiseInSigmas, vi = settings.IncidentAmplitudeVolts;
        double Incident(int i) => vi * 0.5 * MathNet.Numerics.SpecialFunctions.Erfc(-trace.TimeAt(i) / sigma / Math.Sqrt(2));
        double incidentEnergy = 0, reflectedEnergy = 0;
        for (int i = 0; i + 1 < trace.Length; i++)
        {
            double da = Incident(i + 1) - Incident(i);
            double db = trace.SamplesVolts[i + 1] - Incident(i + 1) - (trace.SamplesVolts[i] - Incident(i));
            incidentEnergy += da * da;
            reflectedEnergy += db * db;
        }
        Assert.True(Math.Abs(reflectedEnergy / incidentEnergy - 1) < EnergyRelativeTolerance,
            $"reflected/incident energy = {reflectedEnergy / incidentEnergy:R}");
    }
}
