using CableFault.Comparison;
using CableFault.Reporting.Plots;

namespace CableFault.Reporting.Html;

/// <summary>The repair check's figure: baseline and current overlaid, and their difference with the noise band.</summary>
public static class RepairCheckFigures
{
    /// <summary>Builds the figure; markers carry the change table's labels (c1, c2, ...), never user text.</summary>
    public static Figure Build(CompareResult comparison, IReadOnlyList<EventChange> listed, DistanceUnit unit)
    {
        ArgumentNullException.ThrowIfNull(comparison);
        var d = comparison.DistancesMeters;
        double recordEnd = d.Length > 0 ? d[^1] : 1;
        double farthest = comparison.Events.Count > 0 ? comparison.Events.Max(e => e.DistanceMeters) : recordEnd;
        double end = Math.Min(recordEnd, farthest * (1 + ReportFigures.TailFraction) + 4 * comparison.BlindZoneMeters);
        if (!(end > 0)) end = recordEnd;
        double start = -0.03 * end;
        var markers = listed.Select((c, i) => new FigureMarker(c.DistanceMeters, "c" + (i + 1), c.ExceedsTolerance)).ToList();
        bool pair = comparison.ReferenceKind == ReferenceKind.Pair;
        var (overlay, difference) = CompareFigures.Panels(comparison, markers, pair ? "Reference pair and suspect pair" : "Baseline and current trace",
            "Level (× incident step)", pair ? "Difference, suspect − reference pair" : "Difference, current − baseline", shadeBlindZone: false);
        return new Figure
        {
            Panels = [overlay, difference],
            Unit = unit,
            VelocityFactor = comparison.Settings.VelocityFactor,
            DistanceRangeMeters = (start, end),
            WidthPixels = 1000,
            PanelHeightPixels = 300,
        };
    }
}
