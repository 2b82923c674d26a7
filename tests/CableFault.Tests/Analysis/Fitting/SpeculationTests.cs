using CableFault.Analysis;
using CableFault.Simulation;

namespace CableFault.Tests.Analysis.Fitting;

/// <summary>
/// The loss probe runs with the selection started ahead of its outcome (Speculation): the ahead step's result must be
/// taken only when the first step's outcome keeps it, a discarded ahead step must have stopped before the call returns
/// (no work of an abandoned reading may outlive the locate), and failures must come out as they were thrown.
/// </summary>
public class SpeculationTests
{
    [Fact]
    public void TheAheadResultIsTakenWhenTheFirstStepKeepsIt()
    {
        var (first, ahead, kept) = Speculation.Run(() => 1, _ => "ahead", value => value == 1, CancellationToken.None);
        Assert.Equal(1, first);
        Assert.True(kept);
        Assert.Equal("ahead", ahead);
    }

    [Fact]
    public void ADiscardedAheadStepIsCancelledAndHasStoppedWhenTheCallReturns()
    {
        int stopped = 0;
        var (first, ahead, kept) = Speculation.Run(() => 2, token =>
        {
            try
            {
                // Runs until cancelled: only the discard can end it.
                while (true)
                {
                    token.ThrowIfCancellationRequested();
                    Thread.Sleep(1);
                }
            }
            finally
            {
                Thread.Sleep(50);
                Volatile.Write(ref stopped, 1);
            }
#pragma warning disable CS0162 // the loop ends only by the cancellation's exception
            return "never";
#pragma warning restore CS0162
        }, value => value == 1, CancellationToken.None);
        Assert.Equal(2, first);
        Assert.False(kept);
        Assert.Null(ahead);
        Assert.Equal(1, Volatile.Read(ref stopped));
    }

    [Fact]
    public void AFailureOfTheFirstStepIsRethrownAfterTheAheadStepStopped()
    {
        var ahead = new StopsWhenCancelled();
        var error = Assert.Throws<InvalidOperationException>(() => Speculation.Run<int, int>(() => throw new InvalidOperationException("probe"),
            ahead.Run, _ => true, CancellationToken.None));
        Assert.Equal("probe", error.Message);
        Assert.True(ahead.Stopped);
    }

    [Fact]
    public void AKeptAheadStepsFailureIsRethrownAsThrown()
    {
        var error = Assert.Throws<ArgumentException>(() =>
            Speculation.Run<int, int>(() => 1, _ => throw new ArgumentException("selection"), _ => true, CancellationToken.None));
        Assert.Equal("selection", error.Message);
    }

    [Fact]
    public void TheCallersCancellationReachesTheAheadStep()
    {
        using var caller = new CancellationTokenSource();
        Assert.Throws<OperationCanceledException>(() => Speculation.Run(() =>
        {
            caller.Cancel();
            return 1;
        }, token =>
        {
            // Bounded only so that an unlinked token fails the test (the step then returns normally) instead of hanging it.
            token.WaitHandle.WaitOne(TimeSpan.FromMinutes(1));
            token.ThrowIfCancellationRequested();
            return 0;
        }, _ => true, caller.Token));
    }

    [Fact]
    public void AFailingDecisionDiscardsTheAheadStepAndIsRethrown()
    {
        var ahead = new StopsWhenCancelled();
        Assert.Throws<FormatException>(() => Speculation.Run<int, int>(() => 1, ahead.Run, _ => throw new FormatException(), CancellationToken.None));
        Assert.True(ahead.Stopped);
    }

    /// <summary>Neither step splits its runs over the other's core while both run; the step that outlives the other then
    /// may (on a machine with more than one core): here the ahead step, once the first has returned, and the first step,
    /// once the ahead one has.</summary>
    [Fact]
    public void TheStepThatOutlivesTheOtherMaySplitItsRuns()
    {
        bool severalCores = Environment.ProcessorCount > 1;
        using var aheadLooked = new ManualResetEventSlim();
        bool aheadWhileBoth = true, aheadAlone = false;
        var (_, _, kept) = Speculation.Run(() =>
        {
            Assert.False(BinSplitting.IsAllowed);
            // Bounded waits: a step that never comes fails the test instead of hanging it.
            Assert.True(aheadLooked.Wait(TimeSpan.FromMinutes(1)));
            return 1;
        }, _ =>
        {
            aheadWhileBoth = BinSplitting.IsAllowed;
            aheadLooked.Set();
            // The first step is marked finished just after it returns: wait for that, then look again.
            aheadAlone = severalCores && SpinWait.SpinUntil(() => BinSplitting.IsAllowed, TimeSpan.FromMinutes(1));
            return 0;
        }, _ => true, CancellationToken.None);
        Assert.True(kept);
        Assert.False(aheadWhileBoth);
        Assert.Equal(severalCores, aheadAlone);

        bool firstAlone = false;
        using var aheadEnded = new ManualResetEventSlim();
        Speculation.Run(() =>
        {
            Assert.True(aheadEnded.Wait(TimeSpan.FromMinutes(1)));
            firstAlone = severalCores && SpinWait.SpinUntil(() => BinSplitting.IsAllowed, TimeSpan.FromMinutes(1));
            return 1;
        }, _ =>
        {
            aheadEnded.Set();
            return 0;
        }, _ => true, CancellationToken.None);
        Assert.Equal(severalCores, firstAlone);
    }

    /// <summary>Trial fits side by side (ModelSelection.ForEachInParallel): the item that outlives the others may split
    /// its runs (on a machine with more than one core); inside work that already runs beside other work, none may.</summary>
    [Fact]
    public void TheLastTrialRunningMaySplitItsRunsUnlessAllRunBesideOtherWork()
    {
        bool severalCores = Environment.ProcessorCount > 1;
        const int items = 3;
        int done = 0;
        bool lastAlone = false;
        ModelSelection.ForEachInParallel(items, _ =>
        {
            if (Interlocked.Increment(ref done) < items) return;
            // The others have returned; each leaves its group just after. Bounded: a mark never lifted fails, not hangs.
            lastAlone = severalCores && SpinWait.SpinUntil(() => BinSplitting.IsAllowed, TimeSpan.FromMinutes(1));
        }, CancellationToken.None);
        Assert.Equal(severalCores, lastAlone);

        int allowed = 0;
        done = 0;
        using (BinSplitting.SideBySide())
            ModelSelection.ForEachInParallel(items, _ =>
            {
                if (Interlocked.Increment(ref done) == items) Thread.Sleep(20);
                if (BinSplitting.IsAllowed) Interlocked.Increment(ref allowed);
            }, CancellationToken.None);
        Assert.Equal(0, allowed);
    }

    /// <summary>An ahead step that only a cancellation ends, and that marks itself stopped late (so that a discard that
    /// did not wait for it would return first).</summary>
    private sealed class StopsWhenCancelled
    {
        private int _stopped;

        internal bool Stopped => Volatile.Read(ref _stopped) == 1;

        internal int Run(CancellationToken token)
        {
            try
            {
                token.WaitHandle.WaitOne();
                token.ThrowIfCancellationRequested();
                return 0;
            }
            finally
            {
                Thread.Sleep(50);
                Volatile.Write(ref _stopped, 1);
            }
        }
    }
}
