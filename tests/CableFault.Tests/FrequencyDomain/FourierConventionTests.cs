using System.Numerics;
using MathNet.Numerics.IntegralTransforms;

namespace CableFault.Tests.FrequencyDomain;

/// <summary>
/// The converter relies on MathNet's inverse transforms with <see cref="FourierOptions.NoScaling"/> computing
/// x_n = Σ_k X_k e^(+2πikn/M) with no 1/M. These tests check that against a slow, obvious direct sum (seeded data).
/// </summary>
public class FourierConventionTests
{
    /// <summary>Double-precision FFT of 64 points agrees with the direct sum to ~1e-13 of the values' scale.</summary>
    private const double Tolerance = 1e-10;

    [Fact]
    public void Complex_inverse_without_scaling_has_positive_exponent_and_no_division()
    {
        var random = new Random(7);
        const int m = 64;
        var x = Enumerable.Range(0, m).Select(_ => new Complex(random.NextDouble() - 0.5, random.NextDouble() - 0.5)).ToArray();
        var fast = (Complex[])x.Clone();
        Fourier.Inverse(fast, FourierOptions.NoScaling);
        for (int n = 0; n < m; n++)
        {
            Complex slow = 0;
            for (int k = 0; k < m; k++) slow += x[k] * Complex.Exp(new Complex(0, 2 * Math.PI * k * n / m));
            Assert.True((fast[n] - slow).Magnitude < Tolerance, $"n = {n}");
        }
    }

    [Fact]
    public void Real_inverse_of_a_packed_half_spectrum_equals_the_hermitian_sum()
    {
        var random = new Random(11);
        const int m = 64;
        var half = new Complex[m / 2 + 1];
        for (int k = 0; k <= m / 2; k++) half[k] = new Complex(random.NextDouble() - 0.5, k == 0 || k == m / 2 ? 0 : random.NextDouble() - 0.5);
        var packed = new double[m + 2];
        for (int k = 0; k <= m / 2; k++) { packed[2 * k] = half[k].Real; packed[2 * k + 1] = half[k].Imaginary; }
        Fourier.InverseReal(packed, m, FourierOptions.NoScaling);
        for (int n = 0; n < m; n++)
        {
            // Full Hermitian spectrum: X_(M−k) = X_k*.
            double slow = half[0].Real + half[m / 2].Real * Math.Cos(Math.PI * n);
            for (int k = 1; k < m / 2; k++) slow += 2 * (half[k] * Complex.Exp(new Complex(0, 2 * Math.PI * k * n / m))).Real;
            Assert.True(Math.Abs(packed[n] - slow) < Tolerance, $"n = {n}");
        }
    }
}
