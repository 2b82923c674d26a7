using System.Globalization;
using System.Text;
using ScottPlot;
using SkiaSharp;

namespace CableFault.Reporting.Plots;

/// <summary>Renders a <see cref="Figure"/> to PNG bytes or SVG text with ScottPlot. Pure: nothing is written to disk here.</summary>
public static class FigureRenderer
{
    private const int LeftPadding = 90, RightPadding = 30;

    /// <summary>Horizontal room one rotated label needs, px (an 11 pt line plus a gap).</summary>
    private const double LabelSpacingPixels = 17;

    /// <summary>PNG image of the figure.</summary>
    public static byte[] ToPng(Figure figure)
    {
        var plots = BuildPlots(figure);
        int width = figure.WidthPixels, panel = figure.PanelHeightPixels, height = panel * plots.Count;
        using var surface = SKSurface.Create(new SKImageInfo(width, height));
        var canvas = surface.Canvas;
        canvas.Clear(new SKColor(FigurePalette.Background.ARGB));
        for (int i = 0; i < plots.Count; i++)
        {
            // Each panel renders on its own surface (ScottPlot clears the whole canvas it is given), then is stacked.
            using var panelSurface = SKSurface.Create(new SKImageInfo(width, panel));
            plots[i].Render(panelSurface.Canvas, width, panel);
            plots[i].Dispose();
            using var panelImage = panelSurface.Snapshot();
            canvas.DrawImage(panelImage, 0, i * panel);
        }
        using var image = surface.Snapshot();
        using var data = image.Encode(SKEncodedImageFormat.Png, 100);
        return data.ToArray();
    }

    /// <summary>SVG document of the figure (panels nested as &lt;svg&gt; elements).</summary>
    public static string ToSvg(Figure figure)
    {
        var plots = BuildPlots(figure);
        int width = figure.WidthPixels, panel = figure.PanelHeightPixels, height = panel * plots.Count;
        var svg = new StringBuilder();
        svg.Append(CultureInfo.InvariantCulture, $"<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"{width}\" height=\"{height}\" viewBox=\"0 0 {width} {height}\">");
        for (int i = 0; i < plots.Count; i++)
        {
            string inner = plots[i].GetSvgXml(width, panel);
            plots[i].Dispose();
            int start = inner.IndexOf("<svg", StringComparison.Ordinal);
            inner = inner[start..];
            inner = inner.Insert(4, string.Create(CultureInfo.InvariantCulture, $" x=\"0\" y=\"{i * panel}\""));
            svg.Append(inner);
        }
        svg.Append("</svg>");
        return svg.ToString();
    }

    private static List<Plot> BuildPlots(Figure figure)
    {
        var unit = figure.Unit;
        var (xMin, xMax) = DistanceRange(figure);
        var plots = new List<Plot>();
        for (int p = 0; p < figure.Panels.Count; p++)
        {
            var panel = figure.Panels[p];
            var plot = new Plot();
            plot.FigureBackground.Color = FigurePalette.Background;
            plot.DataBackground.Color = Colors.White;
            plot.Grid.MajorLineColor = FigurePalette.Grid;
            // Same left/right gutters on every panel so the distance axes line up when stacked.
            plot.Axes.Left.MinimumSize = LeftPadding;
            plot.Axes.Left.MaximumSize = LeftPadding;
            plot.Axes.Right.MinimumSize = RightPadding;
            plot.Axes.Right.MaximumSize = RightPadding;
            plot.Title(p == 0 && figure.Title.Length > 0 ? $"{figure.Title} — {panel.Title}" : panel.Title, 15);
            plot.XLabel($"Distance from connector ({unit.Symbol})", 13);
            plot.YLabel(panel.YLabel, 13);

            if (panel.ShadedRegion is { } region)
            {
                var span = plot.Add.HorizontalSpan(unit.FromMeters(region.StartMeters), unit.FromMeters(region.EndMeters), FigurePalette.Shade.WithAlpha(0.8));
                span.LegendText = panel.ShadedRegionLabel;
            }
            if (panel.Band is { } band)
            {
                var bandSpan = plot.Add.VerticalSpan(band.Low, band.High, FigurePalette.Shade.WithAlpha(0.9));
                bandSpan.LegendText = "noise band";
            }
            foreach (var series in panel.Series) AddSeries(plot, series, unit);
            foreach (var marker in panel.Markers) AddMarker(plot, marker, unit);

            plot.Axes.SetLimitsX(unit.FromMeters(xMin), unit.FromMeters(xMax));
            if (panel.YRange is { } yRange) plot.Axes.SetLimitsY(yRange.Low, yRange.High);
            else
            {
                plot.Axes.AutoScaleY();
                // Head room above the data for the marker labels.
                var limits = plot.Axes.GetLimits();
                if (panel.Markers.Count > 0) plot.Axes.SetLimitsY(limits.Bottom, limits.Top + 0.35 * (limits.Top - limits.Bottom));
            }
            if (p == 0 && panel.Markers.Count > 0) AddMarkerLabels(plot, panel.Markers, unit, figure.WidthPixels);
            if (p == 0 && figure.VelocityFactor is double vf) AddTimeAxis(plot, unit, xMin, xMax, vf);
            if (panel.Series.Count > 1 || panel.ShadedRegion is not null || panel.Band is not null)
                plot.ShowLegend(Alignment.LowerRight);
            plots.Add(plot);
        }
        return plots;
    }

