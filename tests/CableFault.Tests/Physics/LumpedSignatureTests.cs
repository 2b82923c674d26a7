using CableFault.Networks;
using CableFault.Simulation;
using CableFault.Traces;
using MathNet.Numerics;
using static CableFault.Tests.Physics.PhysicsFixtures;

namespace CableFault.Tests.Physics;

/// <summary>
/// Signatures of lumped parts on a matched lossless line (DESIGN.md §2; derivations below by Laplace transform,
/// the lumped-discontinuity results of Pozar, <i>Microwave Engineering</i>, 4th ed., §2.3 with Z_L = Z₀ ∥ part).
/// </summary>
public sealed class LumpedSignatureTests
{
    private const double Z0 = 50, Vf = 0.66, Vi = 1.0, LeadMeters = 20, TailMeters = 30;

    /// <summary>Edge 25× faster than the time constants below, so the tail is a clean exponential.</summary>
    private const double RiseSeconds = 0.1e-9;

    /// <summary>Accuracy of the inverse transform (see <see cref="StepResponseLevelTests"/>), with room for the exp/erf
    /// arithmetic of the closed form: 1e-6 V.</summary>
    private const double WaveformToleranceVolts = 1e-6;

    /// <summary>A least-squares slope on a noiseless exponential: 0.1 % covers floating-point and the window choice.</summary>
    private const double TimeConstantRelativeTolerance = 1e-3;

    private static double Arrival => 2 * LeadMeters / (Vf * C0);

    private static Trace SimulateWith(NetworkElement part) =>
        ForwardModel.Simulate(
            Run(Segment(LeadMeters, Lossless(Z0, Vf)), part, Segment(TailMeters, Lossless(Z0, Vf)), RunEnd.Matched),
            Settings(RiseSeconds, 2 * TailMeters / (Vf * C0)));

    /// <summary>
    /// Reflected wave of a part with Γ(s) = ∓sτ/(1 + sτ), whose step response is ∓e^(−t/τ), when the incident edge is an
    /// error-function step of width σ: the convolution of the Gaussian with e^(−t/τ)u(t) is
    /// e^(σ²/2τ² − t/τ)·Φ(t/σ − σ/τ) (the exponentially modified Gaussian; derived by completing the square).
    /// </summary>
    private static double ExpectedEcho(double sign, double tau, double t)
    {
        double sigma = RiseSeconds / StimulusSpectrum.GaussianRiseInSigmas;
        double x = t / sigma - sigma / tau;
        double phi = 0.5 * SpecialFunctions.Erfc(-x / Math.Sqrt(2));
        return sign * Vi * Math.Exp(sigma * sigma / (2 * tau * tau) - t / tau) * phi;
    }

    private static void AssertExponentialEcho(Trace trace, double sign, double tau)
    {
        // Whole waveform against the closed form, from before the incident edge to long after the echo.
        double worst = 0;
        for (int i = 0; i < trace.Length; i++)
        {
            double t = trace.TimeAt(i);
            double expected = Vi * 0.5 * SpecialFunctions.Erfc(-t / (RiseSeconds / StimulusSpectrum.GaussianRiseInSigmas) / Math.Sqrt(2))
                              + ExpectedEcho(sign, tau, t - Arrival);
            worst = Math.Max(worst, Math.Abs(trace.SamplesVolts[i] - expected));
        }
        Assert.True(worst < WaveformToleranceVolts, $"largest difference from the closed form {worst} V");

        // And the time constant itself from a straight-line fit to ln|echo| over 0.5 ns … 4τ after arrival.
        var xs = new List<double>();
        var ys = new List<double>();
        for (int i = 0; i < trace.Length; i++)
        {
            double dt = trace.TimeAt(i) - Arrival;
            if (dt < 0.5e-9 || dt > 4 * tau) continue;
            xs.Add(dt);
            ys.Add(Math.Log(Math.Abs(trace.SamplesVolts[i] - Vi)));
        }
        var (_, slope) = Fit.Line(xs.ToArray(), ys.ToArray());
        double tauFit = -1 / slope;
        Assert.True(Math.Abs(tauFit - tau) < TimeConstantRelativeTolerance * tau, $"fitted τ = {tauFit:E6} s, expected {tau:E6} s");
    }

