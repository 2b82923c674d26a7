namespace CableFault.Simulation;

/// <summary>
/// Whether one forward run may spread its frequency bins over the cores, and the split itself. Every bin of a sweep is
/// computed on its own (the operations run outer, the bins inner), so two halves of the bins can run side by side and
/// give the bits of one pass. That pays only where nothing else is running: a fit's serial Levenberg–Marquardt steps
/// leave the second core idle, while its Jacobian's columns, trial fits side by side and a batch's traces already keep
/// it busy. Work that runs beside other work says so with <see cref="SideBySide"/>, on the thread that does it.
/// </summary>
internal static class BinSplitting
{
    /// <summary>Fewest bins a run splits: below this the hand-over to the second core costs more than half the work.</summary>
    internal const int MinimumBins = 1024;

    /// <summary>Split points are multiples of this: the sweep's phasor recurrences restart exactly every 256 bins
    /// (see NetworkEvaluator.ApplyLosslessSegment), so a half that starts there computes what one pass computes.</summary>
    internal const int Alignment = 256;

    private static readonly bool HasSeveralCores = Environment.ProcessorCount > 1;

    [ThreadStatic] private static int sideBySideDepth;

    /// <summary>True when runs on this thread may take the other cores: the thread is not inside work that already runs
    /// beside other work.</summary>
    internal static bool IsAllowed => HasSeveralCores && sideBySideDepth == 0;

    /// <summary>Marks this thread's work until disposal as running beside other work: its runs keep to this thread.</summary>
    internal static Scope SideBySide()
    {
        sideBySideDepth++;
        return new Scope(true);
    }

    /// <summary>Ends a <see cref="SideBySide"/> mark on the thread that made it.</summary>
    internal readonly struct Scope(bool active) : IDisposable
    {
        public void Dispose()
        {
            if (active) sideBySideDepth--;
        }
    }

    /// <summary>Runs <paramref name="work"/> on bins [0, <paramref name="bins"/>): as two halves side by side when
    /// allowed and worth it, else in one pass. <paramref name="work"/> must touch only its own range of any array.</summary>
    internal static void ForHalves(int bins, Action<int, int> work)
    {
        int split = bins / 2 / Alignment * Alignment;
        if (!IsAllowed || bins < MinimumBins || split == 0)
        {
            work(0, bins);
            return;
        }
        Parallel.Invoke(() => work(0, split), () => work(split, bins));
    }
}
