using CableFault.Analysis;
using CableFault.Networks;
using CableFault.Traces;
using static CableFault.Tests.Analysis.Locate.LocateFixtures;

namespace CableFault.Tests.Analysis.Locate;

/// <summary>
/// A real step generator does not settle at once: after the fast edge its level creeps on by a per cent or so over some
/// tens of nanoseconds (common practice; the sizes and times here are from memory), and every echo carries the same
/// creep. The traces here get it independently of the model's settling factor: a clean simulation passed through a
/// first-order low-pass in the time domain, y = (1 − a)·x + a·(x filtered with time constant τ), which is what a step
/// whose part a arrives with time constant τ does to every arrival.
/// </summary>
public class SettlingStepTests
{
    /// <summary>Time constant of the creep, s.</summary>
    private const double SettlingSeconds = 20e-9;

    /// <summary>A 1 % creep on a plain 120 m open: a fit whose edge settles at once reads it as a row of tiny impedance
    /// rises near the connector, which must not be listed (a technician is not to be sent to them).</summary>
    [Theory]
    [InlineData(1)]
    [InlineData(2)]
    public void SlowlySettlingStepAddsNoEvents(int seed)
    {
        const double openMeters = 120;
        var trace = WithCreep(Simulate(Run(Segment(openMeters), RunEnd.Open), seed: seed), 0.01);

        var result = Locator.Locate(trace, Options());

        Assert.True(result.Events.Count == 1, $"expected the open alone; found: {Describe(result)}");
        Assert.Equal(EventKind.Open, result.Events[0].Kind);
        Assert.InRange(result.Events[0].DistanceMeters, openMeters - DistanceTolerance(openMeters), openMeters + DistanceTolerance(openMeters));
    }

    /// <summary>A 3 % creep on a run with a connector, a wet stretch and an open end (invented): asked to fit the settling,
    /// locate reads the run's own events and no others (without it: a rise near the connector and an unknown event,
    /// and the 4 nH spot is lost).</summary>
    [Fact]
    public void FittedSettlingReadsOnlyTheRunsEvents()
    {
        var network = Run(Segment(12), new SeriesInductor(4e-9), Segment(15.3), Segment(0.6, 36), Segment(14.6), RunEnd.Open);
        var trace = WithCreep(Simulate(network, seed: 3), 0.03);

        var result = Locator.Locate(trace, Options() with { EstimateSettling = true });

        Assert.True(result.Events.Count == 4, $"expected the four events of the run; found: {Describe(result)}");
        Assert.Equal(EventKind.Inductive, Near(result, 12).Kind);
        Assert.Equal(EventKind.ImpedanceDrop, Near(result, 27.3).Kind);
        Assert.Equal(EventKind.ImpedanceRise, Near(result, 27.9).Kind);
        var open = Near(result, 42.5);
        Assert.Equal(EventKind.Open, open.Kind);
        Assert.InRange(open.DistanceMeters, 42.5 - DistanceTolerance(42.5), 42.5 + DistanceTolerance(42.5));
        Assert.Contains(result.Warnings, w => w.Contains("settles slowly"));
    }

    /// <summary>The trace with part <paramref name="fraction"/> of every arrival delayed by a first-order lag.</summary>
    private static Trace WithCreep(Trace clean, double fraction)
    {
        double alpha = Math.Exp(-clean.SampleIntervalSeconds / SettlingSeconds), slow = clean.SamplesVolts[0];
        var samples = new double[clean.Length];
        for (int i = 0; i < samples.Length; i++)
        {
            double x = clean.SamplesVolts[i];
            slow = alpha * slow + (1 - alpha) * x;
            samples[i] = (1 - fraction) * x + fraction * slow;
        }
        return new Trace(clean.StartTimeSeconds, clean.SampleIntervalSeconds, samples);
    }
}
