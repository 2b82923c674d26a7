using System.Numerics;

namespace CableFault.Simulation;

/// <summary>
/// Laplace transform E(s) of the stimulus edge's derivative (unit area, centred on t = 0), so that the step is
/// V(s) = amplitude · E(s) / s.
/// </summary>
internal static class StimulusSpectrum
{
    /// <summary>10–90 % rise of an error-function step in units of σ: 2·√2·erf⁻¹(0.8) = 2.563103 (exact to 7 digits).</summary>
    internal const double GaussianRiseInSigmas = 2.5631031310892007;

    /// <summary>Gaussian σ for a 10–90 % rise time, s.</summary>
    internal static double GaussianSigmaSeconds(double riseTimeSeconds) => riseTimeSeconds / GaussianRiseInSigmas;

    /// <summary>Full 0–100 % duration of a linear ramp with the given 10–90 % rise, s.</summary>
    internal static double RampSeconds(double riseTimeSeconds) => riseTimeSeconds / 0.8;

    /// <summary>Ramp duration over the σ of the Gaussian that rounds the ramp's corners (see <see cref="EdgeShape.Linear"/>).</summary>
    internal const double RampOverCornerSigma = 100;

    /// <summary>σ of the Gaussian that rounds the linear ramp's corners, s.</summary>
    internal static double CornerSigmaSeconds(double riseTimeSeconds) => RampSeconds(riseTimeSeconds) / RampOverCornerSigma;

    /// <summary>σ of the Gaussian factor that band-limits the edge's spectrum, s.</summary>
    private static double BandLimitSigmaSeconds(EdgeShape shape, double riseTimeSeconds) =>
        shape == EdgeShape.Gaussian ? GaussianSigmaSeconds(riseTimeSeconds) : CornerSigmaSeconds(riseTimeSeconds);

    /// <summary>
    /// E(s): Gaussian exp(σ²s²/2); linear ramp sinh(sT/2)/(sT/2)·exp(σ_c²s²/2).
    /// </summary>
    /// <remarks>
    /// The ramp alone is not band-limited: its spectrum falls only as 1/f², and cutting it off at the internal Nyquist
    /// frequency leaves Gibbs ringing whose sinc tails decay only as 1/t. On the damped contour the samples are
    /// multiplied back by e^(σt) (up to 10⁸ at the end of a record), so those tails grew into errors of several per cent
    /// late in long records. The narrow Gaussian factor (σ_c = ramp/100) makes the spectrum negligible at the internal
    /// Nyquist frequency, so the only effect left is a local rounding of the two corners.
    /// </remarks>
    internal static Complex Evaluate(EdgeShape shape, double riseTimeSeconds, Complex s)
    {
        switch (shape)
        {
            case EdgeShape.Gaussian:
                double sigma = GaussianSigmaSeconds(riseTimeSeconds);
                return Complex.Exp(sigma * sigma * s * s / 2);
            case EdgeShape.Linear:
                Complex x = s * RampSeconds(riseTimeSeconds) / 2;
                double corner = CornerSigmaSeconds(riseTimeSeconds);
                Complex rounding = Complex.Exp(corner * corner * s * s / 2);
                return (x.Magnitude < 1e-6 ? 1 + x * x / 6 : Complex.Sinh(x) / x) * rounding;
            default:
                throw new ArgumentOutOfRangeException(nameof(shape));
        }
    }

    /// <summary>The factor 1 − a + a/(1 + sτ) of a step whose part a settles with time constant τ after the fast edge
    /// (see <see cref="InstrumentSettings.SettlingFraction"/>); |factor| ≤ |1 − a| + |a| on the contour.</summary>
    internal static Complex Settling(double fraction, double timeConstantSeconds, Complex s) =>
        1 - fraction + fraction / (1 + s * timeConstantSeconds);

    /// <summary>
    /// True when |E(s)| is below 1e-16 for this and every higher frequency on the contour, so the bin can be skipped.
    /// Both edges carry a Gaussian factor; the ramp's sinh(x)/x factor is at most about 1 on the contour (Re x ≪ 1).
    /// </summary>
    internal static bool IsNegligible(EdgeShape shape, double riseTimeSeconds, Complex s)
    {
        double sigma = BandLimitSigmaSeconds(shape, riseTimeSeconds);
        return sigma * sigma * (s.Real * s.Real - s.Imaginary * s.Imaginary) / 2 < -37;
    }

    /// <summary>The angular frequency above which <see cref="IsNegligible"/> holds on the contour Re s = σ, rad/s:
    /// σ_b²(ω² − σ²)/2 = 37.</summary>
    internal static double NegligibleAboveRadiansPerSecond(EdgeShape shape, double riseTimeSeconds, double contourSigma)
    {
        double sigmaB = BandLimitSigmaSeconds(shape, riseTimeSeconds);
        return Math.Sqrt(contourSigma * contourSigma + 74 / (sigmaB * sigmaB));
    }

    /// <summary>Time from the start of the transition to its 50 % point, with margin, s: how far after internal zero the edge centre must sit.</summary>
    internal static double LeadInSeconds(EdgeShape shape, double riseTimeSeconds) => shape switch
    {
        EdgeShape.Gaussian => 9 * GaussianSigmaSeconds(riseTimeSeconds),
        _ => RampSeconds(riseTimeSeconds) / 2 + 9 * CornerSigmaSeconds(riseTimeSeconds),
    };

    // |E| at the Nyquist frequency π/Δt below e^-20 needs σπ/Δt > 6.3, i.e. Δt < 0.5σ of the band-limiting Gaussian.
    /// <summary>Largest internal sample interval that keeps the stimulus effectively band-limited, s.</summary>
    internal static double MaximumInternalIntervalSeconds(EdgeShape shape, double riseTimeSeconds) =>
        0.5 * BandLimitSigmaSeconds(shape, riseTimeSeconds);
}
