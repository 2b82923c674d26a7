using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;
using CableFault.Cables;

namespace CableFault.Simulation;

/// <summary>
/// Evaluates the input impedance of a compiled network at one complex frequency s, as a homogeneous pair (N, D), Z = N/D.
/// </summary>
/// <remarks>
/// Each segment applies its ABCD matrix (Pozar, <i>Microwave Engineering</i>, 4th ed., Table 4.1):
/// A = D = cosh γl, B = Z_c sinh γl, C = sinh γl / Z_c, so N′ = A·N + B·D and D′ = C·N + A·D, which is
/// Z_in = Z_c (Z_L + Z_c tanh γl)/(Z_c + Z_L tanh γl). All four entries are scaled by e^(−γl) (a common factor cancels
/// in N/D), so a very lossy segment cannot overflow: cosh → (1 + e)/2, sinh → (1 − e)/2, e = e^(−2γl).
/// Junction branches combine as parallel admittances; shunt parts add admittance, series parts add impedance.
/// </remarks>
internal sealed class NetworkEvaluator
{
    private readonly CompiledNetwork _network;
    private readonly Complex[] _stackN;
    private readonly Complex[] _stackD;
    private readonly Complex[] _gamma;
    private readonly Complex[] _zc;
    private readonly Complex[] _zSeries;
    private readonly Complex[] _yShunt;

    internal NetworkEvaluator(CompiledNetwork network)
    {
        _network = network;
        _stackN = new Complex[network.MaxStackDepth + 1];
        _stackD = new Complex[network.MaxStackDepth + 1];
        _gamma = new Complex[network.Media.Length];
        _zc = new Complex[network.Media.Length];
        _zSeries = new Complex[network.Media.Length];
        _yShunt = new Complex[network.Media.Length];
    }

    /// <summary>Input impedance pair at complex frequency s (rad/s).</summary>
    internal (Complex N, Complex D) Evaluate(Complex s)
    {
        var media = _network.Media;
        for (int m = 0; m < media.Length; m++)
            (_gamma[m], _zc[m], _zSeries[m], _yShunt[m]) = Propagation(media[m], s);

        int top = -1;
        foreach (var op in _network.Ops)
        {
            switch (op.Kind)
            {
                case CompiledNetwork.OpKind.Open: top++; _stackN[top] = 1; _stackD[top] = 0; break;
                case CompiledNetwork.OpKind.Short: top++; _stackN[top] = 0; _stackD[top] = 1; break;
                case CompiledNetwork.OpKind.Resistor: top++; _stackN[top] = op.Value; _stackD[top] = 1; break;
                case CompiledNetwork.OpKind.Matched: top++; _stackN[top] = _zc[op.Medium]; _stackD[top] = 1; break;
                case CompiledNetwork.OpKind.ResistorParallelCapacitor:
                    top++; _stackN[top] = op.Value; _stackD[top] = 1 + s * op.Value * op.Value2; break;
                case CompiledNetwork.OpKind.ShuntC: _stackD[top] += s * op.Value * _stackN[top]; break;
                case CompiledNetwork.OpKind.ShuntR: _stackD[top] += _stackN[top] / op.Value; break;
                case CompiledNetwork.OpKind.SeriesL: _stackN[top] += s * op.Value * _stackD[top]; break;
                case CompiledNetwork.OpKind.SeriesR: _stackN[top] += op.Value * _stackD[top]; break;
                case CompiledNetwork.OpKind.Segment:
                    ApplySegment(ref _stackN[top], ref _stackD[top], _gamma[op.Medium] * op.Value,
                        _zc[op.Medium], _zSeries[op.Medium] * op.Value, _yShunt[op.Medium] * op.Value);
                    break;
                case CompiledNetwork.OpKind.Junction:
                    for (int b = 1; b < op.Count; b++)
                    {
                        Complex n1 = _stackN[top - 1], d1 = _stackD[top - 1], n2 = _stackN[top], d2 = _stackD[top];
                        top--;
                        _stackN[top] = n1 * n2;
                        _stackD[top] = d1 * n2 + d2 * n1;
                        Normalise(ref _stackN[top], ref _stackD[top]);
                    }
                    break;
            }
        }
        return (_stackN[0], _stackD[0]);
    }

