using System.Numerics;
using BenchmarkDotNet.Attributes;
using CableFault.Networks;
using CableFault.Simulation;
using MathNet.Numerics.IntegralTransforms;

namespace CableFault.Benchmarks;

/// <summary>
/// Target (issue: Foundation): the forward model of a 10-element network at 32 768 samples costs at most 5× one bare
/// complex FFT of the same length, both measured in the same run. The ratio is read off the "Ratio" column.
/// </summary>
[MemoryDiagnoser]
public class ForwardModelBenchmark
{
    private const int SampleCount = 32_768;
    private CableNetwork _network = null!;
    private InstrumentSettings _settings = null!;
    private Complex[] _fftBuffer = null!;
    private Complex[] _fftSource = null!;
    private CompiledNetwork _lossless = null!;
    private InstrumentSettings _fitSettings = null!;
    private SweepCache _cache = null!;

    [GlobalSetup]
    public void Setup()
    {
        _network = BenchmarkNetworks.TenElements();
        // 1 ns rise sampled at 50 ps: 32 768 samples cover 1.6 µs, far beyond the 67 m run's echoes.
        _settings = new InstrumentSettings { RiseTimeSeconds = 1e-9, SampleIntervalSeconds = 50e-12, SampleCount = SampleCount, PreTriggerSeconds = 5e-9 };
        var random = new Random(7);
        _fftSource = Enumerable.Range(0, SampleCount).Select(_ => new Complex(random.NextDouble(), random.NextDouble())).ToArray();
        _fftBuffer = new Complex[SampleCount];
        _lossless = new CompiledNetwork(BenchmarkNetworks.TenElementsLossless());
        // A fit's model run on a long record's sharper look: 6 000 samples half an effective σ apart, the undamping capped.
        double fitRise = 3.8e-9;
        _fitSettings = new InstrumentSettings
        {
            RiseTimeSeconds = fitRise, SampleIntervalSeconds = 0.5 * StimulusSpectrum.GaussianSigmaSeconds(fitRise),
            SampleCount = 6_000, PreTriggerSeconds = 5e-9,
        };
        _cache = new SweepCache();
    }

    [Benchmark(Baseline = true, Description = "one complex FFT, 32768 points")]
    public Complex BareFft()
    {
        Array.Copy(_fftSource, _fftBuffer, SampleCount);
        Fourier.Forward(_fftBuffer, FourierOptions.NoScaling);
        return _fftBuffer[1];
    }

    [Benchmark(Description = "forward model, 10 elements, 32768 samples")]
    public double ForwardModel10() => ForwardModel.Simulate(_network, _settings).SamplesVolts[^1];

    /// <summary>What a fit repeats thousands of times: the cached sweep of a lossless run (no target; for comparisons).</summary>
    [Benchmark(Description = "fit's model run, lossless 10 elements, 6000 samples")]
    public double FitModelRunLossless() =>
        ForwardModel.SimulateSamples(_lossless, _fitSettings, _cache, ForwardModel.FitMaximumUndamping)[^1];

    /// <summary>The inverse transform alone at the fit's length: the share of a fit's model run no network change can save.</summary>
    [Benchmark(Description = "fit's inverse FFT alone, 6000 samples")]
    public double FitInverseFft()
    {
        int m = (int)InverseFft.FastLength(6_000 + 20);
        InverseFft.Real(_fftSource.AsSpan(0, m / 2 + 1), m, _fitBuffer);
        return _fitBuffer[1];
    }

    private readonly double[] _fitBuffer = new double[8192];

    /// <summary>One LM step's gradient and Gauss–Newton matrix (JᵀJ) for a long fit: 6 000 samples, 27 parameters.</summary>
    [Benchmark(Description = "fit's JᵀJ and gradient, 6000 samples × 27 parameters")]
    public double GaussNewtonProducts()
    {
        _objective ??= NewObjective();
        _objective.EvaluateAt(MathNet.Numerics.LinearAlgebra.Vector<double>.Build.Dense(27, 0.5));
        return _objective.Hessian[26, 0] + _objective.Gradient[3];
    }

    private CableFault.Analysis.ColumnObjective? _objective;

    private static CableFault.Analysis.ColumnObjective NewObjective()
    {
        const int n = 6_000, p = 27;
        var random = new Random(11);
        double[] Column() => Enumerable.Range(0, n).Select(_ => random.NextDouble() - 0.5).ToArray();
        var observed = Column();
        var model = Column();
        var columns = Enumerable.Range(0, p).Select(_ => Column()).ToArray();
        var objective = new CableFault.Analysis.ColumnObjective(observed, 1e6, _ => model, _ => columns, Enumerable.Repeat(1.0, p).ToArray());
        objective.SetParameters(MathNet.Numerics.LinearAlgebra.Vector<double>.Build.Dense(p));
        return objective;
    }
}
