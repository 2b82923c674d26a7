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

    /// <summary>e^(+2πij/M) for j &lt; M/2, and the bit reversal of the M/2-point complex transform.</summary>
    private static (Complex[] Twiddles, int[] Reversed) Plan(int m) => Plans.GetOrAdd(m, length =>
    {
        var twiddles = new Complex[length / 2];
        for (int j = 0; j < twiddles.Length; j++) twiddles[j] = Complex.FromPolarCoordinates(1, 2 * Math.PI * j / length);
        int half = length / 2;
        int bits = System.Numerics.BitOperations.Log2((uint)half);
        var reversed = new int[half];
        for (int i = 0; i < half; i++)
        {
            int r = 0;
            for (int b = 0; b < bits; b++) r |= ((i >> b) & 1) << (bits - 1 - b);
            reversed[i] = r;
        }
        return (twiddles, reversed);
    });

    /// <summary>
    /// Real samples of the inverse transform of the spectrum whose bins 0..M/2 are given (higher bins are the complex
    /// conjugates; bins past <paramref name="given"/>'s length are zero).
    /// </summary>
    /// <remarks>The real M-point transform as one complex M/2-point transform: with X_(k+M/2) = conj(X_(M/2−k)),
    /// x_2n = Σ_k E_k e^(2πikn/(M/2)) and x_(2n+1) = Σ_k O_k e^(2πikn/(M/2)) for E_k = X_k + conj(X_(M/2−k)) and
    /// O_k = (X_k − conj(X_(M/2−k)))·e^(2πik/M), both Hermitian, so z = IDFT(E + jO) holds x_2n + j·x_(2n+1).</remarks>
    /// <param name="given">X_0 … X_(K−1), K ≤ M/2 + 1.</param>
    /// <param name="m">Transform length M, a power of two ≥ 2.</param>
    internal static double[] Real(ReadOnlySpan<Complex> given, int m)
    {
        var x = new double[m];
        Real(given, m, x);
        return x;
    }

    /// <summary>As <see cref="Real(ReadOnlySpan{Complex}, int)"/>, into <paramref name="x"/> (at least M long); the work
    /// array is pooled, so repeated transforms allocate nothing.</summary>
    internal static void Real(ReadOnlySpan<Complex> given, int m, Span<double> x)
    {
        var (twiddles, reversed) = Plan(m);
        int half = m / 2;
        Complex X(int k, ReadOnlySpan<Complex> g) => k < g.Length ? g[k] : Complex.Zero;
        var rented = SweepBuffers<Complex>.Rent(half);
        var a = rented.AsSpan(0, half);
        for (int k = 0; k < half; k++)
        {
            Complex xk = X(k, given), xm = Complex.Conjugate(X(half - k, given));
            Complex e = xk + xm, o = (xk - xm) * twiddles[k];
            a[reversed[k]] = new Complex(e.Real - o.Imaginary, e.Imaginary + o.Real);
        }
        for (int size = 2; size <= half; size <<= 1)
        {
            int halfSize = size / 2, step = 2 * (half / size);
            for (int start = 0; start < half; start += size)
            {
                for (int j = 0; j < halfSize; j++)
                {
                    Complex u = a[start + j], v = ComplexMath.Multiply(a[start + j + halfSize], twiddles[j * step]);
                    a[start + j] = u + v;
                    a[start + j + halfSize] = u - v;
                }
            }
        }
        for (int n = 0; n < half; n++)
        {
            x[2 * n] = a[n].Real;
            x[2 * n + 1] = a[n].Imaginary;
        }
        SweepBuffers<Complex>.Return(rented);
    }
}
