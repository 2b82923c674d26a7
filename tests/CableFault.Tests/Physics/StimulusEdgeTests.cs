using CableFault.Networks;
using CableFault.Simulation;
using MathNet.Numerics;
using static CableFault.Tests.Physics.PhysicsFixtures;

namespace CableFault.Tests.Physics;

/// <summary>
/// The stimulus itself: on a matched run nothing comes back, so the trace is the incident edge, which must match its
/// time-domain definition over the whole record (a long record exposes any spectral truncation, which the damped
/// contour multiplies by e^(σt) late in the record).
/// </summary>
public sealed class StimulusEdgeTests
{
    /// <summary>Inverse-transform accuracy (see <see cref="StepResponseLevelTests"/>).</summary>
    private const double ToleranceVolts = 1e-6;

    [Theory]
    [InlineData(8)]
    [InlineData(3)]
    [InlineData(1)]
    public void GaussianEdgeIsTheErrorFunction(int samplesPerRise)
    {
        // Definition (EdgeShape.Gaussian): V_i·Φ(t/σ), σ = rise/2.5631 (10–90 % of Φ spans 2·1.28155σ: standard normal quantiles).
        const double rise = 1e-9;
        var trace = ForwardModel.Simulate(Run(Segment(10, Lossless()), RunEnd.Matched), Settings(rise, 2e-6, samplesPerRise));
        double sigma = rise / (2 * 1.2815515655446004);
        double worst = 0;
        for (int i = 0; i < trace.Length; i++)
            worst = Math.Max(worst, Math.Abs(trace.SamplesVolts[i] - 0.5 * SpecialFunctions.Erfc(-trace.TimeAt(i) / sigma / Math.Sqrt(2))));
        Assert.True(worst < ToleranceVolts, $"largest difference from V_i·Φ(t/σ): {worst:E3} V");
    }

    [Theory]
    [InlineData(0.02, 10e-9)]
    [InlineData(-0.01, 40e-9)]
    public void SettlingEdgeIsTheExponentiallyModifiedGaussian(double fraction, double timeConstantSeconds)
    {
        // A Gaussian edge whose part a arrives through a first-order lag τ: V_i·[(1 − a)·Φ(t/σ) + a·F(t)], with F the
        // exponentially modified Gaussian's distribution, F(t) = Φ(t/σ) − e^(−t/τ + σ²/2τ²)·Φ((t − σ²/τ)/σ)
        // (Grushka, Anal. Chem. 44, 1972: the convolution of a Gaussian with an exponential).
        const double rise = 1e-9;
        var trace = ForwardModel.Simulate(Run(Segment(10, Lossless()), RunEnd.Matched), Settings(rise, 2e-6, 8) with
        {
            SettlingFraction = fraction, SettlingTimeConstantSeconds = timeConstantSeconds,
        });
        double sigma = rise / (2 * 1.2815515655446004);
        double Phi(double x) => 0.5 * SpecialFunctions.Erfc(-x / Math.Sqrt(2));
        double worst = 0;
        for (int i = 0; i < trace.Length; i++)
        {
            double t = trace.TimeAt(i);
            // The exponential factor overflows far before the edge, where Φ of its argument is zero anyway.
            double lagged = Phi(t / sigma) - (t < -20 * sigma ? 0
                : Math.Exp(-t / timeConstantSeconds + sigma * sigma / (2 * timeConstantSeconds * timeConstantSeconds))
                    * Phi((t - sigma * sigma / timeConstantSeconds) / sigma));
            double expected = (1 - fraction) * Phi(t / sigma) + fraction * lagged;
            worst = Math.Max(worst, Math.Abs(trace.SamplesVolts[i] - expected));
        }
        Assert.True(worst < ToleranceVolts, $"largest difference from the exponentially modified Gaussian: {worst:E3} V");
    }

    [Theory]
    [InlineData(8)]
    [InlineData(3)]
    public void LinearEdgeIsTheRampAwayFromItsRoundedCorners(int samplesPerRise)
    {
        // Definition (EdgeShape.Linear): 0 → V_i linearly over T = rise/0.8 centred on t = 0, corners rounded by a
        // Gaussian of σ_c = T/100: exact beyond 6σ_c from a corner, within σ_c/T·φ(0) ≈ 0.4 % of the step near one.
        const double rise = 1e-9, ramp = rise / 0.8, cornerSigma = ramp / 100;
        var trace = ForwardModel.Simulate(Run(Segment(10, Lossless()), RunEnd.Matched),
            Settings(rise, 2e-6, samplesPerRise, EdgeShape.Linear));
        double worstAway = 0, worstNear = 0;
        for (int i = 0; i < trace.Length; i++)
        {
            double t = trace.TimeAt(i), ideal = Math.Clamp(t / ramp + 0.5, 0, 1);
            double error = Math.Abs(trace.SamplesVolts[i] - ideal);
            bool nearCorner = Math.Abs(Math.Abs(t) - ramp / 2) < 6 * cornerSigma;
            if (nearCorner) worstNear = Math.Max(worstNear, error);
            else worstAway = Math.Max(worstAway, error);
        }
        Assert.True(worstAway < ToleranceVolts, $"away from the corners the ramp is off by {worstAway:E3} V");
        Assert.True(worstNear < 0.0041, $"near a corner the ramp is off by {worstNear:E3} V");
    }
}
