using CableFault.Analysis;
using CableFault.Reporting.Plots;

namespace CableFault.Reporting.Locate;

/// <summary>The trace and the impedance profile against distance, events marked and labelled.</summary>
public static class LocateFigures
{
    /// <summary>Two panels: port voltage (with the fitted model, dashed) and layer-peeled impedance.</summary>
    public static Figure Build(LocateResult result, string title, DistanceUnit unit)
    {
        double v = result.Options.VelocityFactor * PhysicalConstants.SpeedOfLightMetersPerSecond;
        var trace = result.AlignedTrace;
        var traceDistances = trace.TimesSeconds().Select(t => v * t / 2).ToArray();
        var markers = result.Events
            .Select(e => new FigureMarker(e.DistanceMeters, $"{EventWording.KindWords(e.Kind)} {unit.Format(e.DistanceMeters)}",
                e.Kind is not (EventKind.Termination)))
            .ToList();
        double lastEvent = result.Events.Count > 0 ? result.Events.Max(e => e.DistanceMeters) : 0;
        double end = Math.Min(traceDistances[^1], Math.Max(lastEvent * 1.25 + 2, result.Profile.Length > 0 ? result.Profile.DistancesMeters[^1] : 0));
        double start = Math.Max(traceDistances[0], -0.05 * end);

        var voltage = new List<FigureSeries> { new(traceDistances, trace.SamplesVolts.ToArray(), "measured trace") };
        if (result.ModelTrace is { } model)
            voltage.Add(new FigureSeries(model.TimesSeconds().Select(t => v * t / 2).ToArray(), model.SamplesVolts.ToArray(), "fitted model", SeriesStyle.Secondary));

        var panels = new List<FigurePanel>
        {
            new()
            {
                Title = "Step response",
                YLabel = "Port voltage (V)",
                Series = voltage,
                Markers = markers,
                ShadedRegion = (0, result.BlindZoneMeters),
                ShadedRegionLabel = "blind zone",
            },
        };
        if (result.Profile.Length > 1)
        {
            var ohms = result.Profile.ImpedanceOhms;
            double z0 = result.Options.ImpedanceOhms;
            double low = Math.Max(0, Math.Min(ohms.Min(), z0 * 0.5)), high = Math.Min(Math.Max(ohms.Max(), z0 * 1.5), z0 * 6);
            panels.Add(new FigurePanel
            {
                Title = "Impedance profile (layer peeled, loss corrected)",
                YLabel = "Impedance (Ω)",
                Series = [new FigureSeries(result.Profile.DistancesMeters, ohms, "impedance", SeriesStyle.Profile)],
                Markers = markers,
                YRange = (low - 0.05 * (high - low), high + 0.05 * (high - low)),
            });
        }
        return new Figure
        {
            Title = title,
            Panels = panels,
            Unit = unit,
            VelocityFactor = result.Options.VelocityFactor,
            DistanceRangeMeters = (start, end),
        };
    }
}