    [Theory]
    [InlineData(100e-12)]
    [InlineData(40e-12)]
    public void ShuntCapacitanceGivesADipWithTauZ0COverTwo(double farads)
    {
        // Z_L = Z₀ ∥ 1/(sC) ⇒ Γ = −sτ/(1 + sτ), τ = Z₀C/2; step response −e^(−t/τ): a dip of depth V_i.
        AssertExponentialEcho(SimulateWith(new ShuntCapacitor(farads)), -1, Z0 * farads / 2);
    }

    [Theory]
    [InlineData(250e-9)]
    [InlineData(100e-9)]
    public void SeriesInductanceGivesABumpWithTauLOverTwoZ0(double henries)
    {
        // Z_L = sL + Z₀ ⇒ Γ = sτ/(1 + sτ), τ = L/(2Z₀); step response +e^(−t/τ): a bump of height V_i.
        AssertExponentialEcho(SimulateWith(new SeriesInductor(henries)), +1, henries / (2 * Z0));
    }

    [Theory]
    [InlineData(100.0)]
    [InlineData(10.0)]
    [InlineData(1000.0)]
    public void ShuntResistanceGivesALastingStep(double ohms)
    {
        // Z_L = Z₀ ∥ R ⇒ ρ = −Z₀/(2R + Z₀).
        var trace = SimulateWith(new ShuntResistor(ohms));
        double rho = -Z0 / (2 * ohms + Z0);
        double dev = MaxDeviation(trace, Vi * (1 + rho), Arrival + 10 * RiseSeconds, trace.EndTimeSeconds);
        Assert.True(dev < WaveformToleranceVolts, $"level after a {ohms} Ω shunt deviates by {dev} V from {Vi * (1 + rho)} V");
    }

    [Fact]
    public void SeriesResistanceGivesALastingStep()
    {
        // Z_L = R + Z₀ ⇒ ρ = R/(R + 2Z₀).
        const double ohms = 30;
        var trace = SimulateWith(new SeriesResistor(ohms));
        double rho = ohms / (ohms + 2 * Z0);
        Assert.True(MaxDeviation(trace, Vi * (1 + rho), Arrival + 10 * RiseSeconds, trace.EndTimeSeconds) < WaveformToleranceVolts);
    }

    [Fact]
    public void TapOfTwoEqualLinesGivesMinusOneThirdThenTheBranchEndEchoes()
    {
        // Looking into the junction the two branches are Z₀/2 in parallel: ρ = (Z₀/2 − Z₀)/(Z₀/2 + Z₀) = −1/3.
        // Bounce diagram (worked by hand): the wave V_i·(1 − 1/3) = 2V_i/3 enters each branch; the open end of the short
        // branch (l₂) returns it, and it crosses the junction back with transmission 1 + ρ = 2/3, adding 4V_i/9 at the
        // port at 2(l₁ + l₂)/v. The next event is its second lap in branch 2 at 2(l₁ + 2l₂)/v, before the long branch's echo.
        const double l1 = 10, l2 = 5, l3 = 30;
        var medium = Lossless(Z0, Vf);
        var network = Run(Segment(l1, medium), new Junction(new[]
        {
            new NetworkBranch(Segment(l2, medium), RunEnd.Open),
            new NetworkBranch(Segment(l3, medium), RunEnd.Open),
        }));
        double v = Vf * C0, margin = 10 * RiseSeconds;
        var trace = ForwardModel.Simulate(network, Settings(RiseSeconds, 2 * (l1 + l3) / v));
        double tap = MaxDeviation(trace, Vi * (1 - 1.0 / 3), 2 * l1 / v + margin, 2 * (l1 + l2) / v - margin);
        double branchEcho = MaxDeviation(trace, Vi * (1 - 1.0 / 3 + 4.0 / 9), 2 * (l1 + l2) / v + margin, 2 * (l1 + 2 * l2) / v - margin);
        Assert.True(tap < WaveformToleranceVolts, $"tap level deviates by {tap} V from 2/3");
        Assert.True(branchEcho < WaveformToleranceVolts, $"level after the short branch's echo deviates by {branchEcho} V from 10/9");
    }
}
