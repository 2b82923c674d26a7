using System.Numerics;
using CableFault.Simulation;

namespace CableFault.Tests.Physics;

/// <summary>
/// The forward model's complex exponentials several at a time (VectorExponential) against System.Numerics.Complex.Exp,
/// the scalar reference: the sizes and phases of a sweep's lossy segments (e^(−2γl)), including phases
/// up to 10⁵ rad, sizes down to e^−700, and counts no vector width divides.
/// </summary>
public class VectorExponentialTests
{
    /// <summary>Both are within a few ulp of e^z (2.2e-16 relative each), so 1e-14 of |e^z| leaves a margin and still
    /// fails on a swapped sine and cosine, a sign or a lane written to the wrong bin.</summary>
    private const double RelativeTolerance = 1e-14;

    [Theory]
    [InlineData(1, 3.0)]
    [InlineData(7, 1e3)]
    [InlineData(1901, 1e5)]
    public void ManyAtOnceMatchTheScalarExponential(int count, double largestPhase)
    {
        var random = new Random(count);
        var z = new Complex[count];
        for (int k = 0; k < count; k++)
            // Some sizes near the vector exponential's own limit (about e^−708, below which it hands a lane to the scalar one).
            z[k] = new Complex(random.NextDouble() * 60 - 50 - (k % 97 == 0 ? 650 : 0), (random.NextDouble() * 2 - 1) * largestPhase);
        double[] real = z.Select(v => v.Real).ToArray(), imaginary = z.Select(v => v.Imaginary).ToArray();
        var result = new Complex[count];
        VectorExponential.Fill(real, imaginary, result);
        for (int k = 0; k < count; k++)
        {
            var expected = Complex.Exp(z[k]);
            Assert.True((result[k] - expected).Magnitude <= RelativeTolerance * expected.Magnitude,
                $"e^{z[k]} at {k}: {result[k]} against {expected}");
        }
    }
}
