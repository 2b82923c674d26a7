namespace CableFault.Comparison;

/// <summary>
/// Gaussian smoothing that slows an edge to a given rise time. A Gaussian edge of standard deviation σ has a 10–90 %
/// rise of 2·1.2816·σ = 2.5631·σ, and Gaussians compose in quadrature, so an edge of σ_fast becomes one of σ_slow
/// after a Gaussian of σ_extra = √(σ_slow² − σ_fast²) (convolution of normal densities; any probability text).
/// </summary>
internal static class GaussianBandLimit
{
    /// <summary>10–90 % rise over σ of a Gaussian edge: 2·Φ⁻¹(0.9) = 2.5631 (Φ⁻¹(0.9) = 1.28155).</summary>
    internal const double RiseOverSigma = 2.5631031310892007;

    /// <summary>Kernel half-width in σ: the Gaussian beyond 4σ holds 6·10⁻⁵ of its weight.</summary>
    private const double KernelHalfWidthSigmas = 4;

    /// <summary>σ of the Gaussian that turns a rise of <paramref name="fastRiseSeconds"/> into one of
    /// <paramref name="slowRiseSeconds"/>, s (0 when the first is not faster).</summary>
    internal static double ExtraSigmaSeconds(double fastRiseSeconds, double slowRiseSeconds)
    {
        double fast = fastRiseSeconds / RiseOverSigma, slow = slowRiseSeconds / RiseOverSigma;
        return slow > fast ? Math.Sqrt(slow * slow - fast * fast) : 0;
    }

    /// <summary>
    /// Convolves with a normalised Gaussian of <paramref name="sigmaSamples"/> samples, holding the first and last
    /// values beyond the ends (a step record is flat before its edge and settled at its end; zero padding, as a plain
    /// convolution would do, would bend both ends). Returns the smoothed samples and the factor by which white noise
    /// shrinks, √Σw².
    /// </summary>
    internal static (double[] Samples, double NoiseFactor) Smooth(IReadOnlyList<double> x, double sigmaSamples)
    {
        int n = x.Count;
        if (!(sigmaSamples > 0.05)) return (x.ToArray(), 1.0);
        int half = Math.Max(1, (int)Math.Ceiling(KernelHalfWidthSigmas * sigmaSamples));
        var w = new double[2 * half + 1];
        double sum = 0;
        for (int k = -half; k <= half; k++) sum += w[k + half] = Math.Exp(-0.5 * k * k / (sigmaSamples * sigmaSamples));
        double energy = 0;
        for (int k = 0; k < w.Length; k++) { w[k] /= sum; energy += w[k] * w[k]; }
        var y = new double[n];
        for (int i = 0; i < n; i++)
        {
            double acc = 0;
            for (int k = -half; k <= half; k++) acc += w[k + half] * x[Math.Clamp(i + k, 0, n - 1)];
            y[i] = acc;
        }
        return (y, Math.Sqrt(energy));
    }
}
