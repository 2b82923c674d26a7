using System.Numerics;
using MathNet.Numerics;

namespace CableFault.FrequencyDomain;

/// <summary>
/// Fills the harmonic bins below the first measured frequency, DC included, for the low-pass transform.
/// </summary>
/// <remarks>
/// <para>A one-port's Γ(f) is the transform of a real response, so Γ(−f) = Γ(f)*: Re Γ is even and Im Γ odd in f, and
/// Γ(0) is real. Near DC the data of a cable are dominated by the delay of the strongest echo, Γ ≈ ρ·e^(−j2πfτ), which
/// rotates quickly from bin to bin and defeats a polynomial fit. So the delay is estimated first from the bin-to-bin
/// phase step, τ = −arg Σ Γ_(k+1)Γ_k* / (2πΔf), and removed; the remainder is slow, and is fitted with
/// Re = a₀ + a₂f² and Im = b₁f + b₃f³ over the lowest points. Γ(0) = a₀, clipped to the passive range [−1, 1].</para>
/// <para>The estimate of τ is only known modulo 1/Δf, which is harmless: on a harmonic grid e^(−j2πkΔfτ) does not change
/// when τ moves by 1/Δf, and e^0 = 1 at DC.</para>
/// </remarks>
internal static class LowFrequencyExtrapolation
{
    /// <summary>Number of lowest grid points used for the fit (4): enough to average, few enough to stay near DC.</summary>
    internal const int FitPoints = 4;

    /// <summary>Returns Γ for bins 0 … firstBin − 1 and Γ(0), given the grid values from bin <paramref name="firstBin"/> up.</summary>
    internal static (Complex[] Missing, double DcReflection, bool Clipped) Extrapolate(IReadOnlyList<Complex> gridValues, int firstBin, double stepHz)
    {
        int p = Math.Min(FitPoints, gridValues.Count);
        Complex rotation = Complex.Zero;
        for (int j = 0; j + 1 < p; j++) rotation += gridValues[j + 1] * Complex.Conjugate(gridValues[j]);
        // τ in units of 1/Δf; zero when the data carry no usable phase (e.g. a matched load).
        double delaySteps = rotation.Magnitude > 1e-12 ? -rotation.Phase / (2 * Math.PI) : 0;

        var x = new double[p];
        var re = new double[p];
        var im = new double[p];
        for (int j = 0; j < p; j++)
        {
            double bins = firstBin + j; // frequency in units of Δf keeps the fit well conditioned
            Complex d = gridValues[j] * Complex.FromPolarCoordinates(1, 2 * Math.PI * bins * delaySteps);
            x[j] = bins;
            re[j] = d.Real;
            im[j] = d.Imaginary;
        }

        double a0, a2 = 0, b1 = 0, b3 = 0;
        if (p >= 3)
        {
            var ra = Fit.LinearCombination(x, re, f => 1.0, f => f * f);
            a0 = ra[0]; a2 = ra[1];
            var ib = Fit.LinearCombination(x, im, f => f, f => f * f * f);
            b1 = ib[0]; b3 = ib[1];
        }
        else
        {
            a0 = re[0];
            if (x[0] > 0) b1 = im[0] / x[0];
        }

        if (firstBin == 0)
        {
            // DC measured: take its real part (the imaginary part of a one-port at DC is measurement error).
            double measured = gridValues[0].Real;
            return ([], Math.Clamp(measured, -1, 1), Math.Abs(measured) > 1);
        }

        double dc = Math.Clamp(a0, -1, 1);
        var missing = new Complex[firstBin];
        missing[0] = dc;
        for (int k = 1; k < firstBin; k++)
        {
            var slow = new Complex(a0 + a2 * k * k, b1 * k + b3 * k * k * k);
            missing[k] = slow * Complex.FromPolarCoordinates(1, -2 * Math.PI * k * delaySteps);
        }
        return (missing, dc, Math.Abs(a0) > 1);
    }
}
