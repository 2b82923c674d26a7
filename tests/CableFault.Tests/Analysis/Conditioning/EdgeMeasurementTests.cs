using CableFault.Analysis;
using CableFault.Traces;
using MathNet.Numerics;

namespace CableFault.Tests.Analysis.Conditioning;

/// <summary>Closed-form checks of time zero and rise time on an error-function edge built here, not by the simulator.</summary>
public class EdgeMeasurementTests
{
    /// <summary>
    /// 10–90 % rise of an error-function step in units of its σ. The step is ½(1 + erf(t / (σ√2))); it reaches a fraction p
    /// at t_p = σ√2·erf⁻¹(2p − 1), so t₉₀ − t₁₀ = 2√2·erf⁻¹(0.8)·σ = 2.5631·σ (IEEE Std 181-2011, 5.3.4 definition of
    /// transition duration between the 10 % and 90 % reference levels). erf⁻¹(0.8) = 0.9061938 (MathNet's ErfInv here).
    /// </summary>
    private static readonly double RiseInSigmas = 2 * Math.Sqrt(2) * SpecialFunctions.ErfInv(0.8);

    /// <summary>Linear interpolation between samples Δt = σ/8 apart misplaces each of the 10 % and 90 % crossings by at
    /// most (f''/f')·Δt²/8 = (1.28/σ)·Δt²/8 = 0.0025·σ (the Gaussian's f''/f' = −t/σ² at t = ∓1.28σ), outward at both
    /// ends; together ≤ 0.005σ = 0.2 % of the rise. 0.5 % leaves margin. (At Δt = σ/3 the same bias reaches 1.4 %.)</summary>
    private const double RiseRelativeTolerance = 0.005;

    /// <summary>The brief's requirement for a clean edge: time zero within a tenth of a sample interval.</summary>
    private const double TimeZeroToleranceSamples = 0.1;

    private static Trace ErfEdge(double sigmaSeconds, double dtSeconds, double edgeTimeSeconds, double amplitude, double baseline, int n = 2048)
    {
        var x = new double[n];
        for (int i = 0; i < n; i++)
        {
            double t = i * dtSeconds;
            x[i] = baseline + amplitude * 0.5 * (1 + SpecialFunctions.Erf((t - edgeTimeSeconds) / (sigmaSeconds * Math.Sqrt(2))));
        }
        return new Trace(0, dtSeconds, x);
    }

    [Fact]
    public void ErrorFunctionEdgeRiseIs2Point5631Sigma()
    {
        Assert.Equal(2.5631, RiseInSigmas, 4);          // the constant itself, as quoted in the literature
        double sigma = 0.4e-9, dt = sigma / 8;
        var c = TraceConditioner.Characterise(ErfEdge(sigma, dt, 300.37 * dt, 0.8, 0.1));
        Assert.InRange(c.RiseTimeSeconds / (RiseInSigmas * sigma), 1 - RiseRelativeTolerance, 1 + RiseRelativeTolerance);
    }

    [Theory]
    [InlineData(0.0)]
    [InlineData(0.25)]
    [InlineData(0.5)]
    [InlineData(0.81)]
    public void TimeZeroIsTheFiftyPercentPointWithinATenthOfASample(double fraction)
    {
        double sigma = 0.4e-9, dt = sigma / 3, edge = (300 + fraction) * dt;
        var c = TraceConditioner.Characterise(ErfEdge(sigma, dt, edge, 1.0, 0));
        Assert.InRange((c.TimeZeroSeconds - edge) / dt, -TimeZeroToleranceSamples, TimeZeroToleranceSamples);
        Assert.Equal(1.0, c.IncidentAmplitudeVolts, 6);
        Assert.Equal(0.0, c.BaselineVolts, 6);
        Assert.False(c.PolarityInverted);
    }

    [Fact]
    public void InvertedEdgeIsDetectedAndAlignedUpright()
    {
        double sigma = 0.4e-9, dt = sigma / 3, edge = 300.3 * dt;
        var c = TraceConditioner.Characterise(ErfEdge(sigma, dt, edge, -0.5, 0.2));
        Assert.True(c.PolarityInverted);
        Assert.Equal(0.5, c.IncidentAmplitudeVolts, 6);
        Assert.Equal(0.2, c.BaselineVolts, 6);
        Assert.InRange((c.TimeZeroSeconds - edge) / dt, -TimeZeroToleranceSamples, TimeZeroToleranceSamples);
        var aligned = TraceConditioner.Align(ErfEdge(sigma, dt, edge, -0.5, 0.2), c);
        Assert.Equal(0.5, aligned.SamplesVolts[^1], 6);          // upright: the plateau is +amplitude
        Assert.Equal(0.0, aligned.SamplesVolts[0], 6);           // baseline removed
        Assert.Contains(c.Warnings, w => w.Contains("inverted", StringComparison.OrdinalIgnoreCase));
    }
}
