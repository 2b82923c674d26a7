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
        bool pair = result.ReferenceKind == ReferenceKind.Pair;
        var (traces, difference) = Panels(result, markers, pair ? "Reference pair and suspect pair" : "Baseline and current", "Port level (× incident step)",
            pair
                ? string.Create(CultureInfo.InvariantCulture,
                    $"Difference (suspect − reference pair{(result.Spread?.LengthFitted == true ? ", length-aligned" : "")}); band ±{result.NoiseBand:0.0000}; verdict: {(result.Pass ? "pass" : "fail")}")
                : string.Create(CultureInfo.InvariantCulture,
                    $"Difference (current − baseline); noise band ±{result.NoiseBand:0.0000}; verdict: {(result.Pass ? "pass" : "fail")}"),
            shadeBlindZone: true);
        return new Figure
        {
            Title = string.IsNullOrWhiteSpace(title) ? (pair ? "Pair check" : "Repair check") : title,
            Panels = [traces, difference],
            Unit = unit,
            VelocityFactor = result.Settings.VelocityFactor,
            DistanceRangeMeters = (Math.Min(0, d[0]), d[^1]),
        };
    }

    /// <summary>
    /// The two panels every repair-check figure has: baseline and current overlaid (baseline dashed), and their
    /// difference with the combined noise band; shared by this figure and the HTML report's.
    /// </summary>
    public static (FigurePanel Overlay, FigurePanel Difference) Panels(CompareResult result, IReadOnlyList<FigureMarker> markers,
        string overlayTitle, string overlayYLabel, string differenceTitle, bool shadeBlindZone)
    {
        var d = result.DistancesMeters;
        var overlay = new FigurePanel
        {
            Title = overlayTitle,
            YLabel = overlayYLabel,
            Series =
            [
                new FigureSeries(d, result.Baseline.SamplesVolts.ToArray(), result.ReferenceKind == ReferenceKind.Pair ? "reference pair" : "baseline", SeriesStyle.Secondary),
                new FigureSeries(d, result.Current.SamplesVolts.ToArray(), result.ReferenceKind == ReferenceKind.Pair ? "suspect" : "current", SeriesStyle.Primary),
            ],
            Markers = markers,
            ShadedRegion = shadeBlindZone ? (0, result.BlindZoneMeters) : null,
            ShadedRegionLabel = shadeBlindZone ? "blind zone" : "",
        };
        var difference = new FigurePanel
        {
            Title = differenceTitle,
            YLabel = "Difference (× incident step)",
            Series = [new FigureSeries(d, result.Difference, "difference", SeriesStyle.Difference)],
            Markers = markers,
            Band = (-result.NoiseBand, result.NoiseBand),
        };
        return (overlay, difference);
    }

    private static string Label(EventChange change, DistanceUnit unit)
    {
        var e = (change.Current ?? change.Baseline)!;
        string kind = EventKindNames.ToJsonName(e.Kind).Replace('_', ' ');
        string where = unit.Format(change.DistanceMeters, 1);
        return change.Kind switch
        {
            EventChangeKind.Moved => string.Create(CultureInfo.InvariantCulture, $"{kind} moved {unit.FromMeters(change.ShiftMeters!.Value):+0.00;-0.00;0.00} {unit.Symbol}"),
            _ => $"{EventChangeKindNames.ToJsonName(change.Kind)} {kind} {where}",
        };
    }
}
