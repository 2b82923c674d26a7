using System.Numerics;
using CableFault.Networks;
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

    /// <summary>Agreement of the cached and plain simulations, relative to the incident amplitude. The per-bin values agree
    /// to a few ulp (the same operations, except a lossy medium's root and a lossy segment's exponential, which the cache
    /// takes several bins at a time), the transforms differ, and the damped contour multiplies their rounding by up to
    /// e^(σt) ≈ 1e8 late in the record (ForwardModel's balanced error), so 1e-7 of the step is the bound.</summary>
    private const double SimulationRelativeTolerance = 1e-7;

    /// <summary>A contour of 1 900 bins (an 800 ns period, σ = 2·10⁶ s⁻¹) for the per-bin comparisons.</summary>
    private static readonly SweepCache.Grid SmallGrid = new(4096, 2e6, 2 * Math.PI / 800e-9, 1900);

    [Theory]
    [InlineData(2, 2)]
    [InlineData(64, 33)]
    [InlineData(2048, 700)]
    public void InverseRealMatchesMathNet(int m, int givenBins)
    {
        var half = RandomHermitianHalf(m, givenBins);
        var packed = new double[m + 2];
        for (int k = 0; k < givenBins; k++) { packed[2 * k] = half[k].Real; packed[2 * k + 1] = half[k].Imaginary; }
        Fourier.InverseReal(packed, m, FourierOptions.NoScaling);

        var ours = InverseFft.Real(half, m);

        double scale = Enumerable.Range(0, m).Max(i => Math.Abs(packed[i]));
        for (int i = 0; i < m; i++) Assert.InRange(ours[i] - packed[i], -FftRelativeTolerance * scale, FftRelativeTolerance * scale);
    }

    /// <summary>
    /// Lengths that are not powers of two (radix 2 with its twiddles, 3, 4, 5 and the plain-DFT fallback for 7 and 11) against the direct
    /// sum x_n = X_0 + 2·Re Σ_k X_k e^(2πikn/M) (bin M/2 once), with the angle reduced exactly (kn mod M) and compensated
    /// summation. MathNet is no reference here: for such lengths it takes Bluestein's algorithm, off by ~1e-10.
    /// </summary>
    [Theory]
    [InlineData(6, 4)]
    [InlineData(12, 7)]
    [InlineData(30, 16)]
    [InlineData(100, 51)]
    [InlineData(2 * 2 * 3 * 5 * 7, 150)]
    [InlineData(1152, 577)]
    [InlineData(6144, 3073)]
    [InlineData(6250, 2000)]
    [InlineData(2 * 7 * 11 * 3, 100)]
    public void InverseRealMatchesTheDirectSum(int m, int givenBins)
    {
        var half = RandomHermitianHalf(m, givenBins);

        var ours = InverseFft.Real(half, m);

        var direct = new double[m];
        for (int n = 0; n < m; n++)
        {
            double sum = half[0].Real, carry = 0;
            for (int k = 1; k < givenBins; k++)
            {
                double angle = 2 * Math.PI * ((long)k * n % m) / m;
                double term = (k == m / 2 ? 1 : 2) * (half[k].Real * Math.Cos(angle) - half[k].Imaginary * Math.Sin(angle)) - carry;
                double next = sum + term;
                carry = next - sum - term;
                sum = next;
            }
            direct[n] = sum;
        }
        double scale = direct.Max(Math.Abs);
        for (int i = 0; i < m; i++) Assert.InRange(ours[i] - direct[i], -FftRelativeTolerance * scale, FftRelativeTolerance * scale);
    }

    /// <summary>Bins 0 … K−1 of a Hermitian spectrum with random parts (bins 0 and M/2 real).</summary>
    private static Complex[] RandomHermitianHalf(int m, int givenBins)
    {
        var random = new Random(m);
        var half = new Complex[givenBins];
        for (int k = 0; k < givenBins; k++) half[k] = new Complex(random.NextDouble() - 0.5, random.NextDouble() - 0.5);
        half[0] = new Complex(half[0].Real, 0);
        if (givenBins == m / 2 + 1) half[m / 2] = new Complex(half[m / 2].Real, 0);
        return half;
    }

    /// <summary>The fast lengths are the even numbers whose half is 5-smooth (2^a·3^b·5^c), the least one at or above the
    /// need: checked by brute force.</summary>
    [Theory]
    [InlineData(1)]
    [InlineData(1070)]
    [InlineData(6130)]
    [InlineData(2)]
    [InlineData(3)]
    [InlineData(100_001)]
    public void FastLengthIsTheLeastEvenFiveSmoothLength(long needed)
    {
        static bool IsFast(long m)
        {
            if (m % 2 != 0) return false;
            long h = m / 2;
            foreach (int p in new[] { 2, 3, 5 }) while (h % p == 0) h /= p;
            return h == 1;
        }
        long fast = InverseFft.FastLength(needed);
        Assert.True(fast >= needed && IsFast(fast), $"{fast} for {needed}");
        for (long m = Math.Max(2, needed); m < fast; m++) Assert.False(IsFast(m), $"{m} is fast and below {fast}");
    }

    /// <summary>The bin count found from its closed form is the one a bin-by-bin search from 0 finds, for either edge,
    /// contours with and without a cap, and grids whose Nyquist bin comes before the cut-off.</summary>
    [Fact]
    public void BinCountFromItsClosedFormMatchesTheSearchFromZero()
    {
        var random = new Random(5);
        for (int trial = 0; trial < 400; trial++)
        {
            var shape = trial % 2 == 0 ? EdgeShape.Gaussian : EdgeShape.Linear;
            double rise = Math.Pow(10, -10.5 + 2 * random.NextDouble());
            double dOmega = Math.Pow(10, 5 + 3 * random.NextDouble());
            double sigma = random.NextDouble() * 20 * dOmega;
            int lastBin = random.Next(1, 40_000);
            int searched = 0;
            while (searched <= lastBin && !StimulusSpectrum.IsNegligible(shape, rise, new Complex(sigma, searched * dOmega))) searched++;
            Assert.Equal(searched, ForwardModel.CountBins(shape, rise, sigma, dOmega, lastBin));
        }
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
            // With and without a fit's cap on the undamping (it changes the contour, so the cache keeps both).
            foreach (double cap in new[] { double.PositiveInfinity, ForwardModel.FitMaximumUndamping })
            {
                var plain = ForwardModel.SimulateSamples(compiled, settings, null, cap);
                // Twice: the second run takes every per-bin quantity from the cache.
                for (int pass = 0; pass < 2; pass++)
                {
                    var cached = ForwardModel.SimulateSamples(compiled, settings, cache, cap);
                    for (int i = 0; i < plain.Length; i++)
                        Assert.InRange(cached[i] - plain[i], -SimulationRelativeTolerance, SimulationRelativeTolerance);
                }
            }
        }
    }

    /// <summary>
    /// A fit's cap on the undamping trades rounding for wrap-around. When the cap binds, e^(−σT) ≤ 1/cap (T ≥ t_rec), so a
    /// capped sample differs from the balanced one by at most the waveform one period later, |f(t + T)|, over the cap
    /// (plus the later periods, 1/cap² and less). That future is read from a balanced simulation of a record 2.2 times as
    /// long (T + t_rec stays below it), so the bound is the model's own, not a rule of thumb; 1e-7 is left for rounding.
    /// </summary>
    [Theory]
    [InlineData(1000)]
    [InlineData(1490)]
    [InlineData(4000)]
    public void CappedUndampingStaysWithinItsWrapAroundBound(int sampleCount)
    {
        var networks = new RandomNetworks(31, lossless: false);
        var settings = new InstrumentSettings
        {
            SourceImpedanceOhms = 50, IncidentAmplitudeVolts = 1, RiseTimeSeconds = 0.5e-9, EdgeShape = EdgeShape.Gaussian,
            SampleIntervalSeconds = 0.2e-9, SampleCount = sampleCount, PreTriggerSeconds = 2e-9,
        };
        var longer = settings with { SampleCount = (int)(2.2 * sampleCount) };
        double cap = ForwardModel.FitMaximumUndamping;
        for (int n = 0; n < 3; n++)
        {
            var compiled = new CompiledNetwork(networks.Network());
            var balanced = ForwardModel.SimulateSamples(compiled, settings);
            var capped = ForwardModel.SimulateSamples(compiled, settings, null, cap);
            double future = ForwardModel.SimulateSamples(compiled, longer).Skip(sampleCount).Max(Math.Abs);
            double bound = future / cap * (1 + 2 / cap) + 1e-7;
            for (int i = 0; i < balanced.Length; i++) Assert.InRange(capped[i] - balanced[i], -bound, bound);
        }
    }

    /// <summary>
    /// A lossy segment in the sweep (e^(−2γl) from the vectorised exponential, sine and cosine, applied as two travelling
    /// waves) against the closed form of a line's input impedance, Z_in = Z_c (Z_L + Z_c tanh γl)/(Z_c + Z_L tanh γl)
    /// (Pozar, <i>Microwave Engineering</i>, 4th ed., §2.7 on lossy lines; section from memory), bin by bin, as the
    /// reflection coefficient against 50 Ω (bounded where Z_in is not). The segments cover a bin 0 small enough for the
    /// series (5 mm), an ordinary run, and a long lossy one whose e^(−2γl) underflows at the top bins; the loads cover open,
    /// short and resistive ends. On a contour through s = 0 (σ = 0) the line at bin 0 is its series resistance alone,
    /// Z_in = Z_L + R′l (Y′ vanishes with s): the case the series entries of the first bins are kept for.
    /// </summary>
    /// <remarks>The phase 2βl at the top bin is about 5·10³ rad on the 37 m segment, where the rounding of its argument
    /// alone is ~10⁻¹² rad (on the 3 km one, 4·10⁵ rad, but there e^(−2γl) has underflowed); 1e-9 leaves a margin over
    /// that and still catches a wrong sign, factor or bin, and a dropped R′l (3·10⁻² here).</remarks>
    [Theory]
    [InlineData(0.005, 1e-5, 0.0, 2e6)]
    [InlineData(37.0, 3e-6, 0.02, 2e6)]
    [InlineData(3000.0, 1e-5, 0.1, 2e6)]
    [InlineData(37.0, 3e-6, 0.02, 0.0)]
    public void LossySegmentGivesTheClosedFormInputImpedance(double lengthMeters, double skinNepersPerMeterPerRootHertz, double dcOhmsPerMeter,
        double contourSigma)
    {
        var medium = new Cables.CableMedium(62, 0.71, new Cables.CableLossModel(skinNepersPerMeterPerRootHertz, 2e-11, dcOhmsPerMeter));
        var grid = SmallGrid with { Sigma = contourSigma };
        var cache = new SweepCache();
        foreach (var (end, loadOhms) in new[] { (RunEnd.Open, double.PositiveInfinity), (RunEnd.Short, 0.0), (RunEnd.Resistor(17), 17.0) })
        {
            var compiled = new CompiledNetwork(new CableNetwork(new NetworkBranch([new CableSegment(lengthMeters, medium), end])));
            var (n, d) = NetworkEvaluator.EvaluateSweep(compiled, cache, grid);
            for (int k = 0; k < grid.BinCount; k++)
            {
                var s = new Complex(grid.Sigma, k * grid.DOmega);
                Complex expected;
                if (s == Complex.Zero)
                {
                    double zInOhms = loadOhms + dcOhmsPerMeter * lengthMeters;
                    expected = double.IsPositiveInfinity(zInOhms) ? 1 : (zInOhms - 50) / (zInOhms + 50);
                }
                else
                {
                    var (gamma, zc, _, _) = NetworkEvaluator.Propagation(medium, s);
                    // tanh x = (1 − e^(−2x))/(1 + e^(−2x)), which stays finite for a large Re x.
                    Complex e = Complex.Exp(-2 * gamma * lengthMeters), tanh = (1 - e) / (1 + e);
                    Complex zIn = double.IsPositiveInfinity(loadOhms) ? zc / tanh : zc * (loadOhms + zc * tanh) / (zc + loadOhms * tanh);
                    expected = (zIn - 50) / (zIn + 50);
                }
                Complex swept = (n[k] - 50 * d[k]) / (n[k] + 50 * d[k]);
                Assert.True((swept - expected).Magnitude < 1e-9, $"{end.Kind} after {lengthMeters} m, bin {k}: {swept} against {expected}");
            }
            SweepBuffers<Complex>.Return(n);
            SweepBuffers<Complex>.Return(d);
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

    /// <summary>A Jacobian column's run resumes from the pairs its base point recorded, evaluating only the operations
    /// from the first one it changes. Every element of random networks (branches, lossy and lossless media, every lumped
    /// kind) is changed in turn, and the resumed sweep must give a full sweep's pairs bit for bit; the unchanged network
    /// resumes at its end and must give them too. Segments change in length or in medium (impedance), as the fit's
    /// position and impedance columns do.</summary>
    [Theory]
    [InlineData(51, true)]
    [InlineData(52, false)]
    [InlineData(53, false)]
    public void ResumedSweepGivesTheBitsOfAFullSweep(int seed, bool lossless)
    {
        var networks = new RandomNetworks(seed, lossless);
        var cache = new SweepCache();
        var grid = SmallGrid;
        int resumedLate = 0;
        for (int n = 0; n < 4; n++)
        {
            var network = networks.Network();
            var compiled = new CompiledNetwork(network);
            using var snapshots = new SweepSnapshots(compiled, grid);
            NetworkEvaluator.EvaluateSweep(compiled, cache, grid, record: snapshots);
            int elements = CountTunable(network.Run);
            for (int target = -1; target < elements; target++)
            {
                int counter = 0;
                var changed = target < 0 ? compiled : new CompiledNetwork(network with { Run = Changed(network.Run, target, ref counter) });
                var full = NetworkEvaluator.EvaluateSweep(changed, cache, grid);
                var resumed = NetworkEvaluator.EvaluateSweep(changed, cache, grid, resumeFrom: snapshots);
                Assert.True(full.N.AsSpan(0, grid.BinCount).SequenceEqual(resumed.N.AsSpan(0, grid.BinCount)));
                Assert.True(full.D.AsSpan(0, grid.BinCount).SequenceEqual(resumed.D.AsSpan(0, grid.BinCount)));
                if (snapshots.FirstDifference(changed) > 0) resumedLate++;
            }
        }
        // The comparison is only worth something when runs did resume part-way.
        Assert.True(resumedLate > 4, $"only {resumedLate} runs resumed after their first operation");
    }

    private static int CountTunable(NetworkBranch branch) => branch.Elements.Sum(e => e switch
    {
        Junction j => j.Branches.Sum(CountTunable),
        CableSegment or ShuntCapacitor or SeriesInductor or ShuntResistor or SeriesResistor => 1,
        _ => 0,
    });

    /// <summary>The branch with its <paramref name="target"/>-th tunable element (in element order, depth first) 0.1 %
    /// larger: a lumped value, a segment's length, or (odd targets) a segment's impedance.</summary>
    private static NetworkBranch Changed(NetworkBranch branch, int target, ref int counter)
    {
        var elements = new List<NetworkElement>();
        foreach (var e in branch.Elements)
        {
            if (e is Junction j)
            {
                var branches = new List<NetworkBranch>();
                foreach (var b in j.Branches) branches.Add(Changed(b, target, ref counter));
                elements.Add(new Junction(branches));
                continue;
            }
            bool hit = e is CableSegment or ShuntCapacitor or SeriesInductor or ShuntResistor or SeriesResistor && counter++ == target;
            elements.Add(!hit ? e : e switch
            {
                // Every other segment gets a new medium (what the fit's impedance and loss columns change) instead of
                // a new length.
                CableSegment s when target % 2 == 1 => s with
                {
                    Medium = new CableFault.Cables.CableMedium(s.Medium.ImpedanceOhms * 1.001, s.Medium.VelocityFactor, s.Medium.Loss),
                },
                CableSegment s => s with { LengthMeters = s.LengthMeters * 1.001 },
                ShuntCapacitor c => new ShuntCapacitor(c.CapacitanceFarads * 1.001),
                SeriesInductor l => new SeriesInductor(l.InductanceHenries * 1.001),
                ShuntResistor r => new ShuntResistor(r.ResistanceOhms * 1.001),
                SeriesResistor r => new SeriesResistor(r.ResistanceOhms * 1.001),
                _ => e,
            });
        }
        return new NetworkBranch(elements);
    }

    /// <summary>The cache takes √s and the dielectric factor once per grid for all media, and γ, Z_c and 1/Z_c of lossy
    /// media several bins per vector (LossyPropagation). Each medium's Z′ and Y′ must still be bit for bit what its own
    /// formulas give at that bin, and γ and Z_c what the library's complex square root and division give, within a few
    /// ulp (1e-14 relative: the root's own rounding is a few 1e-16); 1/Z_c times Z_c must be 1. The media have skin, DC and
    /// dielectric loss, each alone and together, and two share one exponent. A second grid has a bin count no vector width
    /// divides (the bins after the last whole vector) and σ = 0, where bin 0 has Z′Y′ = 0 (γ = 0, Z_c = Z₀).</summary>
    [Fact]
    public void SharedRootsGiveEachMediumsOwnPropagation()
    {
        foreach (var grid in new[] { SmallGrid, new SweepCache.Grid(4096, 0, SmallGrid.DOmega, 1901) })
            CheckMediaOn(grid);
    }

    private static void CheckMediaOn(SweepCache.Grid grid)
    {
        var cache = new SweepCache();
        var media = new[]
        {
            new CableFault.Cables.CableMedium(50, 0.66, new CableFault.Cables.CableLossModel(2e-6, 0, 0)),
            new CableFault.Cables.CableMedium(75, 0.82, new CableFault.Cables.CableLossModel(0, 3e-11, 0)),
            new CableFault.Cables.CableMedium(93, 0.84, new CableFault.Cables.CableLossModel(0, 0, 0.2)),
            new CableFault.Cables.CableMedium(50, 0.66, new CableFault.Cables.CableLossModel(2e-6, 3e-11, 0.01)),
            new CableFault.Cables.CableMedium(60, 0.70, new CableFault.Cables.CableLossModel(1e-6, 3e-11, 0.01)),
            // The dielectric exponent follows from the VF and the dielectric loss: these two share the fourth's.
            new CableFault.Cables.CableMedium(75, 0.66, new CableFault.Cables.CableLossModel(1e-6, 3e-11, 0.01)),
            new CableFault.Cables.CableMedium(62, 0.66, new CableFault.Cables.CableLossModel(0, 3e-11, 0)),
        };
        foreach (var medium in media)
        {
            var bins = cache.Medium(grid, medium);
            for (int k = 0; k < grid.BinCount; k++)
            {
                var s = new Complex(grid.Sigma, k * grid.DOmega);
                Complex z = medium.SeriesImpedanceOhmsPerMeter(s), y = medium.ShuntAdmittanceSiemensPerMeter(s);
                Complex gamma = Complex.Sqrt(z * y), zc = gamma == Complex.Zero ? medium.ImpedanceOhms : z / gamma;
                Assert.True((bins.Gamma[k] - gamma).Magnitude <= 1e-14 * gamma.Magnitude, $"γ at bin {k}: {bins.Gamma[k]} against {gamma}");
                Assert.True((bins.Zc[k] - zc).Magnitude <= 1e-14 * zc.Magnitude, $"Z_c at bin {k}: {bins.Zc[k]} against {zc}");
                Assert.True((bins.Zc[k] * bins.InverseZc[k] - 1).Magnitude <= 1e-14, $"Z_c/Z_c at bin {k}");
                Assert.Equal(z, bins.ZSeries[k]);
                Assert.Equal(y, bins.YShunt[k]);
            }
        }
    }
}
