using CableFault.Analysis;
using CableFault.Networks;
using CableFault.Simulation;

namespace CableFault.Tests.Analysis.Fitting;

/// <summary>
/// A resistor right before an end is one resistive end: a series R into a short and a shunt R before an open both put R
/// from the line to ground (elementary circuit theory), so the selection's pair is reported as the termination it is.
/// The check is that the replacement's trace, simulated by the forward model, is the pair's.
/// </summary>
public class TerminationPairTests
{
    private const double RiseSeconds = 1e-9, RoundTripSeconds = 200e-9;

    private static readonly RunModelContext Context = new(0.66, 50, 50, null, RiseSeconds, 0.5);

    [Theory]
    [InlineData(true, 11.6)]
    [InlineData(false, 240)]
    public void ResistorIntoAnEndBecomesTheTerminationWithTheSameTrace(bool seriesIntoShort, double ohms)
    {
        var (resistor, end) = seriesIntoShort
            ? (RunModelElement.SeriesResistor, RunModelElement.Short)
            : (RunModelElement.ShuntResistor, RunModelElement.Open);
        var pair = new RunModel(Context, 0.5, 0, RiseSeconds,
        [
            new RunModelEvent(RunModelElement.Boundary, 80e-9, 75),
            new RunModelEvent(resistor, RoundTripSeconds, ohms),
            new RunModelEvent(end, RoundTripSeconds + 1e-12, double.NaN),
        ]);

        var termination = CoincidentEvents.AsTermination(pair, RiseSeconds);

        Assert.NotNull(termination);
        var last = termination!.Events[^1];
        Assert.Equal(RunModelElement.Boundary, last.Element);
        Assert.Equal(ohms, last.Value);
        Assert.Equal(2, termination.Events.Count);
        double[] a = Trace(pair), b = Trace(termination);
        // 1 ps of zero-length line between the pair's elements is all that differs: far below 1 mV on a 1 V step.
        for (int i = 0; i < a.Length; i++) Assert.True(Math.Abs(a[i] - b[i]) < 1e-3, $"sample {i}: {a[i]} against {b[i]}");
    }

    [Fact]
    public void ResistorAwayFromTheEndStays()
    {
        var apart = new RunModel(Context, 0.5, 0, RiseSeconds,
        [
            new RunModelEvent(RunModelElement.SeriesResistor, RoundTripSeconds - 2 * RiseSeconds, 10),
            new RunModelEvent(RunModelElement.Short, RoundTripSeconds, double.NaN),
        ]);
        Assert.Null(CoincidentEvents.AsTermination(apart, RiseSeconds));
    }

    private static double[] Trace(RunModel model)
    {
        var settings = new InstrumentSettings
        {
            RiseTimeSeconds = RiseSeconds, SampleIntervalSeconds = RiseSeconds / 8, SampleCount = 4096, PreTriggerSeconds = 5e-9,
        };
        return ForwardModel.Simulate(model.ToNetwork(), settings).SamplesVolts.ToArray();
    }
}
