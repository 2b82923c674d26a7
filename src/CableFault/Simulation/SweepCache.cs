using System.Collections.Concurrent;
using System.Numerics;
using CableFault.Cables;

namespace CableFault.Simulation;

/// <summary>
/// Per-bin quantities of the forward model kept across calls that share a frequency contour: the stimulus factor,
/// each medium's propagation and each lossy segment's e^(−2γl). A model fit simulates the same run hundreds of times
/// with one or two lengths or lumped values changed (every Jacobian column), so nearly all of these repeat; the
/// per-bin square roots, powers and exponentials then cost once rather than once per call.
/// </summary>
/// <remarks>Thread-safe (the Jacobian's columns are simulated in parallel). Entries are keyed by the exact doubles
/// they were computed from, so a hit gives the same numbers a fresh evaluation would.</remarks>
internal sealed class SweepCache
{
    /// <summary>Entries kept before the cache is emptied (each holds a few complex arrays of one per bin).</summary>
    private const int MaximumEntries = 400;

    internal readonly record struct Grid(int FftLength, double Sigma, double DOmega, int BinCount);

    private readonly record struct MediumKey(Grid Grid, double ImpedanceOhms, double VelocityFactor, CableLossModel Loss);

    private readonly record struct SegmentKey(MediumKey Medium, double LengthMeters);

    private readonly record struct EdgeKey(Grid Grid, EdgeShape Shape, double RiseSeconds, double SettlingFraction, double SettlingSeconds);

    private readonly record struct DelayKey(Grid Grid, double EdgeCentreSeconds);

    /// <summary>A medium per bin: γ, Z_c, Z′, Y′ and 1/Z_c.</summary>
    internal sealed record MediumBins(Complex[] Gamma, Complex[] Zc, Complex[] ZSeries, Complex[] YShunt, Complex[] InverseZc);

    /// <summary>A lossy segment per bin: e^(−2γl) (see <see cref="NetworkEvaluator.ApplyTravellingWaves"/>), and over its
    /// first <see cref="SmallBins"/> bins, where |γl| is small, the scaled ABCD entries of
    /// <see cref="NetworkEvaluator.SegmentMatrix"/> from their series instead: there 1 − e loses digits (about ε/|γl|
    /// relative), and at s = 0 on a contour through the origin γ = 0, where the waves' form would drop the series
    /// resistance R′l that the series keeps. The medium's bins it was made from come with it
    /// (its Z_c and 1/Z_c apply the waves).</summary>
    internal sealed record SegmentBins(Complex[] E, int SmallBins, Complex[] A, Complex[] B, Complex[] C, MediumBins Medium);

    private readonly ConcurrentDictionary<MediumKey, MediumBins> _media = new();
    private readonly ConcurrentDictionary<SegmentKey, SegmentBins> _segments = new();
    private readonly ConcurrentDictionary<EdgeKey, Complex[]> _edges = new();
    private readonly ConcurrentDictionary<DelayKey, Complex[]> _delays = new();

    private readonly record struct UndampingKey(double Sigma, double IntervalSeconds, int Shift, int Stride, int Count);

    private readonly ConcurrentDictionary<UndampingKey, double[]> _undamping = new();

    private static MediumKey KeyOf(Grid grid, CableMedium medium) => new(grid, medium.ImpedanceOhms, medium.VelocityFactor, medium.Loss);

    /// <summary>Complex numbers held before the cache is emptied (2²⁴, 256 MB): a fit's usual grids never reach it
    /// within <see cref="MaximumEntries"/>, but a lossy run on a long grid would hold gigabytes.</summary>
    private const long MaximumComplexElements = 1L << 24;

    /// <summary>Entries added since the cache was last emptied (ConcurrentDictionary.Count takes every lock).</summary>
    private int _entries;

    /// <summary>Complex numbers in the entries added since the cache was last emptied.</summary>
    private long _elements;

    /// <summary>Empties the cache when one more entry of <paramref name="elements"/> complex numbers would take it past
    /// either limit (emptying changes no result: entries are keyed by the exact inputs).</summary>
    private void Trim(long elements)
    {
        long total = Interlocked.Add(ref _elements, elements);
        if (Interlocked.Increment(ref _entries) <= MaximumEntries && total <= MaximumComplexElements) return;
        Interlocked.Exchange(ref _entries, 0);
        Interlocked.Exchange(ref _elements, 0);
        _segments.Clear();
        _media.Clear();
        _edges.Clear();
        _delays.Clear();
        _undamping.Clear();
        _roots.Clear();
        _dielectric.Clear();
    }

