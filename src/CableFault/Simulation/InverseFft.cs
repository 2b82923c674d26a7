using System.Collections.Concurrent;
using System.Numerics;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;

namespace CableFault.Simulation;

/// <summary>
/// Unscaled inverse FFT of a Hermitian spectrum to real samples, x_n = Σ_k Y_k e^(+2πikn/M), for any even M (fastest
/// when M/2 has no prime factor above 5, see <see cref="FastLength"/>). The fit evaluates the forward model thousands
/// of times at one length; this transform keeps its twiddle factors per length and runs on one thread, where the
/// general-purpose library transform re-plans (and may fan out to the thread pool) on every call and then dominated the
/// cost of an evaluation.
/// </summary>
/// <remarks>Mixed-radix Cooley–Tukey (Cooley &amp; Tukey, <i>Math. Comp.</i> 19, 1965) in Stockham's self-sorting order
/// (Cochran et al., "What is the fast Fourier transform?", <i>Proc. IEEE</i> 55(10), 1967), with radix-4, 2, 3 and 5
/// butterflies and a plain DFT for any larger prime. Checked in the tests against MathNet.Numerics' <c>Fourier.InverseReal</c>
/// for powers of two and against a compensated direct sum for other lengths.</remarks>
internal static class InverseFft
{
    private static readonly ConcurrentDictionary<int, (Complex[] Twiddles, Complex[] HalfTwiddles, int[] Radices)> Plans = new();

    /// <summary>
    /// The smallest even length ≥ <paramref name="needed"/> whose half has no prime factor above 5. A record's samples
    /// then fill the transform to within a few per cent, where a power of two wastes up to half of it, and every bin of
    /// the forward model costs the same whatever the length.
    /// </summary>
    /// <remarks>Enumerates the halves 2^a·3^b·5^c directly (a few hundred candidates even near 2⁶⁰), so a huge request
    /// costs no time; requests above 2⁶¹ are refused.</remarks>
    internal static long FastLength(long needed)
    {
        if (needed > 1L << 61) throw new ArgumentOutOfRangeException(nameof(needed), needed, "Transform length beyond 2^61.");
        long target = Math.Max(1, (needed + 1) / 2);
        long best = long.MaxValue;
        for (long p5 = 1; ; p5 *= 5)
        {
            for (long p35 = p5; ; p35 *= 3)
            {
                long half = p35;
                while (half < target) half *= 2;
                best = Math.Min(best, half);
                if (p35 >= target) break;
            }
            if (p5 >= target) break;
        }
        return 2 * best;
    }

    /// <summary>e^(+2πij/M) for j &lt; M/2 (the real transform's split), e^(+2πij/(M/2)) for j &lt; M/2 (the complex
    /// transform's twiddles), and the radices of M/2 in the order the passes take them.</summary>
    private static (Complex[] Twiddles, Complex[] HalfTwiddles, int[] Radices) Plan(int m) =>
        // A fit uses one length thousands of times; a one-off long simulation's plan is not kept (it would hold 16·M bytes
        // for the life of the process).
        m <= SweepBuffers<Complex>.MaximumPooledLength ? Plans.GetOrAdd(m, NewPlan) : NewPlan(m);

    private static (Complex[] Twiddles, Complex[] HalfTwiddles, int[] Radices) NewPlan(int length)
    {
        int half = length / 2;
        var twiddles = new Complex[half];
        for (int j = 0; j < half; j++) twiddles[j] = Complex.FromPolarCoordinates(1, 2 * Math.PI * j / length);
        var halfTwiddles = new Complex[half];
        for (int j = 0; j < half; j++) halfTwiddles[j] = Complex.FromPolarCoordinates(1, 2 * Math.PI * j / half);
        var radices = new List<int>();
        int rest = half;
        while (rest % 4 == 0) { radices.Add(4); rest /= 4; }
        foreach (int p in (ReadOnlySpan<int>)[2, 3, 5])
            while (rest % p == 0) { radices.Add(p); rest /= p; }
        for (int p = 7; rest > 1; p += 2)
            while (rest % p == 0) { radices.Add(p); rest /= p; }
        return (twiddles, halfTwiddles, radices.ToArray());
    }

    /// <summary>
    /// Real samples of the inverse transform of the spectrum whose bins 0..M/2 are given (higher bins are the complex
    /// conjugates; bins past <paramref name="given"/>'s length are zero).
    /// </summary>
    /// <remarks>The real M-point transform as one complex M/2-point transform: with X_(k+M/2) = conj(X_(M/2−k)),
    /// x_2n = Σ_k E_k e^(2πikn/(M/2)) and x_(2n+1) = Σ_k O_k e^(2πikn/(M/2)) for E_k = X_k + conj(X_(M/2−k)) and
    /// O_k = (X_k − conj(X_(M/2−k)))·e^(2πik/M), both Hermitian, so z = IDFT(E + jO) holds x_2n + j·x_(2n+1).</remarks>
    /// <param name="given">X_0 … X_(K−1), K ≤ M/2 + 1.</param>
    /// <param name="m">Transform length M, even and ≥ 2.</param>
    internal static double[] Real(ReadOnlySpan<Complex> given, int m)
    {
        var x = new double[m];
        Real(given, m, x);
        return x;
    }

