using System.Buffers;

namespace CableFault.Simulation;

/// <summary>
/// Work arrays of the forward model's fast path, reused through <see cref="ArrayPool{T}.Shared"/> up to
/// <see cref="MaximumPooledLength"/> elements and allocated afresh beyond. A fit runs thousands of sweeps whose arrays
/// are too large for the young generation, and fresh ones made the garbage collector a large share of the cost; but the
/// shared pool keeps what it is given for the life of the process, and the very long transforms of a one-off simulation
/// would then stay in memory for good.
/// </summary>
internal static class SweepBuffers<T>
{
    /// <summary>Longest array kept for reuse: 2¹⁶ elements (1 MB of complex numbers), more than a fit's sweeps need.</summary>
    internal const int MaximumPooledLength = 1 << 16;

    /// <summary>An array of at least <paramref name="length"/> elements, of undefined content.</summary>
    internal static T[] Rent(int length) => length <= MaximumPooledLength ? ArrayPool<T>.Shared.Rent(length) : new T[length];

    /// <summary>Gives back an array from <see cref="Rent"/>.</summary>
    internal static void Return(T[] array)
    {
        if (array.Length <= MaximumPooledLength) ArrayPool<T>.Shared.Return(array);
    }
}