    /// <summary>e^(σt) at each kept sample t = (<paramref name="shift"/> + i·<paramref name="stride"/>)·Δt, computed as
    /// <see cref="ForwardModel"/> does: the factor that undoes the contour's damping, the same for every run on a grid
    /// whose edge sits at the same internal sample.</summary>
    internal double[] Undamping(double sigma, double intervalSeconds, int shift, int stride, int count)
    {
        var key = new UndampingKey(sigma, intervalSeconds, shift, stride, count);
        if (_undamping.TryGetValue(key, out var cached)) return cached;
        var factors = new double[count];
        for (int i = 0; i < count; i++) factors[i] = Math.Exp(sigma * ((shift + i * stride) * intervalSeconds));
        // Real numbers: half the size of a complex entry.
        Trim((count + 1) / 2);
        return _undamping.GetOrAdd(key, factors);
    }

    /// <summary>E(s) and e^(−s·t_c) per bin, computed as <see cref="ForwardModel"/> does. Kept apart: a change of the
    /// edge's time (the time-offset column of a Jacobian) keeps E, a change of its rise keeps the delay.</summary>
    internal (Complex[] Edge, Complex[] Delay) Stimulus(Grid grid, EdgeShape shape, double riseSeconds, double edgeCentreSeconds,
        double settlingFraction = 0, double settlingSeconds = 0) =>
        (Edge(grid, shape, riseSeconds, settlingFraction, settlingSeconds), Delay(grid, edgeCentreSeconds));

    private Complex[] Edge(Grid grid, EdgeShape shape, double riseSeconds, double settlingFraction, double settlingSeconds)
    {
        var key = new EdgeKey(grid, shape, riseSeconds, settlingFraction, settlingSeconds);
        if (_edges.TryGetValue(key, out var cached)) return cached;
        var edge = new Complex[grid.BinCount];
        // A complex exponential per bin, each on its own: the halves may run side by side (BinSplitting).
        BinSplitting.ForHalves(grid.BinCount, (from, to) =>
        {
            for (int k = from; k < to; k++)
            {
                var s = new Complex(grid.Sigma, k * grid.DOmega);
                edge[k] = StimulusSpectrum.Evaluate(shape, riseSeconds, s);
                // Only a settling step multiplies: an edge that settles at once keeps exactly its old numbers.
                if (settlingFraction != 0) edge[k] *= StimulusSpectrum.Settling(settlingFraction, settlingSeconds, s);
            }
        });
        Trim(grid.BinCount);
        return _edges.GetOrAdd(key, edge);
    }

    private Complex[] Delay(Grid grid, double edgeCentreSeconds)
    {
        var key = new DelayKey(grid, edgeCentreSeconds);
        if (_delays.TryGetValue(key, out var cached)) return cached;
        var delays = new Complex[grid.BinCount];
        Complex delayStep = Complex.FromPolarCoordinates(1, -grid.DOmega * edgeCentreSeconds);
        Complex delay = Complex.One;
        for (int k = 0; k < grid.BinCount; k++)
        {
            var s = new Complex(grid.Sigma, k * grid.DOmega);
            if ((k & 255) == 0) delay = Complex.Exp(-s * edgeCentreSeconds);
            else delay *= delayStep;
            delays[k] = delay;
        }
        Trim(grid.BinCount);
        return _delays.GetOrAdd(key, delays);
    }

    /// <summary>γ, Z_c, Z′, Y′ and 1/Z_c of a medium per bin: Z′ and Y′ as <see cref="CableMedium"/> computes them; for a
    /// lossy medium γ and Z_c from <see cref="LossyPropagation"/> (within a few ulp of NetworkEvaluator.Propagation's
    /// complex root and division).</summary>
    internal MediumBins Medium(Grid grid, CableMedium medium)
    {
        var key = KeyOf(grid, medium);
        if (_media.TryGetValue(key, out var cached)) return cached;
        int count = grid.BinCount;
        var bins = new MediumBins(new Complex[count], new Complex[count], new Complex[count], new Complex[count], new Complex[count]);
        if (medium.IsLossless)
        {
            for (int k = 0; k < count; k++)
            {
                var s = new Complex(grid.Sigma, k * grid.DOmega);
                var (gamma, zc, z, y) = NetworkEvaluator.Propagation(medium, s);
                (bins.Gamma[k], bins.Zc[k], bins.ZSeries[k], bins.YShunt[k]) = (gamma, zc, z, y);
                bins.InverseZc[k] = 1 / medium.ImpedanceOhms;
            }
        }
        else
        {
            // √s and the dielectric factor are the same for every medium of the grid (with that exponent): a fit's Jacobian
            // makes a new medium for each impedance it moves, and these complex roots and powers were most of the cost.
            Complex[]? roots = medium.SkinCoefficient == 0 ? null : RootsOfS(grid);
            Complex[]? factors = medium.DielectricExponent == 0 ? null : DielectricFactors(grid, medium.DielectricExponent);
            double[] zr = SweepBuffers<double>.Rent(count), zi = SweepBuffers<double>.Rent(count);
            double[] yr = SweepBuffers<double>.Rent(count), yi = SweepBuffers<double>.Rent(count);
            for (int k = 0; k < count; k++)
            {
                var s = new Complex(grid.Sigma, k * grid.DOmega);
                Complex z = medium.SeriesImpedanceOhmsPerMeter(s, roots?[k] ?? 0), y = medium.ShuntAdmittanceSiemensPerMeter(s, factors?[k] ?? 1);
                (bins.ZSeries[k], bins.YShunt[k]) = (z, y);
                (zr[k], zi[k], yr[k], yi[k]) = (z.Real, z.Imaginary, y.Real, y.Imaginary);
            }
            LossyPropagation.Compute(zr.AsSpan(0, count), zi.AsSpan(0, count), yr.AsSpan(0, count), yi.AsSpan(0, count),
                medium.ImpedanceOhms, bins.Gamma, bins.Zc, bins.InverseZc);
            SweepBuffers<double>.Return(zr);
            SweepBuffers<double>.Return(zi);
            SweepBuffers<double>.Return(yr);
            SweepBuffers<double>.Return(yi);
        }
        Trim(5L * grid.BinCount);
        return _media.GetOrAdd(key, bins);
    }