    /// <summary>As <see cref="Real(ReadOnlySpan{Complex}, int)"/>, into <paramref name="x"/> (at least M long); the work
    /// arrays are pooled, so repeated transforms allocate nothing.</summary>
    internal static void Real(ReadOnlySpan<Complex> given, int m, Span<double> x)
    {
        if (m < 2 || m % 2 != 0) throw new ArgumentOutOfRangeException(nameof(m), m, "The transform length must be even and at least 2.");
        var (twiddles, halfTwiddles, radices) = Plan(m);
        int half = m / 2;
        Complex X(int k, ReadOnlySpan<Complex> g) => k < g.Length ? g[k] : Complex.Zero;
        var rentedA = SweepBuffers<Complex>.Rent(half);
        var rentedB = SweepBuffers<Complex>.Rent(half);
        var a = rentedA.AsSpan(0, half);
        var b = rentedB.AsSpan(0, half);
        for (int k = 0; k < half; k++)
        {
            Complex xk = X(k, given), xm = Complex.Conjugate(X(half - k, given));
            Complex e = xk + xm, o = ComplexMath.Multiply(xk - xm, twiddles[k]);
            a[k] = new Complex(e.Real - o.Imaginary, e.Imaginary + o.Real);
        }
        // Stockham's passes: a pass of radix r over the current length n (stride s, n·s = M/2) writes
        // y[q + s·(r·p + k)] = W_n^(p·k) · Σ_j x[q + s·(p + j·n/r)]·ω_r^(j·k), ω_r = e^(+2πi/r), W_n = e^(+2πi/n).
        int n = half, stride = 1;
        foreach (int r in radices)
        {
            int count = n / r;
            switch (r)
            {
                case 4: Radix4(a, b, count, stride, halfTwiddles); break;
                case 2: Radix2(a, b, count, stride, halfTwiddles); break;
                case 3: Radix3(a, b, count, stride, halfTwiddles); break;
                case 5: Radix5(a, b, count, stride, halfTwiddles); break;
                default: RadixAny(a, b, r, count, stride, halfTwiddles); break;
            }
            var swap = a;
            a = b;
            b = swap;
            n = count;
            stride *= r;
        }
        // z_n = x_2n + j·x_(2n+1): the complex numbers' memory is already the samples in order.
        MemoryMarshal.Cast<Complex, double>(a).CopyTo(x);
        SweepBuffers<Complex>.Return(rentedA);
        SweepBuffers<Complex>.Return(rentedB);
    }

    /// <summary>j·z.</summary>
    private static Complex TimesI(Complex z) => new(-z.Imaginary, z.Real);

    private static void Radix2(Span<Complex> x, Span<Complex> y, int count, int stride, Complex[] w)
    {
        Span<Vector128<double>> xv = Lanes(x), yv = Lanes(y);
        for (int p = 0; p < count; p++)
        {
            var (w1r, w1i) = Duplicated(w[p * stride]);
            int input = stride * p, output = stride * 2 * p;
            for (int q = 0; q < stride; q++)
            {
                Vector128<double> a0 = xv[input + q], a1 = xv[input + q + stride * count];
                yv[output + q] = a0 + a1;
                yv[output + q + stride] = ComplexMath.MultiplyBy(a0 - a1, w1r, w1i);
            }
        }
    }

    private static void Radix4(Span<Complex> x, Span<Complex> y, int count, int stride, Complex[] w)
    {
        Span<Vector128<double>> xv = Lanes(x), yv = Lanes(y);
        int jump = stride * count;
        for (int p = 0; p < count; p++)
        {
            var (w1r, w1i) = Duplicated(w[p * stride]);
            var (w2r, w2i) = Duplicated(w[2 * p * stride]);
            var (w3r, w3i) = Duplicated(w[3 * p * stride]);
            int input = stride * p, output = stride * 4 * p;
            for (int q = 0; q < stride; q++)
            {
                int i = input + q;
                Vector128<double> a0 = xv[i], a1 = xv[i + jump], a2 = xv[i + 2 * jump], a3 = xv[i + 3 * jump];
                Vector128<double> s02 = a0 + a2, d02 = a0 - a2, s13 = a1 + a3, d13 = ComplexMath.TimesI(a1 - a3);
                int o = output + q;
                yv[o] = s02 + s13;
                yv[o + stride] = ComplexMath.MultiplyBy(d02 + d13, w1r, w1i);
                yv[o + 2 * stride] = ComplexMath.MultiplyBy(s02 - s13, w2r, w2i);
                yv[o + 3 * stride] = ComplexMath.MultiplyBy(d02 - d13, w3r, w3i);
            }
        }
    }

    /// <summary>√3/2 = sin(2π/3).</summary>
    private const double Sin60 = 0.86602540378443864676;

