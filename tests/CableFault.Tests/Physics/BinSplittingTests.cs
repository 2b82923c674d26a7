using System.Numerics;
using CableFault.Simulation;

namespace CableFault.Tests.Physics;

/// <summary>
/// A fit's serial run spreads its bins over the cores (BinSplitting): each range of bins must get exactly the
/// operations one pass gives it, so the halves, run in either order, must give one pass's pairs and samples bit for bit.
/// </summary>
public class BinSplittingTests
{
    /// <summary>1 900 bins on an 800 ns period: more than a split needs, and a count no alignment divides.</summary>
    private static readonly SweepCache.Grid Grid = new(4096, 2e6, 2 * Math.PI / 800e-9, 1900);

    /// <summary>Random networks (branches, lossy and lossless media, every lumped part and end) swept in one pass and
    /// as two ranges split where BinSplitting splits, the upper one first. A range that started off the 256-bin rhythm
    /// of the lossless phasor recurrence, or an operation that read outside its range, would change bits.</summary>
    [Theory]
    [InlineData(61, true)]
    [InlineData(62, false)]
    [InlineData(63, false)]
    public void RangesGiveTheBitsOfOnePass(int seed, bool lossless)
    {
        var networks = new RandomNetworks(seed, lossless);
        var cache = new SweepCache();
        int split = Grid.BinCount / 2 / BinSplitting.Alignment * BinSplitting.Alignment;
        Assert.InRange(split, 1, Grid.BinCount - 1);
        for (int n = 0; n < 6; n++)
        {
            var compiled = new CompiledNetwork(networks.Network());
            using var whole = new BinSweep(compiled, cache, Grid, null);
            whole.Run(0, Grid.BinCount);
            using var halves = new BinSweep(compiled, cache, Grid, null);
            halves.Run(split, Grid.BinCount);
            halves.Run(0, split);
            Assert.True(whole.N.AsSpan(0, Grid.BinCount).SequenceEqual(halves.N.AsSpan(0, Grid.BinCount)), $"N of network {n}");
            Assert.True(whole.D.AsSpan(0, Grid.BinCount).SequenceEqual(halves.D.AsSpan(0, Grid.BinCount)), $"D of network {n}");
            foreach (var array in new[] { whole.N, whole.D, halves.N, halves.D }) SweepBuffers<Complex>.Return(array);
        }
    }

    /// <summary>The split visits every bin exactly once, at an aligned split point, and small sweeps stay whole.</summary>
    [Theory]
    [InlineData(1900)]
    [InlineData(1024)]
    [InlineData(100_001)]
    [InlineData(300)]
    public void HalvesCoverEveryBinOnce(int bins)
    {
        var visits = new int[bins];
        var starts = new System.Collections.Concurrent.ConcurrentBag<int>();
        BinSplitting.ForHalves(bins, (from, to) =>
        {
            starts.Add(from);
            for (int k = from; k < to; k++) Interlocked.Increment(ref visits[k]);
        });
        Assert.All(visits, v => Assert.Equal(1, v));
        Assert.All(starts, s => Assert.Equal(0, s % BinSplitting.Alignment));
        if (bins < BinSplitting.MinimumBins) Assert.Single(starts);
    }

    /// <summary>A whole simulation on the fit's cached path, its run and its edge spectrum split over the cores, against
    /// the same run kept to one thread (as work beside other work keeps it), each with a fresh cache. (Last-bit changes in
    /// the top bins, where the edge's spectrum is e^−30 and less, do not reach the samples: the alignment is checked on
    /// the pairs above.)</summary>
    [Theory]
    [InlineData(71, true)]
    [InlineData(72, false)]
    public void SplitSimulationGivesTheSamplesOfOneThread(int seed, bool lossless)
    {
        var network = new RandomNetworks(seed, lossless).Network();
        var compiled = new CompiledNetwork(network);
        var settings = new InstrumentSettings
        {
            SourceImpedanceOhms = 50, IncidentAmplitudeVolts = 1, RiseTimeSeconds = 0.3e-9, EdgeShape = EdgeShape.Gaussian,
            SampleIntervalSeconds = 0.1e-9, SampleCount = 6000, PreTriggerSeconds = 2e-9,
        };
        var split = ForwardModel.SimulateSamples(compiled, settings, new SweepCache(), ForwardModel.FitMaximumUndamping);
        double[] single;
        using (BinSplitting.SideBySide())
        {
            Assert.False(BinSplitting.IsAllowed);
            single = ForwardModel.SimulateSamples(compiled, settings, new SweepCache(), ForwardModel.FitMaximumUndamping);
        }
        Assert.True(split.AsSpan().SequenceEqual(single), "the split run's samples differ from the single thread's");
    }

    /// <summary>A group member's mark keeps the runs to this thread while another member is unfinished and lets them
    /// split once the others have left (on a machine with more than one core); a mark nested inside it, or one made inside
    /// an ordinary mark, is never lifted, because other work still runs beside it.</summary>
    [Fact]
    public void AGroupMembersMarkIsLiftedOnlyWhenTheOthersHaveLeftAndOnlyWhenOutermost()
    {
        bool severalCores = Environment.ProcessorCount > 1;
        var group = new BinSplitting.Group(3);
        using (BinSplitting.SideBySideIn(group))
        {
            Assert.False(BinSplitting.IsAllowed);
            group.Leave();
            Assert.False(BinSplitting.IsAllowed);
            group.Leave();
            Assert.Equal(severalCores, BinSplitting.IsAllowed);
            using (BinSplitting.SideBySide()) Assert.False(BinSplitting.IsAllowed);
            Assert.Equal(severalCores, BinSplitting.IsAllowed);
        }
        Assert.Equal(severalCores, BinSplitting.IsAllowed);

        var alone = new BinSplitting.Group(1);
        using (BinSplitting.SideBySide())
        {
            using (BinSplitting.SideBySideIn(alone)) Assert.False(BinSplitting.IsAllowed);
            // Work started inside a mark gets no group: its items would not know of the work beside it.
            Assert.Null(BinSplitting.GroupFor(2));
        }
        using (BinSplitting.SideBySideIn(alone)) Assert.Equal(severalCores, BinSplitting.IsAllowed);
        // The lifted mark is gone with its scope: a plain mark made next is not lifted by the old group.
        using (BinSplitting.SideBySide()) Assert.False(BinSplitting.IsAllowed);
    }
}