    private readonly ConcurrentDictionary<Grid, Complex[]> _roots = new();
    private readonly ConcurrentDictionary<(Grid Grid, double Exponent), Complex[]> _dielectric = new();

    /// <summary>√s per bin, as <see cref="CableMedium.SeriesImpedanceOhmsPerMeter(Complex)"/> computes it.</summary>
    private Complex[] RootsOfS(Grid grid)
    {
        if (_roots.TryGetValue(grid, out var cached)) return cached;
        var roots = new Complex[grid.BinCount];
        for (int k = 0; k < roots.Length; k++) roots[k] = Complex.Sqrt(new Complex(grid.Sigma, k * grid.DOmega));
        Trim(grid.BinCount);
        return _roots.GetOrAdd(grid, roots);
    }

    /// <summary><see cref="CableMedium.DielectricFactor"/> per bin for one exponent.</summary>
    private Complex[] DielectricFactors(Grid grid, double exponent)
    {
        if (_dielectric.TryGetValue((grid, exponent), out var cached)) return cached;
        var factors = new Complex[grid.BinCount];
        for (int k = 0; k < factors.Length; k++) factors[k] = CableMedium.DielectricFactor(new Complex(grid.Sigma, k * grid.DOmega), exponent);
        Trim(grid.BinCount);
        return _dielectric.GetOrAdd((grid, exponent), factors);
    }

    /// <summary>A lossy segment's per-bin factors (see <see cref="SegmentBins"/>); lossless segments are computed in place
    /// (see NetworkEvaluator.EvaluateSweep).</summary>
    /// <remarks>e^(−2γl) is taken several bins at a time (<see cref="VectorExponential"/>): the scalar complex exponential
    /// of every bin of every new segment length was about a fifth of a lossy locate's processor time.</remarks>
    internal SegmentBins Segment(Grid grid, CableMedium medium, double lengthMeters)
    {
        var key = new SegmentKey(KeyOf(grid, medium), lengthMeters);
        if (_segments.TryGetValue(key, out var cached)) return cached;
        var m = Medium(grid, medium);
        int count = grid.BinCount;
        // |γl| grows with the frequency, so the bins too small for Z_c are the first few (usually only bin 0).
        int small = 0;
        while (small < count && (m.Gamma[small] * lengthMeters).Magnitude < NetworkEvaluator.SmallArgument) small++;
        var bins = new SegmentBins(new Complex[count], small, new Complex[small], new Complex[small], new Complex[small], m);
        for (int k = 0; k < small; k++)
            (bins.A[k], bins.B[k], bins.C[k]) = NetworkEvaluator.SegmentMatrix(m.Gamma[k] * lengthMeters, m.Zc[k],
                m.ZSeries[k] * lengthMeters, m.YShunt[k] * lengthMeters);
        double[] real = SweepBuffers<double>.Rent(count), imaginary = SweepBuffers<double>.Rent(count);
        for (int k = 0; k < count; k++)
        {
            real[k] = -2 * lengthMeters * m.Gamma[k].Real;
            imaginary[k] = -2 * lengthMeters * m.Gamma[k].Imaginary;
        }
        VectorExponential.Fill(real.AsSpan(0, count), imaginary.AsSpan(0, count), bins.E);
        SweepBuffers<double>.Return(real);
        SweepBuffers<double>.Return(imaginary);
        Trim(count + 3L * small);
        return _segments.GetOrAdd(key, bins);
    }
}