    /// <summary>
    /// Input impedance pairs at every bin of <paramref name="grid"/>, with the per-bin propagation and segment matrices
    /// taken from <paramref name="cache"/>: the same arithmetic as <see cref="Evaluate"/> without its transcendental calls.
    /// </summary>
    /// <returns>Arrays from <see cref="SweepBuffers{T}"/>, at least <see cref="SweepCache.Grid.BinCount"/> long
    /// (entries past it are undefined): the caller returns them.</returns>
    /// <param name="network">The compiled run.</param>
    /// <param name="cache">Per-bin tables.</param>
    /// <param name="grid">The contour.</param>
    /// <param name="resumeFrom">Pairs recorded on <paramref name="grid"/> for a network that may share this one's first
    /// operations: those are not evaluated again (see <see cref="SweepSnapshots"/>).</param>
    /// <param name="record">Receives the top pair after every operation.</param>
    internal static (Complex[] N, Complex[] D) EvaluateSweep(CompiledNetwork network, SweepCache cache, SweepCache.Grid grid,
        SweepSnapshots? resumeFrom = null, SweepSnapshots? record = null)
    {
        if (resumeFrom is not null && record is not null)
            throw new ArgumentException("A sweep that resumes from recorded pairs does not record.", nameof(record));
        // Operations outer, bins inner: each operation is one tight loop over the bins (no dispatch per bin).
        using var sweep = new BinSweep(network, cache, grid, resumeFrom);
        if (record is null) sweep.Run(0, grid.BinCount);
        else sweep.RunRecording(record);
        return (sweep.N, sweep.D);
    }

    /// <summary>
    /// Applies a lossless segment's ABCD matrix (scaled by e^(−γl), see <see cref="SegmentMatrix"/>) to the load pairs of
    /// bins [<paramref name="from"/>, <paramref name="to"/>). There γ = s/v, so e^(−2γl) = e^(−2σl/v)·e^(−j2kΔω·l/v) turns by a fixed phasor per bin: one multiplication per
    /// bin instead of a complex exponential, refreshed exactly every 256 bins (and after a small-argument bin) so rounding
    /// cannot accumulate (≲ 256 ulp); Z_c is real, so C = sinh/Z_c is a scaling. Computed in place rather than kept in
    /// <see cref="SweepCache"/>: reading three stored complex arrays per bin cost more than this arithmetic. A range
    /// that starts at a multiple of 256 computes the bits of the whole sweep's pass (its first bin is an exact refresh
    /// either way).
    /// </summary>
    internal static void ApplyLosslessSegment(Complex[] n, Complex[] d, SweepCache.Grid grid, CableMedium medium, double lengthMeters,
        int from, int to)
    {
        double v = medium.VelocityMetersPerSecond;
        Complex step = Complex.FromPolarCoordinates(1, -grid.DOmega * (2 * lengthMeters / v));
        double z = medium.ImpedanceOhms, y = 1 / z;
        int k = from;
        // |γl| grows with the bin, so the small-argument bins come first, each from the series.
        for (; k < to; k++)
        {
            var s = new Complex(grid.Sigma, k * grid.DOmega);
            // The same operations as Propagation's γ = s/v times l.
            Complex gammaLength = s / v * lengthMeters;
            if (gammaLength.Magnitude >= SmallArgument) break;
            var (a, b, c) = SegmentMatrix(gammaLength, z, s * medium.InductanceHenriesPerMeter * lengthMeters,
                s * medium.CapacitanceFaradsPerMeter * lengthMeters);
            Apply(n, d, k, a, b, c);
        }
        if (k >= to) return;
        if (to > n.Length || to > d.Length) throw new ArgumentOutOfRangeException(nameof(to), to, "Past the pairs' arrays.");
        // Each [re, im] pair is one vector; every lane sees the scalar formula's operations in its order (ComplexMath).
        // Unchecked element references: the range was checked once above.
        ref var nv = ref Unsafe.As<Complex, Vector128<double>>(ref MemoryMarshal.GetArrayDataReference(n));
        ref var dv = ref Unsafe.As<Complex, Vector128<double>>(ref MemoryMarshal.GetArrayDataReference(d));
        Vector128<double> stepReal = Vector128.Create(step.Real), stepImaginary = Vector128.Create(step.Imaginary);
        Vector128<double> zv = Vector128.Create(z), yv = Vector128.Create(y), half = Vector128.Create(0.5);
        while (k < to)
        {
            // A block up to the next multiple of 256 bins, started from the exact exponential.
            int blockEnd = Math.Min(to, (k | 255) + 1);
            var e = ComplexMath.AsVector(Complex.Exp(-2 * (new Complex(grid.Sigma, k * grid.DOmega) / v * lengthMeters)));
            for (; k < blockEnd; k++)
            {
                // With A = (1 + e)/2, B = Z_c(1 − e)/2, C = (1 − e)/(2Z_c) the matrix splits into the two travelling
                // waves: P = (N + Z_c·D)/2 passes unchanged and M = (N − Z_c·D)/2 comes back turned by e, so
                // N′ = P + e·M and D′ = (P − e·M)/Z_c: one complex product per bin instead of four.
                ref var nk = ref Unsafe.Add(ref nv, k);
                ref var dk = ref Unsafe.Add(ref dv, k);
                Vector128<double> n0 = nk, zd = dk * zv, p = (n0 + zd) * half, m = (n0 - zd) * half;
                var em = ComplexMath.Multiply(e, m);
                Vector128<double> newN = p + em, newD = (p - em) * yv;
                Normalise(ref newN, ref newD);
                nk = newN;
                dk = newD;
                e = ComplexMath.MultiplyBy(e, stepReal, stepImaginary);
            }
        }
    }

