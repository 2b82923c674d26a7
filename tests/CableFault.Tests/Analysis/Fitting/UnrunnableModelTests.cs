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
    /// <summary>A 3 µs window of a 200 m run with a short, unsmoothed (as the refinement's full-resolution look takes
    /// it: the model's rise is then its own).</summary>
    private static readonly FitData Data = FitData.Prepare(Simulate(Run(Segment(200), RunEnd.Short), sampleCount: 24_000),
        -5e-9, 2_900e-9, RiseSeconds, QuietNoiseVolts, double.PositiveInfinity);

    /// <summary>The run's model with its edge at <paramref name="timeOffsetSeconds"/> and of rise <paramref name="riseSeconds"/>.</summary>
    private static RunModel At(double timeOffsetSeconds, double riseSeconds) =>
        new(new RunModelContext(VelocityFactor, ImpedanceOhms, 50, null, RiseSeconds, 0.5), 0.5, timeOffsetSeconds, riseSeconds,
            [new RunModelEvent(RunModelElement.Short, 2_000e-9, double.NaN)]);

    [Fact]
    public void AModelBeyondTheSimulatorsLimitGivesSamplesFarFromAnyTrace()
    {
        var farOff = At(-5e-3, 7e-12).Simulate(Data);
        Assert.All(farOff, v => Assert.True(Math.Abs(v) >= 1e5, $"{v} V"));
        // The same model where the edge is stays within the step's range (it is the run, less its echoes' details).
        var near = At(0, RiseSeconds).Simulate(Data);
        Assert.All(near, v => Assert.InRange(v, -2, 2));
    }

    /// <summary>
    /// Below the simulator's limit a far step still costs what its transform costs: an edge 30 µs before a 3 µs window
    /// needs about ten times the window's transform, and a tenth of the rise a further ten (measured: a thin lossy run
    /// whose loss was being estimated once took two minutes and 24 GB in such steps). A model whose transform is more
    /// than <see cref="RunModel.MaximumTransformGrowth"/> times the window's at the measured rise is not run; a step of a
    /// few rise times, or a rise a third smaller, still is.
    /// </summary>
    [Fact]
    public void AModelFarOutsideItsWindowIsNotRun()
    {
        var far = At(-30e-6, RiseSeconds / 10).Simulate(Data);
        Assert.All(far, v => Assert.True(Math.Abs(v) >= 1e5, $"{v} V"));

        foreach (var (offset, rise) in new[] { (3 * RiseSeconds, RiseSeconds), (0.0, 0.67 * RiseSeconds), (-2 * RiseSeconds, 1.5 * RiseSeconds) })
            Assert.All(At(offset, rise).Simulate(Data), v => Assert.InRange(v, -2, 2));
    }
}
