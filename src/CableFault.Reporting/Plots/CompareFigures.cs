using System.Globalization;
using CableFault.Analysis;
using CableFault.Comparison;

namespace CableFault.Reporting.Plots;

/// <summary>The repair-check figure: both traces overlaid, and their difference below with the noise band, against
/// distance, with the changes marked.</summary>
public static class CompareFigures
{
    /// <summary>Builds the figure from a comparison.</summary>
    public static Figure Build(CompareResult result, DistanceUnit unit, string title)
    {
        ArgumentNullException.ThrowIfNull(result);
        var d = result.DistancesMeters;
        var markers = result.Events.Where(e => e.Kind != EventChangeKind.Unchanged)
            .Select(e => new FigureMarker(e.DistanceMeters, Label(e, unit), e.ExceedsTolerance)).ToList();
        var traces = new FigurePanel
        {
            Title = "Baseline and current",
            YLabel = "Port level (× incident step)",
            Series =
            [
                new FigureSeries(d, result.Baseline.SamplesVolts.ToArray(), "baseline", SeriesStyle.Secondary),
                new FigureSeries(d, result.Current.SamplesVolts.ToArray(), "current", SeriesStyle.Primary),
            ],
            Markers = markers,
            ShadedRegion = (0, result.BlindZoneMeters),
            ShadedRegionLabel = "blind zone",
        };
        var difference = new FigurePanel
        {
            Title = string.Create(CultureInfo.InvariantCulture,
                $"Difference (current − baseline); noise band ±{result.NoiseBand:0.0000}; verdict: {(result.Pass ? "pass" : "fail")}"),
            YLabel = "Difference (× incident step)",
            Series = [new FigureSeries(d, result.Difference, "difference", SeriesStyle.Difference)],
            Markers = markers,
            Band = (-result.NoiseBand, result.NoiseBand),
        };
        return new Figure
        {
            Title = string.IsNullOrWhiteSpace(title) ? "Repair check" : title,
            Panels = [traces, difference],
            Unit = unit,
            VelocityFactor = result.Settings.VelocityFactor,
            DistanceRangeMeters = (Math.Min(0, d[0]), d[^1]),
        };
    }

    private static string Label(EventChange change, DistanceUnit unit)
    {
        var e = (change.Current ?? change.Baseline)!;
        string kind = EventKindNames.ToJsonName(e.Kind).Replace('_', ' ');
        string where = unit.Format(change.DistanceMeters, 1);
        return change.Kind switch
        {
            EventChangeKind.Moved => string.Create(CultureInfo.InvariantCulture, $"{kind} moved {unit.FromMeters(change.ShiftMeters!.Value):+0.00;-0.00} {unit.Symbol}"),
            _ => $"{EventChangeKindNames.ToJsonName(change.Kind)} {kind} {where}",
        };
    }
}