    /// <summary>
    /// A segment's scaled ABCD matrix (see <see cref="SegmentMatrix"/>) applied as its two travelling waves: with
    /// A = (1 + e)/2, B = Z_c(1 − e)/2, C = (1 − e)/(2Z_c) and e = e^(−2γl), the wave P = (N + Z_c·D)/2 passes unchanged and
    /// M = (N − Z_c·D)/2 comes back turned by e, so N′ = P + e·M and D′ = (P − e·M)/Z_c: three complex products per bin
    /// instead of four, with 1/Z_c kept per medium (the entries' C = sinh/Z_c took a division per bin of every segment).
    /// Then <see cref="Normalise(ref Complex, ref Complex)"/>.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal static void ApplyTravellingWaves(Complex[] n, Complex[] d, int k, Complex e, Complex zc, Complex inverseZc)
    {
        Complex n0 = n[k], zd = ComplexMath.Multiply(zc, d[k]);
        var p = new Complex((n0.Real + zd.Real) * 0.5, (n0.Imaginary + zd.Imaginary) * 0.5);
        var em = ComplexMath.Multiply(e, new Complex((n0.Real - zd.Real) * 0.5, (n0.Imaginary - zd.Imaginary) * 0.5));
        var newN = new Complex(p.Real + em.Real, p.Imaginary + em.Imaginary);
        var newD = ComplexMath.Multiply(new Complex(p.Real - em.Real, p.Imaginary - em.Imaginary), inverseZc);
        Normalise(ref newN, ref newD);
        n[k] = newN;
        d[k] = newD;
    }

    /// <summary>(N, D) ← (A·N + B·D, C·N + A·D) at bin <paramref name="k"/>, then <see cref="Normalise(ref Complex, ref Complex)"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal static void Apply(Complex[] n, Complex[] d, int k, Complex a, Complex b, Complex c)
    {
        Complex n0 = n[k], d0 = d[k];
        var newN = ComplexMath.Multiply(a, n0) + ComplexMath.Multiply(b, d0);
        var newD = ComplexMath.Multiply(c, n0) + ComplexMath.Multiply(a, d0);
        Normalise(ref newN, ref newD);
        n[k] = newN;
        d[k] = newD;
    }

    /// <summary>γ, Z_c, Z′ and Y′ of a medium at complex frequency s.</summary>
    internal static (Complex Gamma, Complex Zc, Complex ZSeries, Complex YShunt) Propagation(CableMedium medium, Complex s)
    {
        if (medium.IsLossless) return Propagation(medium, s, 0, 1);
        return Propagation(medium, s, medium.SkinCoefficient > 0 ? Complex.Sqrt(s) : 0, CableMedium.DielectricFactor(s, medium.DielectricExponent));
    }

