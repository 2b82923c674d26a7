using System.Numerics;
using System.Runtime.CompilerServices;

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
}
