namespace CableFault.Reporting.Plots;

/// <summary>A figure: panels stacked vertically sharing one distance axis, with round-trip time shown on the top panel.</summary>
public sealed record Figure
{
    /// <summary>Title over the whole figure.</summary>
    public string Title { get; init; } = "";
    /// <summary>Panels from top to bottom.</summary>
    public IReadOnlyList<FigurePanel> Panels { get; init; } = [];
    /// <summary>Distance display unit.</summary>
    public DistanceUnit Unit { get; init; } = DistanceUnit.Meters;
    /// <summary>Velocity factor used to label round-trip time on the top axis; null hides it.</summary>
    public double? VelocityFactor { get; init; }
    /// <summary>x range in metres; null fits the data.</summary>
    public (double StartMeters, double EndMeters)? DistanceRangeMeters { get; init; }
    /// <summary>Width in pixels.</summary>
    public int WidthPixels { get; init; } = 1100;
    /// <summary>Height of each panel in pixels.</summary>
    public int PanelHeightPixels { get; init; } = 380;
}
