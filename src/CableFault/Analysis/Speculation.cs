using CableFault.Simulation;
namespace CableFault.Analysis;

/// <summary>
/// A step run while the step that may follow it is started on the thread pool ahead of its outcome: when the outcome
/// leaves the later step's input as it was, the later step's result is taken as it stands; otherwise the later step is
/// cancelled, awaited and discarded.
/// </summary>
/// <remarks>
/// The cable-loss probe's two fits keep the two cores busy only part of the time (the lossless fit ends long before the
/// lossy one), and most runs are read as lossless, where the selection that follows starts from exactly the model it
/// would start from after the probe. Both steps are deterministic and share nothing but thread-safe caches whose hits give
/// the bits of a fresh evaluation, so the result is the one the steps give one after the other.
/// </remarks>
internal static class Speculation
{
    /// <summary>Runs <paramref name="first"/> on this thread with <paramref name="ahead"/> on the pool; returns the
    /// first's result, and the ahead step's result when <paramref name="keepsAhead"/> says the first's result leaves its
    /// input unchanged (else default and false). A failure of the first step, or of a kept ahead step, is rethrown as
    /// thrown; an ahead step that is discarded is cancelled and awaited, and its outcome ignored.</summary>
    internal static (TFirst First, TAhead? Ahead, bool Kept) Run<TFirst, TAhead>(Func<TFirst> first,
        Func<CancellationToken, TAhead> ahead, Func<TFirst, bool> keepsAhead, CancellationToken cancellation)
    {
        using var aheadCancellation = CancellationTokenSource.CreateLinkedTokenSource(cancellation);
        // While both steps run, neither spreads its runs over the other's core; the one that outlives the other then
        // has both (BinSplitting.SideBySideIn).
        var steps = BinSplitting.GroupFor(2);
        var aheadTask = Task.Run(() =>
        {
            try
            {
                using var sideBySide = BinSplitting.SideBySideIn(steps);
                return ahead(aheadCancellation.Token);
            }
            finally
            {
                steps?.Leave();
            }
        }, CancellationToken.None);
        TFirst result;
        bool keep;
        try
        {
            try
            {
                using (BinSplitting.SideBySideIn(steps)) result = first();
            }
            finally
            {
                steps?.Leave();
            }
            keep = keepsAhead(result);
        }
        catch
        {
            Discard(aheadTask, aheadCancellation);
            throw;
        }
        if (!keep)
        {
            Discard(aheadTask, aheadCancellation);
            return (result, default, false);
        }
        // A failure of the kept step is its own (a cancellation stays an OperationCanceledException).
        return (result, aheadTask.GetAwaiter().GetResult(), true);
    }

    /// <summary>Cancels the ahead step and waits for it, so that no work of it outlives the call.</summary>
    private static void Discard(Task task, CancellationTokenSource cancellation)
    {
        cancellation.Cancel();
        try
        {
            task.Wait();
        }
        catch (AggregateException)
        {
            // Cancelled, or failed on an input that is no longer the one to read: either way not a result.
        }
    }
}
