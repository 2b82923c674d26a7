using System.Numerics;

namespace CableFault.Simulation;

/// <summary>
/// A network's impedance pairs at every bin after each of its operations, recorded by one sweep at a fit's base point.
/// The network is evaluated from the far end toward the port, and a Jacobian column changes one event, so the
/// operations beyond that event are the base's: the column's sweep copies the pairs there and evaluates only the rest.
/// The pairs it copies are the ones the base computed from the same operations, so the result is bit for bit a full
/// sweep's.
/// </summary>
/// <remarks>After operation i the stack's top is level <see cref="TopAfter"/>[i]; every operation writes only its top
/// level (a junction writes the level it leaves on top), so the stack before operation a is, level by level, the pair
/// recorded after the last operation before a that left that level on top. Thread-safe to read (the columns run side by
/// side); arrays are pooled and given back by <see cref="Dispose"/>.</remarks>
internal sealed class SweepSnapshots : IDisposable
{
    private readonly CompiledNetwork _network;
    private readonly Complex[]?[] _n;
    private readonly Complex[]?[] _d;

    internal SweepSnapshots(CompiledNetwork network, SweepCache.Grid grid)
    {
        _network = network;
        Grid = grid;
        _n = new Complex[network.Ops.Length][];
        _d = new Complex[network.Ops.Length][];
        TopAfter = new int[network.Ops.Length];
    }

    /// <summary>The contour the pairs were computed on.</summary>
    internal SweepCache.Grid Grid { get; }

    /// <summary>The stack's top level after each operation.</summary>
    internal int[] TopAfter { get; }

    /// <summary>Keeps a copy of the top pair after operation <paramref name="op"/>.</summary>
    internal void Record(int op, int top, Complex[] n, Complex[] d)
    {
        TopAfter[op] = top;
        _n[op] = Copy(n);
        _d[op] = Copy(d);
    }

    private Complex[] Copy(Complex[] source)
    {
        var copy = SweepBuffers<Complex>.Rent(Grid.BinCount);
        source.AsSpan(0, Grid.BinCount).CopyTo(copy);
        return copy;
    }

    /// <summary>Index of the first operation of <paramref name="network"/> that differs from the recorded network's
    /// (its length when they are the same): the operations before it compute the recorded pairs.</summary>
    internal int FirstDifference(CompiledNetwork network)
    {
        CompiledNetwork.Op[] a = _network.Ops, b = network.Ops;
        int count = Math.Min(a.Length, b.Length);
        for (int i = 0; i < count; i++)
            if (!SameOperation(a[i], _network.Media, b[i], network.Media)) return i;
        return count;
    }

    private static bool SameOperation(CompiledNetwork.Op a, Cables.CableMedium[] mediaA, CompiledNetwork.Op b, Cables.CableMedium[] mediaB)
    {
        if (a.Kind != b.Kind || !a.Value.Equals(b.Value) || !a.Value2.Equals(b.Value2) || a.Count != b.Count) return false;
        if (a.Medium < 0 || b.Medium < 0) return a.Medium == b.Medium;
        var ma = mediaA[a.Medium];
        var mb = mediaB[b.Medium];
        // The fields every per-bin quantity is computed from (as SweepCache keys them).
        return ma.ImpedanceOhms.Equals(mb.ImpedanceOhms) && ma.VelocityFactor.Equals(mb.VelocityFactor) && Equals(ma.Loss, mb.Loss);
    }

    /// <summary>Fills <paramref name="stackN"/> and <paramref name="stackD"/> with the stack as it stood before operation
    /// <paramref name="op"/> (> 0), renting an array per level, and returns the top level.</summary>
    internal int Restore(int op, Complex[][] stackN, Complex[][] stackD)
    {
        int top = TopAfter[op - 1];
        for (int level = 0; level <= top; level++)
        {
            int source = op - 1;
            while (TopAfter[source] != level) source--;
            stackN[level] = Copy(_n[source]!);
            stackD[level] = Copy(_d[source]!);
        }
        return top;
    }

    public void Dispose()
    {
        for (int i = 0; i < _n.Length; i++)
        {
            if (_n[i] is { } n) SweepBuffers<Complex>.Return(n);
            if (_d[i] is { } d) SweepBuffers<Complex>.Return(d);
            _n[i] = _d[i] = null;
        }
    }

    private static bool Equals(Cables.CableLossModel? a, Cables.CableLossModel? b) => a is null ? b is null : a.Equals(b);
}
