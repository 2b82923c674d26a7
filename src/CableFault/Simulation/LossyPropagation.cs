using System.Numerics;

namespace CableFault.Simulation;

/// <summary>
/// A lossy medium's propagation constant γ = √(Z′Y′), characteristic impedance Z_c = Z′/γ and its inverse 1/Z_c = Y′/γ
/// for many bins at once, several bins per vector: a fit makes a new medium for every impedance it moves, and these
/// complex roots and divisions per bin were a fifth of a lossy locate's processor time.
/// </summary>
/// <remarks>
/// The principal root of w = a + jb by the usual stable formula: with r = |w| and t = √((r + |a|)/2), √w = t + j·b/(2t)
/// when a ≥ 0, else |b|/(2t) + j·sign(b)·t (no difference of nearly equal numbers). Since |γ|² = |w| = r, 1/γ = γ*/r, so Z_c
/// and 1/Z_c take products only. |w| is formed without rescaling: per-metre impedances and admittances of cables are far
/// from the squares' overflow (10¹⁵⁴); where the squares vanish (w = 0 at s = 0, or below 10⁻¹⁶² by underflow) the bin
/// is taken as γ = 0.
/// </remarks>
internal static class LossyPropagation
{
    /// <summary>γ, Z_c and 1/Z_c from Z′ and Y′ given as real and imaginary parts per bin; where Z′Y′ = 0 (s = 0 on a
    /// lossless contour), γ = 0 and Z_c = <paramref name="nominalOhms"/>, as <see cref="NetworkEvaluator.Propagation(Cables.CableMedium, Complex)"/>
    /// takes it.</summary>
    internal static void Compute(ReadOnlySpan<double> zReal, ReadOnlySpan<double> zImaginary, ReadOnlySpan<double> yReal,
        ReadOnlySpan<double> yImaginary, double nominalOhms, Span<Complex> gamma, Span<Complex> zc, Span<Complex> inverseZc)
    {
        int count = gamma.Length, width = Vector<double>.Count, i = 0;
        Span<double> lanes = stackalloc double[6 * width];
        for (; i + width <= count; i += width)
        {
            var zr = new Vector<double>(zReal.Slice(i, width));
            var zi = new Vector<double>(zImaginary.Slice(i, width));
            var yr = new Vector<double>(yReal.Slice(i, width));
            var yi = new Vector<double>(yImaginary.Slice(i, width));
            var (gr, gi, inverseR) = Root(zr * yr - zi * yi, zr * yi + zi * yr);
            // Z_c = Z′·γ*/r and 1/Z_c = Y′·γ*/r.
            ((zr * gr + zi * gi) * inverseR).CopyTo(lanes);
            ((zi * gr - zr * gi) * inverseR).CopyTo(lanes[width..]);
            ((yr * gr + yi * gi) * inverseR).CopyTo(lanes[(2 * width)..]);
            ((yi * gr - yr * gi) * inverseR).CopyTo(lanes[(3 * width)..]);
            gr.CopyTo(lanes[(4 * width)..]);
            gi.CopyTo(lanes[(5 * width)..]);
            for (int l = 0; l < width; l++)
            {
                zc[i + l] = new Complex(lanes[l], lanes[width + l]);
                inverseZc[i + l] = new Complex(lanes[2 * width + l], lanes[3 * width + l]);
                gamma[i + l] = new Complex(lanes[4 * width + l], lanes[5 * width + l]);
            }
        }
        for (; i < count; i++)
        {
            double zr = zReal[i], zi = zImaginary[i], yr = yReal[i], yi = yImaginary[i];
            var (gr, gi, inverseR) = Root(zr * yr - zi * yi, zr * yi + zi * yr);
            zc[i] = new Complex((zr * gr + zi * gi) * inverseR, (zi * gr - zr * gi) * inverseR);
            inverseZc[i] = new Complex((yr * gr + yi * gi) * inverseR, (yi * gr - yr * gi) * inverseR);
            gamma[i] = new Complex(gr, gi);
        }
        for (i = 0; i < count; i++)
        {
            // |w|² as the root formed it: zero there made 1/|w| infinite.
            double a = zReal[i] * yReal[i] - zImaginary[i] * yImaginary[i], b = zReal[i] * yImaginary[i] + zImaginary[i] * yReal[i];
            if (a * a + b * b == 0)
            {
                gamma[i] = Complex.Zero;
                zc[i] = nominalOhms;
                inverseZc[i] = 1 / nominalOhms;
            }
        }
    }

    /// <summary>The principal root of a + jb per lane, and 1/|a + jb|.</summary>
    private static (Vector<double> Real, Vector<double> Imaginary, Vector<double> InverseSize) Root(Vector<double> a, Vector<double> b)
    {
        var r = Vector.SquareRoot(a * a + b * b);
        var t = Vector.SquareRoot((r + Vector.Abs(a)) * 0.5);
        var q = b / (t + t);
        var rightHalf = Vector.GreaterThanOrEqual(a, Vector<double>.Zero);
        var real = Vector.ConditionalSelect(rightHalf, t, Vector.Abs(q));
        var imaginary = Vector.ConditionalSelect(rightHalf, q, Vector.ConditionalSelect(Vector.LessThan(b, Vector<double>.Zero), -t, t));
        return (real, imaginary, Vector<double>.One / r);
    }

    /// <summary>As the vector <see cref="Root(Vector{double}, Vector{double})"/> for one bin.</summary>
    private static (double Real, double Imaginary, double InverseSize) Root(double a, double b)
    {
        double r = Math.Sqrt(a * a + b * b), t = Math.Sqrt((r + Math.Abs(a)) * 0.5), q = b / (t + t);
        return a >= 0 ? (t, q, 1 / r) : (Math.Abs(q), b < 0 ? -t : t, 1 / r);
    }
}