    private static (double Min, double Max) DistanceRange(Figure figure)
    {
        if (figure.DistanceRangeMeters is { } range) return range;
        double min = double.PositiveInfinity, max = double.NegativeInfinity;
        foreach (var series in figure.Panels.SelectMany(p => p.Series))
            foreach (double d in series.DistancesMeters)
            {
                min = Math.Min(min, d);
                max = Math.Max(max, d);
            }
        return double.IsFinite(min) && max > min ? (min, max) : (0, 1);
    }

    private static void AddSeries(Plot plot, FigureSeries series, DistanceUnit unit)
    {
        var xs = series.DistancesMeters.Select(unit.FromMeters).ToArray();
        var line = plot.Add.ScatterLine(xs, series.Values);
        line.LegendText = series.Name;
        line.MarkerSize = 0;
        switch (series.Style)
        {
            case SeriesStyle.Primary: line.Color = FigurePalette.Trace; line.LineWidth = 2; break;
            case SeriesStyle.Secondary: line.Color = FigurePalette.SecondTrace; line.LineWidth = 2; line.LinePattern = LinePattern.Dashed; break;
            case SeriesStyle.Profile: line.Color = FigurePalette.Profile; line.LineWidth = 2; break;
            case SeriesStyle.Difference: line.Color = FigurePalette.Finding; line.LineWidth = 1.5f; break;
        }
    }

    private static void AddMarker(Plot plot, FigureMarker marker, DistanceUnit unit)
    {
        var color = marker.Emphasised ? FigurePalette.Finding : FigurePalette.QuietFinding;
        var line = plot.Add.VerticalLine(unit.FromMeters(marker.DistanceMeters), marker.Emphasised ? 2f : 1.5f, color,
            marker.Emphasised ? LinePattern.Solid : LinePattern.Dotted);
    }

    /// <summary>
    /// Labels hang from the top of the data area, rotated. Markers closer than a label's height are fanned out to the
    /// right so their labels never overprint; each label still starts at the top of its own marker's line.
    /// </summary>
    private static void AddMarkerLabels(Plot plot, IReadOnlyList<FigureMarker> markers, DistanceUnit unit, int widthPixels)
    {
        var limits = plot.Axes.GetLimits();
        double dataWidthPixels = Math.Max(100, widthPixels - LeftPadding - RightPadding);
        double minimumSpacing = LabelSpacingPixels * (limits.Right - limits.Left) / dataWidthPixels;
        double lastX = double.NegativeInfinity;
        foreach (var marker in markers.OrderBy(m => m.DistanceMeters))
        {
            double x = unit.FromMeters(marker.DistanceMeters);
            double labelX = Math.Max(x, lastX + minimumSpacing);
            lastX = labelX;
            var text = plot.Add.Text(marker.Label, labelX, limits.Top);
            text.LabelStyle.Rotation = 90;
            text.LabelStyle.FontSize = 11;
            text.LabelStyle.Bold = marker.Emphasised;
            text.LabelStyle.ForeColor = marker.Emphasised ? FigurePalette.Finding : FigurePalette.QuietFinding;
            text.LabelStyle.BackgroundColor = Colors.White.WithAlpha(0.85);
            text.LabelStyle.Alignment = Alignment.LowerLeft;
            text.OffsetX = 3;
            text.OffsetY = 4;
        }
    }

    /// <summary>Top axis: round-trip time t = 2d/v in ns, at "nice" tick values.</summary>
    private static void AddTimeAxis(Plot plot, DistanceUnit unit, double xMinMeters, double xMaxMeters, double velocityFactor)
    {
        double v = velocityFactor * PhysicalConstants.SpeedOfLightMetersPerSecond;
        double tMin = 2 * xMinMeters / v * 1e9, tMax = 2 * xMaxMeters / v * 1e9;
        double step = NiceStep((tMax - tMin) / 8);
        var ticks = new ScottPlot.TickGenerators.NumericManual();
        for (double t = Math.Ceiling(tMin / step) * step; t <= tMax + step * 1e-9; t += step)
        {
            double meters = t * 1e-9 * v / 2;
            double shown = Math.Abs(t) < step * 1e-6 ? 0 : t;
            ticks.AddMajor(unit.FromMeters(meters), shown.ToString(step >= 1 ? "F0" : "G3", CultureInfo.InvariantCulture) + " ns");
        }
        plot.Axes.Top.TickGenerator = ticks;
        // The top axis has its own range; plottables live on the bottom axis, so mirror its limits.
        plot.Axes.SetLimitsX(unit.FromMeters(xMinMeters), unit.FromMeters(xMaxMeters), plot.Axes.Top);
        // ScottPlot stacks the title over the top axis label; the unit goes on each tick instead.
        plot.Axes.Bottom.Label.Text += string.Create(CultureInfo.InvariantCulture, $" at VF {velocityFactor:F3}  ·  top axis: round-trip time");
    }

    private static double NiceStep(double rough)
    {
        if (!(rough > 0) || !double.IsFinite(rough)) return 1;
        double power = Math.Pow(10, Math.Floor(Math.Log10(rough)));
        double fraction = rough / power;
        double nice = fraction < 1.5 ? 1 : fraction < 3.5 ? 2 : fraction < 7.5 ? 5 : 10;
        return nice * power;
    }
}
