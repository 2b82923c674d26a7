using System.Numerics;
using CableFault.FrequencyDomain;
using MathNet.Numerics.IntegralTransforms;

namespace CableFault.Tests.FrequencyDomain;

/// <summary>
/// The windows used by the converter have the published sidelobe and main-lobe figures: Harris, "On the use of windows
/// for harmonic analysis with the discrete Fourier transform", Proc. IEEE 66(1), 1978, Table 1 (values from memory).
/// Measured from a zero-padded FFT of a long window, so the symmetric form (length N, period N − 1) and Harris's
/// DFT-even form differ by 1/N, below the tolerances.
/// </summary>
public class WindowTradeOffTests
{
    private const int WindowLength = 1025;
    private const int PaddedLength = 1 << 18; // 256 points per bin: the lobe shape is sampled finely

    /// <summary>Rectangle and Hann sidelobes are known to a tenth of a dB (−13.26, −31.47 in closed form): ±0.1 dB.</summary>
    private const double TenthDbTolerance = 0.1;

    /// <summary>Table 1 gives the Kaiser–Bessel sidelobes to whole dB; with the symmetric form's small difference, ±1 dB.</summary>
    private const double WholeDbTolerance = 1.0;

    /// <summary>Table 1 gives widths to 0.01 bin; ±0.02 bin covers rounding and the 1/N of the symmetric form.</summary>
    private const double WidthToleranceBins = 0.02;

    [Theory]
    // Harris 1978 Table 1, from memory: rectangle −13.3 dB, 0.89 bins; Hanning −31.5 dB, 1.44 bins;
    // Kaiser–Bessel α = 2.0: −46 dB, 1.43; α = 2.5: −57 dB, 1.57; α = 3.0: −69 dB, 1.71 (β = πα).
    [InlineData(SpectralWindow.Rectangular, 0.0, -13.3, TenthDbTolerance, 0.89)]
    [InlineData(SpectralWindow.Hann, 0.0, -31.5, TenthDbTolerance, 1.44)]
    [InlineData(SpectralWindow.Kaiser, 2.0 * Math.PI, -46.0, WholeDbTolerance, 1.43)]
    [InlineData(SpectralWindow.Kaiser, 2.5 * Math.PI, -57.0, WholeDbTolerance, 1.57)]
    [InlineData(SpectralWindow.Kaiser, 3.0 * Math.PI, -69.0, WholeDbTolerance, 1.71)]
    public void Sidelobe_level_and_main_lobe_width_match_Harris(SpectralWindow window, double beta, double sidelobeDb, double sidelobeToleranceDb, double widthBins)
    {
        var w = SpectralWindowFunctions.Symmetric(window, WindowLength, beta);
        var spectrum = new Complex[PaddedLength];
        for (int i = 0; i < w.Length; i++) spectrum[i] = w[i];
        Fourier.Forward(spectrum, FourierOptions.NoScaling);
        double peak = spectrum[0].Magnitude;
        var db = new double[PaddedLength / 2];
        for (int i = 0; i < db.Length; i++) db[i] = 20 * Math.Log10(Math.Max(spectrum[i].Magnitude / peak, 1e-300));

        double pointsPerBin = (double)PaddedLength / (WindowLength - 1);
        // −3 dB half-width, linearly interpolated between the padded points.
        int j = 1;
        while (db[j] > -3.0103) j++;
        double crossing = j - 1 + (db[j - 1] + 3.0103) / (db[j - 1] - db[j]);
        double width = 2 * crossing / pointsPerBin;

        // Highest sidelobe: the largest value after the first minimum of the main lobe.
        int k = j;
        while (k + 1 < db.Length && db[k + 1] < db[k]) k++;
        double highest = db.Skip(k).Max();

        Assert.True(Math.Abs(highest - sidelobeDb) < sidelobeToleranceDb, $"highest sidelobe {highest:F2} dB, expected {sidelobeDb} dB");
        Assert.True(Math.Abs(width - widthBins) < WidthToleranceBins, $"−3 dB width {width:F3} bins, expected {widthBins}");
    }
}
