using CableFault.Traces;

namespace CableFault.Reporting.Plots;

/// <summary>Ready-made figures for traces.</summary>
public static class TraceFigures
{
    /// <summary>
    /// A trace against distance d = v·t/2 (t = 0 at the reference plane), with round-trip time on the top axis.
    /// </summary>
    public static Figure Simulated(Trace trace, double velocityFactor, DistanceUnit unit, string runName)
    {
        double v = velocityFactor * PhysicalConstants.SpeedOfLightMetersPerSecond;
        var distances = trace.TimesSeconds().Select(t => v * t / 2).ToArray();
        var panel = new FigurePanel
        {
            Title = "Simulated step response",
            YLabel = "Port voltage (V)",
            Series = [new FigureSeries(distances, trace.SamplesVolts.ToArray(), "trace")],
        };
        return new Figure
        {
            Title = string.IsNullOrWhiteSpace(runName) ? "CableFault" : runName,
            Panels = [panel],
            Unit = unit,
            VelocityFactor = velocityFactor,
        };
    }
}
