using System.Numerics;
using System.Runtime.Intrinsics;
using CableFault.Simulation;

namespace CableFault.Tests.Physics;

/// <summary>
/// The sweep's lossless segments, the spectrum and the inverse FFT's butterflies work on [re, im] vectors and are kept bit for bit what
/// the scalar complex arithmetic gives (so a fit's path does not move with the instruction set). Checked on random
/// operands over many magnitudes and signs, with zeros, signed zeros, infinities and NaN among them.
/// </summary>
public class ComplexVectorTests
{
    private static IEnumerable<Complex> Operands()
    {
        var random = new Random(17);
        double[] specials = [0.0, -0.0, 1.0, -1.0, 1e-300, -1e300, double.PositiveInfinity, double.NaN];
        foreach (double re in specials)
            foreach (double im in specials)
                yield return new Complex(re, im);
        for (int i = 0; i < 2000; i++)
            yield return new Complex((random.NextDouble() - 0.5) * Math.Pow(10, random.Next(-30, 30)),
                (random.NextDouble() - 0.5) * Math.Pow(10, random.Next(-30, 30)));
    }

    private static bool SameBits(Complex expected, Vector128<double> actual) =>
        BitConverter.DoubleToInt64Bits(expected.Real) == BitConverter.DoubleToInt64Bits(actual.GetElement(0))
        && BitConverter.DoubleToInt64Bits(expected.Imaginary) == BitConverter.DoubleToInt64Bits(actual.GetElement(1))
        // NaN payloads are not part of the arithmetic's contract.
        || double.IsNaN(expected.Real) && double.IsNaN(actual.GetElement(0)) || double.IsNaN(expected.Imaginary) && double.IsNaN(actual.GetElement(1));

    [Fact]
    public void ProductIsTheScalarProductBitForBit()
    {
        var operands = Operands().ToArray();
        var random = new Random(3);
        foreach (var a in operands)
        {
            var b = operands[random.Next(operands.Length)];
            var expected = ComplexMath.Multiply(a, b);
            Assert.True(SameBits(expected, ComplexMath.Multiply(ComplexMath.AsVector(a), ComplexMath.AsVector(b))), $"{a}·{b}");
            Assert.True(SameBits(a * b, ComplexMath.MultiplyBy(ComplexMath.AsVector(a), Vector128.Create(b.Real), Vector128.Create(b.Imaginary))),
                $"{a}·{b} against the library's operator");
        }
    }

    /// <summary>Smith's quotient on vectors against the scalar one, on both of its branches (|b_i| below and not below
    /// |b_r|), divisors with a zero part included.</summary>
    [Fact]
    public void QuotientIsTheScalarQuotientBitForBit()
    {
        var operands = Operands().ToArray();
        var random = new Random(5);
        int branches = 0;
        foreach (var a in operands)
        {
            var b = operands[random.Next(operands.Length)];
            if (Math.Abs(b.Imaginary) < Math.Abs(b.Real)) branches |= 1;
            else branches |= 2;
            Assert.True(SameBits(ComplexMath.Divide(a, b), ComplexMath.Divide(ComplexMath.AsVector(a), ComplexMath.AsVector(b))), $"{a}/{b}");
        }
        Assert.Equal(3, branches);
    }

    [Fact]
    public void TimesIIsTheScalarRotationBitForBit()
    {
        foreach (var z in Operands())
            Assert.True(SameBits(new Complex(-z.Imaginary, z.Real), ComplexMath.TimesI(ComplexMath.AsVector(z))), $"j·{z}");
    }

    /// <summary>The pair's rescaling near the range of a double acts as the scalar one does, on sizes inside, at and
    /// beyond the thresholds, and on zero, infinite and NaN pairs.</summary>
    [Fact]
    public void VectorNormaliseIsTheScalarOneBitForBit()
    {
        double[] sizes = [0, 1e-320, 1e-101, 1e-100, 1e-99, 1, 1e99, 1e100, 1e101, 1e300, double.PositiveInfinity, double.NaN];
        foreach (double sn in sizes)
            foreach (double sd in sizes)
            {
                Complex n = new(0.3 * sn, -0.7 * sn), d = new(-0.6 * sd, 0.4 * sd);
                Vector128<double> vn = ComplexMath.AsVector(n), vd = ComplexMath.AsVector(d);
                NetworkEvaluator.Normalise(ref n, ref d);
                NetworkEvaluator.Normalise(ref vn, ref vd);
                Assert.True(SameBits(n, vn) && SameBits(d, vd), $"sizes {sn} and {sd}");
            }
    }
}
