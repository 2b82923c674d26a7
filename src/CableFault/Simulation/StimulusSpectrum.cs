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

    /// <summary>E(s): Gaussian exp(σ²s²/2); linear ramp sinh(sT/2)/(sT/2).</summary>
    internal static Complex Evaluate(EdgeShape shape, double riseTimeSeconds, Complex s)
    {
        switch (shape)
        {
            case EdgeShape.Gaussian:
                double sigma = GaussianSigmaSeconds(riseTimeSeconds);
                return Complex.Exp(sigma * sigma * s * s / 2);
            case EdgeShape.Linear:
                Complex x = s * RampSeconds(riseTimeSeconds) / 2;
                return x.Magnitude < 1e-6 ? 1 + x * x / 6 : Complex.Sinh(x) / x;
            default:
                throw new ArgumentOutOfRangeException(nameof(shape));
        }
    }

    /// <summary>
    /// True when |E(s)| is below 1e-16 for this and every higher frequency on the contour, so the bin can be skipped.
    /// Only the Gaussian edge is band-limited in this sense.
    /// </summary>
    internal static bool IsNegligible(EdgeShape shape, double riseTimeSeconds, Complex s)
    {
        if (shape != EdgeShape.Gaussian) return false;
        double sigma = GaussianSigmaSeconds(riseTimeSeconds);
        return sigma * sigma * (s.Real * s.Real - s.Imaginary * s.Imaginary) / 2 < -37;
    }

    /// <summary>Time from the start of the transition to its 50 % point, with margin, s: how far after internal zero the edge centre must sit.</summary>
    internal static double LeadInSeconds(EdgeShape shape, double riseTimeSeconds) => shape switch
    {
        EdgeShape.Gaussian => 9 * GaussianSigmaSeconds(riseTimeSeconds),
        _ => RampSeconds(riseTimeSeconds) / 2,
    };

    /// <summary>Largest internal sample interval that keeps the stimulus effectively band-limited, s.</summary>
    internal static double MaximumInternalIntervalSeconds(EdgeShape shape, double riseTimeSeconds) => shape switch
    {
        // |E| at the Nyquist frequency π/Δt below e^-20 needs σπ/Δt > 6.3, i.e. Δt < 0.5σ.
        EdgeShape.Gaussian => 0.5 * GaussianSigmaSeconds(riseTimeSeconds),
        // A ramp's spectrum falls only as 1/f²: oversample so its corners are resolved to ~0.1 %.
        _ => RampSeconds(riseTimeSeconds) / 32,
    };
}
