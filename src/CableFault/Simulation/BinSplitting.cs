namespace CableFault.Simulation;

/// <summary>
/// Whether one forward run may spread its frequency bins over the cores, and the split itself. Every bin of a sweep is
/// computed on its own (the operations run outer, the bins inner), so two halves of the bins can run side by side and
/// give the bits of one pass. That pays only where nothing else is running: a fit's serial Levenberg–Marquardt steps
/// leave the second core idle, while its Jacobian's columns, trial fits side by side and a batch's traces already keep
/// it busy. Work that runs beside other work says so with <see cref="SideBySide"/>, on the thread that does it. Other
/// serial work made of independent items follows the same rule (<see cref="ForRanges"/>).
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

    /// <summary>The group whose member this thread's outermost mark is (<see cref="SideBySideIn"/>), or null.</summary>
    [ThreadStatic] private static Group? outermostGroup;

    /// <summary>True when runs on this thread may take the other cores: the thread is not inside work that already runs
    /// beside other work, or only inside a group's mark whose other members have all finished.</summary>
    internal static bool IsAllowed => HasSeveralCores
        && (sideBySideDepth == 0 || sideBySideDepth == 1 && outermostGroup is { IsLastRunning: true });

    /// <summary>Marks this thread's work until disposal as running beside other work: its runs keep to this thread.</summary>
    internal static Scope SideBySide()
    {
        sideBySideDepth++;
        return new Scope(true, false);
    }

    /// <summary>As <see cref="SideBySide"/> for one member of <paramref name="group"/>, but only while another member is
    /// unfinished: the member that outlives the rest then has the cores to itself, and its serial runs split their bins
    /// again (the bits do not change). Without a group (see <see cref="GroupFor"/>), or inside another mark, this is a plain
    /// <see cref="SideBySide"/>: that mark's other work still runs.</summary>
    internal static Scope SideBySideIn(Group? group)
    {
        if (group is null || sideBySideDepth > 0) return SideBySide();
        sideBySideDepth++;
        outermostGroup = group;
        return new Scope(true, true);
    }

    /// <summary>Ends a <see cref="SideBySide"/> mark on the thread that made it.</summary>
    internal readonly struct Scope(bool active, bool outermost) : IDisposable
    {
        public void Dispose()
        {
            if (!active) return;
            sideBySideDepth--;
            if (outermost) outermostGroup = null;
        }
    }

    /// <summary>Work items started side by side (see <see cref="SideBySideIn"/>); each calls <see cref="Leave"/> when it
    /// ends, fails or is abandoned, after its mark's scope has closed.</summary>
    /// <param name="members">How many items the group has, started or not.</param>
    internal sealed class Group(int members)
    {
        private int unfinished = members;

        /// <summary>True when at most one member has not finished: the one asking is the last.</summary>
        internal bool IsLastRunning => Volatile.Read(ref unfinished) <= 1;

        /// <summary>A member has ended: the cores it used are free.</summary>
        internal void Leave() => Interlocked.Decrement(ref unfinished);
    }

    /// <summary>A group for work started on this thread: null when this thread's runs may not take the other cores
    /// themselves (its work already runs beside other work, which its items would then not know of), so that the items
    /// keep plain marks.</summary>
    internal static Group? GroupFor(int members) => IsAllowed ? new Group(members) : null;

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

    /// <summary>Runs <paramref name="work"/> on items [0, <paramref name="count"/>) as <paramref name="ranges"/> ranges
    /// side by side when allowed (other serial work whose items are each computed on their own: a record's smoothing, a
    /// batch of CSV rows), else in one pass. <paramref name="work"/> must touch only its own range of any array.</summary>
    internal static void ForRanges(int count, int ranges, Action<int, int> work)
    {
        ranges = Math.Min(ranges, count);
        if (!IsAllowed || ranges <= 1)
        {
            work(0, count);
            return;
        }
        Parallel.For(0, ranges, r => work((int)((long)count * r / ranges), (int)((long)count * (r + 1) / ranges)));
    }
}
