using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.Intrinsics;

namespace CableFault.Simulation;

/// <summary>
/// Complex multiplication and division with the exact operations, in the exact order, of
/// <see cref="System.Numerics.Complex"/>'s operators (so results are bit-identical), marked for inlining: in the forward
/// model's per-bin loops the operators were compiled as calls, and the calls cost more than the arithmetic.
/// </summary>
internal static class ComplexMath
{
    /// <summary>a·b = (a_r·b_r − a_i·b_i) + j(a_i·b_r + a_r·b_i).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal static Complex Multiply(Complex a, Complex b) =>
        new(a.Real * b.Real - a.Imaginary * b.Imaginary, a.Imaginary * b.Real + a.Real * b.Imaginary);

    /// <summary>a/b by Smith's formula (Smith, <i>Comm. ACM</i> 5(8), 1962), which avoids forming |b|² and so overflows
    /// only when the quotient does.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal static Complex Divide(Complex a, Complex b)
    {
        double ar = a.Real, ai = a.Imaginary, br = b.Real, bi = b.Imaginary;
        if (Math.Abs(bi) < Math.Abs(br))
        {
            double ratio = bi / br;
            return new Complex((ar + ai * ratio) / (br + bi * ratio), (ai - ar * ratio) / (br + bi * ratio));
        }
        double inverse = br / bi;
        return new Complex((ai + ar * inverse) / (bi + br * inverse), (-ar + ai * inverse) / (bi + br * inverse));
    }

    /// <summary>A complex number as one 128-bit vector [re, im]: <see cref="Complex"/>'s own layout, so arrays of it can be
    /// read as vectors (MemoryMarshal.Cast).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal static Vector128<double> AsVector(Complex z) => Vector128.Create(z.Real, z.Imaginary);

    /// <summary>a·b on [re, im] vectors, bit for bit <see cref="Multiply(Complex, Complex)"/>: [a_r·b_r, a_i·b_r] and
    /// [a_i·b_i, a_r·b_i] are the same four products, and the subtract-add gives the same two sums (IEEE addition is
    /// exact to commute, and x + (−y) is x − y).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal static Vector128<double> Multiply(Vector128<double> a, Vector128<double> b) =>
        MultiplyBy(a, Vector128.Create(b.GetElement(0)), Vector128.Create(b.GetElement(1)));

    /// <summary>a·b with b given as [b_r, b_r] and [b_i, b_i] (a loop's fixed factor, duplicated once).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal static Vector128<double> MultiplyBy(Vector128<double> a, Vector128<double> bReal, Vector128<double> bImaginary) =>
        SubtractAdd(a * bReal, Swap(a) * bImaginary);

    /// <summary>j·z on an [re, im] vector: [−z_i, z_r].</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal static Vector128<double> TimesI(Vector128<double> z) => Vector128.Xor(Swap(z), Vector128.Create(-0.0, 0.0));

    /// <summary>a/b on [re, im] vectors, bit for bit <see cref="Divide(Complex, Complex)"/>: the same ratio and
    /// denominator, and each lane's numerator from the same products and sum, divided by the same denominator.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal static Vector128<double> Divide(Vector128<double> a, Vector128<double> b)
    {
        double br = b.GetElement(0), bi = b.GetElement(1);
        if (Math.Abs(bi) < Math.Abs(br))
        {
            double ratio = bi / br;
            // [a_r + a_i·ratio, a_i − a_r·ratio]
            return (a + Vector128.Xor(Swap(a) * Vector128.Create(ratio), Vector128.Create(0.0, -0.0))) / Vector128.Create(br + bi * ratio);
        }
        double inverse = br / bi;
        // [a_i + a_r·inverse, −a_r + a_i·inverse]
        return (Vector128.Xor(Swap(a), Vector128.Create(0.0, -0.0)) + a * Vector128.Create(inverse)) / Vector128.Create(bi + br * inverse);
    }

    /// <summary>[x₀ − y₀, x₁ + y₁]: y₀'s sign flipped, then added (no instruction-set test, which the ahead-of-time
    /// build would make at run time inside the loops).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static Vector128<double> SubtractAdd(Vector128<double> x, Vector128<double> y) =>
        x + Vector128.Xor(y, Vector128.Create(-0.0, 0.0));

    /// <summary>[z₁, z₀].</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static Vector128<double> Swap(Vector128<double> z) => Vector128.Shuffle(z, Vector128.Create(1L, 0L));
}