    /// <summary>As <see cref="Propagation(CableMedium, Complex)"/> given √s and the medium's dielectric factor, which
    /// every medium on a frequency grid shares (see <see cref="SweepCache"/>).</summary>
    internal static (Complex Gamma, Complex Zc, Complex ZSeries, Complex YShunt) Propagation(CableMedium medium, Complex s,
        Complex rootS, Complex dielectricFactor)
    {
        if (medium.IsLossless)
            return (s / medium.VelocityMetersPerSecond, medium.ImpedanceOhms, s * medium.InductanceHenriesPerMeter,
                s * medium.CapacitanceFaradsPerMeter);
        Complex z = medium.SeriesImpedanceOhmsPerMeter(s, rootS), y = medium.ShuntAdmittanceSiemensPerMeter(s, dielectricFactor);
        Complex gamma = Complex.Sqrt(z * y);
        return (gamma, gamma == Complex.Zero ? medium.ImpedanceOhms : z / gamma, z, y);
    }

    /// <summary>Applies a segment's ABCD matrix to a load pair, scaled by e^(−γl).</summary>
    internal static void ApplySegment(ref Complex n, ref Complex d, Complex gammaLength, Complex zc, Complex zSeriesTotal, Complex yShuntTotal)
    {
        var (a, b, c) = SegmentMatrix(gammaLength, zc, zSeriesTotal, yShuntTotal);
        Complex newN = a * n + b * d;
        Complex newD = c * n + a * d;
        n = newN;
        d = newD;
        Normalise(ref n, ref d);
    }

    /// <summary>|γl| below which a segment's entries come from their series (<see cref="SegmentMatrix"/>).</summary>
    internal const double SmallArgument = 1e-4;

    /// <summary>A segment's ABCD entries A (= D), B, C scaled by e^(−γl).</summary>
    internal static (Complex A, Complex B, Complex C) SegmentMatrix(Complex gammaLength, Complex zc, Complex zSeriesTotal, Complex yShuntTotal)
    {
        if (gammaLength.Magnitude < SmallArgument)
        {
            // Small-argument series, exact to O((γl)^4): avoids 0/0 in Z_c = Z′/γ at s → 0.
            Complex g2 = gammaLength * gammaLength;
            Complex sinhc = 1 + g2 / 6;
            return (1 + g2 / 2, zSeriesTotal * sinhc, yShuntTotal * sinhc);
        }
        Complex e = Complex.Exp(-2 * gammaLength);
        Complex sh = (1 - e) * 0.5;
        return ((1 + e) * 0.5, zc * sh, sh / zc);
    }

    /// <summary>Rescales the pair when its size nears the range of a double (the ratio N/D is unchanged).</summary>
    /// <remarks>The larger of the two sizes by a plain comparison, not Math.Max: its IEEE 754-2019 handling of NaN and
    /// signed zeros compiled to a third of the lossless segment's time, and the sizes here are sums of magnitudes
    /// (never −0). They differ only when a size is NaN, where the pair is NaN and the result is NaN either way.</remarks>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal static void Normalise(ref Vector128<double> n, ref Vector128<double> d)
    {
        Vector128<double> absoluteN = Vector128.Abs(n), absoluteD = Vector128.Abs(d);
        double sizeN = absoluteN.GetElement(0) + absoluteN.GetElement(1), sizeD = absoluteD.GetElement(0) + absoluteD.GetElement(1);
        double scale = sizeN > sizeD ? sizeN : sizeD;
        // Within the range nothing changes; anything else (tiny, huge, zero, infinite, NaN) takes the full test.
        if (scale <= 1e100 && scale >= 1e-100) return;
        if (scale > 0 && double.IsFinite(scale) && (scale > 1e100 || scale < 1e-100))
        {
            var divisor = Vector128.Create(scale);
            n /= divisor;
            d /= divisor;
        }
    }

    /// <inheritdoc cref="Normalise(ref Vector128{double}, ref Vector128{double})"/>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal static void Normalise(ref Complex n, ref Complex d)
    {
        double sizeN = Math.Abs(n.Real) + Math.Abs(n.Imaginary), sizeD = Math.Abs(d.Real) + Math.Abs(d.Imaginary);
        double scale = sizeN > sizeD ? sizeN : sizeD;
        if (scale > 0 && double.IsFinite(scale) && (scale > 1e100 || scale < 1e-100))
        {
            n /= scale;
            d /= scale;
        }
    }
}
