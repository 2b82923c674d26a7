using System.Numerics;
using CableFault.Simulation;
using MathNet.Numerics.IntegralTransforms;

namespace CableFault.Tests.Physics;

/// <summary>
/// The fit's fast path through the forward model (per-bin quantities kept in a <see cref="SweepCache"/>, its own inverse
/// FFT, a phasor recurrence for lossless segments) must give the samples of the plain path.
/// </summary>
public class SweepCacheTests
{
    /// <summary>Agreement of two FFTs of the same data, relative to the largest output: both are O(log M·ε) accurate,
    /// so 1e-12 leaves a wide margin over rounding and still catches a wrong bin, sign or conjugate.</summary>
    private const double FftRelativeTolerance = 1e-12;

    /// <summary>Agreement of the cached and plain simulations, relative to the incident amplitude. The per-bin values are
    /// the same operations; only the transform differs, and the damped contour multiplies its rounding by up to
    /// e^(σt) ≈ 1e8 late in the record (ForwardModel's balanced error), so 1e-7 of the step is the bound.</summary>
    private const double SimulationRelativeTolerance = 1e-7;

    [Theory]
    [InlineData(2, 2)]
    [InlineData(64, 33)]
    [InlineData(2048, 700)]
    public void InverseRealMatchesMathNet(int m, int givenBins)
    {
        var random = new Random(m);
        var half = new Complex[givenBins];
        for (int k = 0; k < givenBins; k++) half[k] = new Complex(random.NextDouble() - 0.5, random.NextDouble() - 0.5);
        half[0] = new Complex(half[0].Real, 0);
        if (givenBins == m / 2 + 1) half[m / 2] = new Complex(half[m / 2].Real, 0);
        var packed = new double[m + 2];
        for (int k = 0; k < givenBins; k++) { packed[2 * k] = half[k].Real; packed[2 * k + 1] = half[k].Imaginary; }
        Fourier.InverseReal(packed, m, FourierOptions.NoScaling);

        var ours = InverseFft.Real(half, m);

        double scale = Enumerable.Range(0, m).Max(i => Math.Abs(packed[i]));
        for (int i = 0; i < m; i++) Assert.InRange(ours[i] - packed[i], -FftRelativeTolerance * scale, FftRelativeTolerance * scale);
    }

    [Theory]
    [InlineData(11, false)]
    [InlineData(12, true)]
    [InlineData(13, false)]
    public void CachedSimulationMatchesPlain(int seed, bool lossless)
    {
        var networks = new RandomNetworks(seed, lossless);
        var cache = new SweepCache();
        var settings = new InstrumentSettings
        {
            SourceImpedanceOhms = 50,
            IncidentAmplitudeVolts = 1,
            RiseTimeSeconds = 0.5e-9,
            EdgeShape = EdgeShape.Gaussian,
            SampleIntervalSeconds = 0.2e-9,
            SampleCount = 1500,
            PreTriggerSeconds = 2e-9,
        };
        for (int n = 0; n < 4; n++)
        {
            var network = networks.Network();
            var compiled = new CompiledNetwork(network);
            var plain = ForwardModel.SimulateSamples(compiled, settings);
            // Twice: the second run takes every per-bin quantity from the cache.
            for (int pass = 0; pass < 2; pass++)
            {
                var cached = ForwardModel.SimulateSamples(compiled, settings, cache);
                for (int i = 0; i < plain.Length; i++)
                    Assert.InRange(cached[i] - plain[i], -SimulationRelativeTolerance, SimulationRelativeTolerance);
            }
        }
    }

    /// <summary>A fit's Jacobian changes the edge's rise and its time one at a time: the cache keeps the edge's spectrum,
    /// its delay and the damping's undoing apart, and a run that shares some of them with an earlier one must still get
    /// the samples of the plain path.</summary>
    [Fact]
    public void CachedSimulationFollowsChangesOfRiseAndEdgeTime()
    {
        var network = new RandomNetworks(21, lossless: true).Network();
        var compiled = new CompiledNetwork(network);
        var cache = new SweepCache();
        // Rise and pre-trigger in every combination, each run after one that differs in only one of them.
        foreach (var (rise, pre) in new[] { (0.5e-9, 2e-9), (0.5e-9, 2.3e-9), (0.6e-9, 2.3e-9), (0.6e-9, 2e-9), (0.5e-9, 2e-9) })
        {
            var settings = new InstrumentSettings
            {
                SourceImpedanceOhms = 50, IncidentAmplitudeVolts = 1, RiseTimeSeconds = rise, EdgeShape = EdgeShape.Gaussian,
                SampleIntervalSeconds = 0.2e-9, SampleCount = 1500, PreTriggerSeconds = pre,
            };
            var plain = ForwardModel.SimulateSamples(compiled, settings);
            var cached = ForwardModel.SimulateSamples(compiled, settings, cache);
            for (int i = 0; i < plain.Length; i++)
                Assert.InRange(cached[i] - plain[i], -SimulationRelativeTolerance, SimulationRelativeTolerance);
        }
    }
}
