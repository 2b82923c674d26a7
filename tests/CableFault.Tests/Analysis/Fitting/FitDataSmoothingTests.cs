using CableFault.Analysis;
using CableFault.Simulation;
using CableFault.Traces;
using MathNet.Numerics;

namespace CableFault.Tests.Analysis.Fitting;

/// <summary>
/// A long record is low-passed by a Gaussian before the fit (FitData.Prepare), and the model is told the effective rise
/// σ² = σ_rise² + σ_filter². The convolution of two Gaussians is the Gaussian whose variance is their sum (e.g. Papoulis,
/// <i>Probability, Random Variables and Stochastic Processes</i>, the sum of independent normal variables), so an
/// error-function step smoothed that way must be the error-function step of the effective rise. A long record's smoothing
/// is shared among the cores; the shares must give the bits of one pass.
/// </summary>
public class FitDataSmoothingTests
{
    private const double IntervalSeconds = 10e-12, RiseSeconds = 0.2e-9, EdgeSeconds = 1.2e-6;

    /// <summary>Gaussian σ of a 10–90 % rise, in rises: 1/(2√2·erf⁻¹(0.8)) (IEEE Std 181 transition of an error-function step).</summary>
    private const double SigmaPerRise = 1 / 2.5631031310892007;

    /// <summary>2.4 µs of a 1 V error-function step at 10 ps: 240 000 samples, far more than a window keeps unsmoothed.</summary>
    private static Trace Step()
    {
        double sigma = RiseSeconds * SigmaPerRise;
        var samples = new double[240_000];
        for (int i = 0; i < samples.Length; i++)
            samples[i] = 0.5 * SpecialFunctions.Erfc(-(i * IntervalSeconds - EdgeSeconds) / (sigma * Math.Sqrt(2)));
        return new Trace(0, IntervalSeconds, samples);
    }

    [Fact]
    public void ASmoothedErrorFunctionStepIsTheStepOfTheEffectiveRise()
    {
        var data = FitData.Prepare(Step(), 0, 2.39e-6, RiseSeconds, 1e-3);
        Assert.True(data.FilterSigmaSeconds > 10 * RiseSeconds, "the window was expected to be smoothed");
        double sigma = data.EffectiveRiseSeconds(RiseSeconds) * SigmaPerRise;
        double worst = 0;
        for (int j = 0; j < data.Samples.Length; j++)
        {
            double expected = 0.5 * SpecialFunctions.Erfc(-(data.TimeAt(j) - EdgeSeconds) / (sigma * Math.Sqrt(2)));
            worst = Math.Max(worst, Math.Abs(data.Samples[j] - expected));
        }
        // The kernel is cut at ±6σ (weight beyond 2·10⁻⁹) and sampled every 10 ps against a σ of nanoseconds, where the
        // sampled sum equals the integral to far below that; 10⁻⁶ V of the 1 V step leaves room for rounding only.
        Assert.True(worst < 1e-6, $"smoothed step differs from the error-function step of the effective rise by {worst:G3} V");
    }

    [Fact]
    public void TheSmoothingSharedAmongTheCoresGivesTheBitsOfOnePass()
    {
        var trace = Step();
        var noisy = new double[trace.Length];
        var random = new Random(181);
        for (int i = 0; i < noisy.Length; i++) noisy[i] = trace.SamplesVolts[i] + 1e-3 * (random.NextDouble() - 0.5);
        var record = new Trace(0, IntervalSeconds, noisy);
        // The window reaches both ends of the record, where the kernel holds the end values.
        var shared = FitData.Prepare(record, -1e-9, 2.5e-6, RiseSeconds, 1e-3);
        FitData single;
        using (BinSplitting.SideBySide()) single = FitData.Prepare(record, -1e-9, 2.5e-6, RiseSeconds, 1e-3);
        Assert.True(shared.Samples.AsSpan().SequenceEqual(single.Samples), "the shared smoothing differs from one pass");
    }
}
