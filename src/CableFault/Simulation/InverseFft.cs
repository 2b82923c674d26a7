using System.Collections.Concurrent;
using System.Numerics;

namespace CableFault.Simulation;

/// <summary>
/// Unscaled inverse FFT of a Hermitian spectrum to real samples, x_n = Σ_k Y_k e^(+2πikn/M), for power-of-two M.
/// The fit evaluates the forward model thousands of times at one length; this transform keeps its twiddle factors
/// per length and runs on one thread, where the general-purpose library transform re-plans (and may fan out to the
/// thread pool) on every call and then dominated the cost of an evaluation.
/// </summary>
/// <remarks>Iterative radix-2 decimation in time with bit-reversed input order (Cooley &amp; Tukey, <i>Math. Comp.</i>
/// 19, 1965). Checked against MathNet.Numerics' <c>Fourier.InverseReal</c> in the tests.</remarks>
internal static class InverseFft
{
    private static readonly ConcurrentDictionary<int, (Complex[] Twiddles, int[] Reversed)> Plans = new();

    private static (Complex[] Twiddles, int[] Reversed) Plan(int m) => Plans.GetOrAdd(m, length =>
    {
        var twiddles = new Complex[length / 2];
        for (int j = 0; j < twiddles.Length; j++) twiddles[j] = Complex.FromPolarCoordinates(1, 2 * Math.PI * j / length);
        int bits = System.Numerics.BitOperations.Log2((uint)length);
        var reversed = new int[length];
        for (int i = 0; i < length; i++)
        {
            int r = 0;
            for (int b = 0; b < bits; b++) r |= ((i >> b) & 1) << (bits - 1 - b);
            reversed[i] = r;
        }
        return (twiddles, reversed);
    });

    /// <summary>
    /// Real samples of the inverse transform of the spectrum whose bins 0..M/2 are given (higher bins are the complex
    /// conjugates; bins past <paramref name="half"/>'s length are zero).
    /// </summary>
    /// <param name="half">Y_0 … Y_(K−1), K ≤ M/2 + 1.</param>
    /// <param name="m">Transform length M, a power of two ≥ 2.</param>
    internal static double[] Real(ReadOnlySpan<Complex> half, int m)
    {
        var (twiddles, reversed) = Plan(m);
        var a = new Complex[m];
        for (int k = 0; k < half.Length && k <= m / 2; k++)
        {
            a[reversed[k]] = half[k];
            if (k > 0 && k < m - k) a[reversed[m - k]] = Complex.Conjugate(half[k]);
        }
        for (int size = 2; size <= m; size <<= 1)
        {
            int halfSize = size / 2, step = m / size;
            for (int start = 0; start < m; start += size)
            {
                for (int j = 0; j < halfSize; j++)
                {
                    Complex w = twiddles[j * step];
                    Complex u = a[start + j], v = a[start + j + halfSize] * w;
                    a[start + j] = u + v;
                    a[start + j + halfSize] = u - v;
                }
            }
        }
        var x = new double[m];
        for (int i = 0; i < m; i++) x[i] = a[i].Real;
        return x;
    }
}
