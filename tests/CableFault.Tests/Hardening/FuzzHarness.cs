using Xunit.Sdk;

namespace CableFault.Tests.Hardening;

/// <summary>
/// Runs a fixed number of fuzz cases on a worker thread and watches it. The work is bounded by the case count, not by
/// the clock; the clock only serves as a liveness guard: if no case completes for <see cref="HangGuardSeconds"/>, the
/// test fails naming the seed of the case that is stuck. Memory is checked every <see cref="MemoryCheckInterval"/>
/// cases after a full collection.
/// </summary>
internal static class FuzzHarness
{
    /// <summary>
    /// Seconds without a completed case before the case is declared hung: 60. A case reads a file of a few kilobytes
    /// (milliseconds); even on a loaded two-core machine a case that takes a minute is stuck in a loop, not slow.
    /// </summary>
    internal const int HangGuardSeconds = 60;

    /// <summary>
    /// Most managed memory allowed after a full collection, bytes: 1 GiB. The inputs are kilobytes; a reader that
    /// pre-allocates from a corrupted count or leaks across cases shows as hundreds of MB. The limit leaves room for
    /// the other test classes running in the same process.
    /// </summary>
    internal const long MemoryLimitBytes = 1L << 30;

    /// <summary>Cases between memory checks (a full collection costs a few ms).</summary>
    internal const int MemoryCheckInterval = 2000;

    /// <summary>Runs <paramref name="cases"/> cases with seeds from <paramref name="firstSeed"/>; <paramref name="oneCase"/>
    /// returns normally or throws <see cref="InputException"/>; anything else fails the test with the seed.</summary>
    internal static void Run(string name, int firstSeed, int cases, Action<int> oneCase)
    {
        int current = firstSeed;
        int completed = 0;
        Exception? failure = null;
        var worker = new Thread(() =>
        {
            try
            {
                for (int i = 0; i < cases; i++)
                {
                    int seed = firstSeed + i;
                    Volatile.Write(ref current, seed);
                    try
                    {
                        oneCase(seed);
                    }
                    catch (InputException)
                    {
                        // The one allowed failure: bad input reported as such.
                    }
                    catch (Exception e)
                    {
                        throw new XunitException($"{name}: seed {seed} threw {e.GetType().Name} instead of InputException: {e}");
                    }
                    Interlocked.Increment(ref completed);
                    if ((i + 1) % MemoryCheckInterval == 0)
                    {
                        long bytes = GC.GetTotalMemory(forceFullCollection: true);
                        if (bytes > MemoryLimitBytes)
                            throw new XunitException($"{name}: {bytes / 1e6:F0} MB in use after seed {seed}, over the {MemoryLimitBytes / 1e6:F0} MB limit");
                    }
                }
            }
            catch (Exception e)
            {
                failure = e;
            }
        })
        { IsBackground = true, Name = $"fuzz {name}" };
        worker.Start();

        int lastCompleted = -1;
        int quietSeconds = 0;
        while (!worker.Join(TimeSpan.FromSeconds(1)))
        {
            int now = Volatile.Read(ref completed);
            quietSeconds = now == lastCompleted ? quietSeconds + 1 : 0;
            lastCompleted = now;
            if (quietSeconds >= HangGuardSeconds)
                throw new XunitException($"{name}: seed {Volatile.Read(ref current)} has not finished after {HangGuardSeconds} s (hang?)");
        }
        if (failure is not null) throw failure;
        Assert.Equal(cases, completed);
    }
}
