namespace CableFault.Reporting.Plots;

/// <summary>One panel of a figure: a y quantity against distance along the run.</summary>
public sealed record FigurePanel
{
    /// <summary>Panel title.</summary>
    public string Title { get; init; } = "";
    /// <summary>y-axis label with its unit ("Port voltage (V)").</summary>
    public string YLabel { get; init; } = "";
    /// <summary>Lines to draw.</summary>
    public IReadOnlyList<FigureSeries> Series { get; init; } = [];
    /// <summary>Markers to draw.</summary>
    public IReadOnlyList<FigureMarker> Markers { get; init; } = [];
    /// <summary>Optional shaded band on y (e.g. the noise floor), in the panel's unit.</summary>
    public (double Low, double High)? Band { get; init; }
    /// <summary>Optional shaded region on x (e.g. the blind zone), m.</summary>
    public (double StartMeters, double EndMeters)? ShadedRegion { get; init; }
    /// <summary>Label for the shaded region.</summary>
    public string ShadedRegionLabel { get; init; } = "";
    /// <summary>Optional fixed y range.</summary>
    public (double Low, double High)? YRange { get; init; }
}
