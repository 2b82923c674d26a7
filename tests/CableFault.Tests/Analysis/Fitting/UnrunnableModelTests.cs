using CableFault.Analysis;
using CableFault.Networks;
using static CableFault.Tests.Analysis.Locate.LocateFixtures;

namespace CableFault.Tests.Analysis.Fitting;

/// <summary>
/// A fit's trial step can go far off: the edge moved milliseconds before the window with a rise near its lower bound
/// asks the simulator for an internal transform beyond its limit. That step must come back as a model far from any trace
/// (which the fit rejects like any worse step), not as an error that ends the locate with a message about simulate's
/// settings.
/// </summary>
public class UnrunnableModelTests
{
    [Fact]
    public void AModelBeyondTheSimulatorsLimitGivesSamplesFarFromAnyTrace()
    {
        var trace = Simulate(Run(Segment(200), RunEnd.Short), sampleCount: 24_000);
        // Unsmoothed (as the refinement's full-resolution look takes it): the model's rise is then its own.
        var data = FitData.Prepare(trace, -5e-9, 2_900e-9, RiseSeconds, QuietNoiseVolts, double.PositiveInfinity);
        var context = new RunModelContext(VelocityFactor, ImpedanceOhms, 50, null, RiseSeconds, 0.5);
        RunModel At(double timeOffsetSeconds, double riseSeconds) => new(context, 0.5, timeOffsetSeconds, riseSeconds,
            [new RunModelEvent(RunModelElement.Short, 2_000e-9, double.NaN)]);

        var farOff = At(-5e-3, 7e-12).Simulate(data);
        Assert.All(farOff, v => Assert.True(Math.Abs(v) >= 1e5, $"{v} V"));
        // The same model where the edge is stays within the step's range (it is the run, less its echoes' details).
        var near = At(0, RiseSeconds).Simulate(data);
        Assert.All(near, v => Assert.InRange(v, -2, 2));
    }
}
