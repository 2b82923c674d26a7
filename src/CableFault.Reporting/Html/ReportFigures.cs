using CableFault.Analysis;
using CableFault.Reporting.Plots;

namespace CableFault.Reporting.Html;

/// <summary>The report's figure: the aligned trace (with the fitted model) over the impedance profile, events marked
/// with their table numbers, the blind zone shaded.</summary>
public static class ReportFigures
{
    /// <summary>Share of the span added beyond the farthest event, so its tail and the level after it are seen.</summary>
    public const double TailFraction = 0.25;

    /// <summary>Impedance axis top in multiples of Z₀: an open's profile runs off to very large values, which would
    /// flatten everything else; 3·Z₀ keeps a 2:1 step readable and shows the open as a line leaving the top.</summary>
    public const double ProfileTopTimesZ0 = 3;

    /// <summary>Builds the figure. Markers carry only the events' table numbers (names would pile up where events are
    /// close), never user text.</summary>
    public static Figure Build(LocateResult result, IReadOnlyList<ReportFinding> findings, DistanceUnit unit)
    {
        ArgumentNullException.ThrowIfNull(result);
        double vf = result.Options.VelocityFactor;
        double v = vf * PhysicalConstants.SpeedOfLightMetersPerSecond;
        var trace = result.AlignedTrace;
        double recordEndMeters = v * trace.EndTimeSeconds / 2;
        double farthest = result.Events.Count > 0 ? result.Events.Max(e => e.DistanceMeters) : recordEndMeters;
        double end = Math.Min(recordEndMeters, farthest * (1 + TailFraction) + 4 * result.BlindZoneMeters);
        if (!(end > 0)) end = recordEndMeters;
        double start = -0.03 * end;

        var (traceX, traceY) = Window(trace.TimesSeconds(), trace.SamplesVolts.ToArray(), v, start, end);
        var series = new List<FigureSeries> { new(traceX, traceY, "measured trace") };
        if (result.ModelTrace is { } model)
        {
            var (modelX, modelY) = Window(model.TimesSeconds(), model.SamplesVolts.ToArray(), v, start, end);
            if (modelX.Length > 1) series.Add(new FigureSeries(modelX, modelY, "fitted model", SeriesStyle.Secondary));
        }
        var markers = findings
            .OrderBy(f => f.Number)
            .Select(f => new FigureMarker(f.Event.DistanceMeters, f.Number.ToString(System.Globalization.CultureInfo.InvariantCulture),
                f.Role == FindingRole.Attention))
            .ToList();
        var blind = (0.0, result.BlindZoneMeters);
        var tracePanel = new FigurePanel
        {
            Title = "Step response at the connector",
            YLabel = "Port voltage (V)",
            Series = series,
            Markers = markers,
            ShadedRegion = blind,
            ShadedRegionLabel = "blind zone",
        };

        double z0 = result.Options.ImpedanceOhms;
        double top = ProfileTopTimesZ0 * z0;
        var profile = result.Profile;
        var profileX = new List<double>();
        var profileY = new List<double>();
        for (int i = 0; i < profile.Length; i++)
        {
            double d = profile.DistancesMeters[i];
            if (d < start || d > end) continue;
            profileX.Add(d);
            profileY.Add(Math.Clamp(profile.ImpedanceOhms[i], 0, top));
        }
        var profilePanel = new FigurePanel
        {
            Title = "Impedance along the run (layer peeling)",
            YLabel = "Impedance (Ω)",
            Series = profileX.Count > 1 ? [new FigureSeries(profileX.ToArray(), profileY.ToArray(), "impedance", SeriesStyle.Profile)] : [],
            Markers = markers,
            ShadedRegion = blind,
            ShadedRegionLabel = "blind zone",
            YRange = (0, top),
        };
        return new Figure
        {
            Panels = [tracePanel, profilePanel],
            Unit = unit,
            VelocityFactor = vf,
            DistanceRangeMeters = (start, end),
            WidthPixels = 1000,
            PanelHeightPixels = 320,
        };
    }

    private static (double[] X, double[] Y) Window(double[] times, double[] values, double v, double startMeters, double endMeters)
    {
        var x = new List<double>(times.Length);
        var y = new List<double>(times.Length);
        for (int i = 0; i < times.Length; i++)
        {
            double d = v * times[i] / 2;
            if (d < startMeters || d > endMeters) continue;
            x.Add(d);
            y.Add(values[i]);
        }
        return (x.ToArray(), y.ToArray());
    }
}
