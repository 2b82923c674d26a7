using NWaves.Windows;

namespace CableFault.FrequencyDomain;

/// <summary>Window coefficients from NWaves (symmetric forms, centre value 1), widened to double.</summary>
internal static class SpectralWindowFunctions
{
    /// <summary>A symmetric window of <paramref name="length"/> points (w[0] = w[length−1]; for odd length the centre is 1).</summary>
    internal static double[] Symmetric(SpectralWindow window, int length, double kaiserBeta)
    {
        if (length < 1) throw new ArgumentOutOfRangeException(nameof(length));
        if (length == 1) return [1.0];
        float[] w = window switch
        {
            SpectralWindow.Rectangular => Window.Rectangular(length),
            SpectralWindow.Hann => Window.Hann(length),
            SpectralWindow.Kaiser => Window.Kaiser(length, kaiserBeta),
            _ => throw new ArgumentOutOfRangeException(nameof(window)),
        };
        return Array.ConvertAll(w, x => (double)x);
    }

    /// <summary>
    /// The right half of a symmetric window of 2K + 1 points centred on DC: w[k] for harmonic k = 0 … K, w[0] = 1.
    /// Mirrored onto the negative frequencies by Hermitian symmetry, it is the full window over −K … K.
    /// </summary>
    internal static double[] LowPassHalf(SpectralWindow window, int topHarmonic, double kaiserBeta)
    {
        var full = Symmetric(window, 2 * topHarmonic + 1, kaiserBeta);
        return full[topHarmonic..];
    }

    /// <summary>Lower-case name for metadata.</summary>
    internal static string Name(SpectralWindow window) => window switch
    {
        SpectralWindow.Rectangular => "rectangular",
        SpectralWindow.Hann => "hann",
        _ => "kaiser",
    };
}