    private static void Radix3(Span<Complex> x, Span<Complex> y, int count, int stride, Complex[] w)
    {
        Span<Vector128<double>> xv = Lanes(x), yv = Lanes(y);
        int jump = stride * count;
        Vector128<double> sin60 = Vector128.Create(Sin60), halfOf = Vector128.Create(0.5);
        for (int p = 0; p < count; p++)
        {
            var (w1r, w1i) = Duplicated(w[p * stride]);
            var (w2r, w2i) = Duplicated(w[2 * p * stride]);
            int input = stride * p, output = stride * 3 * p;
            for (int q = 0; q < stride; q++)
            {
                int i = input + q;
                Vector128<double> a0 = xv[i], a1 = xv[i + jump], a2 = xv[i + 2 * jump];
                Vector128<double> sum = a1 + a2, mid = a0 - halfOf * sum, turn = ComplexMath.TimesI(sin60 * (a1 - a2));
                int o = output + q;
                yv[o] = a0 + sum;
                yv[o + stride] = ComplexMath.MultiplyBy(mid + turn, w1r, w1i);
                yv[o + 2 * stride] = ComplexMath.MultiplyBy(mid - turn, w2r, w2i);
            }
        }
    }

    /// <summary>cos and sin of 2π/5 and 4π/5.</summary>
    private static readonly double C1 = Math.Cos(2 * Math.PI / 5), C2 = Math.Cos(4 * Math.PI / 5),
        S1 = Math.Sin(2 * Math.PI / 5), S2 = Math.Sin(4 * Math.PI / 5);

    private static void Radix5(Span<Complex> x, Span<Complex> y, int count, int stride, Complex[] w)
    {
        Span<Vector128<double>> xv = Lanes(x), yv = Lanes(y);
        int jump = stride * count;
        Vector128<double> c1 = Vector128.Create(C1), c2 = Vector128.Create(C2), s1 = Vector128.Create(S1), s2 = Vector128.Create(S2);
        for (int p = 0; p < count; p++)
        {
            var (w1r, w1i) = Duplicated(w[p * stride]);
            var (w2r, w2i) = Duplicated(w[2 * p * stride]);
            var (w3r, w3i) = Duplicated(w[3 * p * stride]);
            var (w4r, w4i) = Duplicated(w[4 * p * stride]);
            int input = stride * p, output = stride * 5 * p;
            for (int q = 0; q < stride; q++)
            {
                int i = input + q;
                Vector128<double> a0 = xv[i], a1 = xv[i + jump], a2 = xv[i + 2 * jump], a3 = xv[i + 3 * jump], a4 = xv[i + 4 * jump];
                Vector128<double> t1 = a1 + a4, t2 = a2 + a3, t3 = a1 - a4, t4 = a2 - a3;
                Vector128<double> r1 = a0 + c1 * t1 + c2 * t2, r2 = a0 + c2 * t1 + c1 * t2;
                Vector128<double> i1 = ComplexMath.TimesI(s1 * t3 + s2 * t4), i2 = ComplexMath.TimesI(s2 * t3 - s1 * t4);
                int o = output + q;
                yv[o] = a0 + t1 + t2;
                yv[o + stride] = ComplexMath.MultiplyBy(r1 + i1, w1r, w1i);
                yv[o + 2 * stride] = ComplexMath.MultiplyBy(r2 + i2, w2r, w2i);
                yv[o + 3 * stride] = ComplexMath.MultiplyBy(r2 - i2, w3r, w3i);
                yv[o + 4 * stride] = ComplexMath.MultiplyBy(r1 - i1, w4r, w4i);
            }
        }
    }

    /// <summary>The complex numbers as [re, im] vectors (the same memory; see ComplexMath): each butterfly's lanes see the
    /// scalar formula's operations in its order, so the transform's bits do not change.</summary>
    private static Span<Vector128<double>> Lanes(Span<Complex> values) => MemoryMarshal.Cast<Complex, Vector128<double>>(values);

    /// <summary>A twiddle factor as [w_r, w_r] and [w_i, w_i], for <see cref="ComplexMath.MultiplyBy"/>.</summary>
    private static (Vector128<double> Real, Vector128<double> Imaginary) Duplicated(Complex w) =>
        (Vector128.Create(w.Real), Vector128.Create(w.Imaginary));

    /// <summary>Any radix by its plain DFT: only for a prime factor above 5, which <see cref="FastLength"/> never gives.</summary>
    private static void RadixAny(Span<Complex> x, Span<Complex> y, int r, int count, int stride, Complex[] w)
    {
        int jump = stride * count, n = count * r;
        var a = new Complex[r];
        for (int p = 0; p < count; p++)
        {
            int input = stride * p, output = stride * r * p;
            for (int q = 0; q < stride; q++)
            {
                for (int j = 0; j < r; j++) a[j] = x[input + q + j * jump];
                for (int k = 0; k < r; k++)
                {
                    Complex sum = Complex.Zero;
                    // ω_r^(jk) = W_(M/2)^(jk·M/(2r)), and M/2 = n·stride.
                    for (int j = 0; j < r; j++) sum += a[j] * w[(int)((long)j * k % r * count * stride)];
                    y[output + q + k * stride] = ComplexMath.Multiply(sum, w[p * k * stride]);
                }
            }
        }
    }
}
