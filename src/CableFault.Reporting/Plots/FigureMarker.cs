namespace CableFault.Reporting.Plots;

/// <summary>A labelled vertical marker at a distance along the run.</summary>
/// <param name="DistanceMeters">Distance from the reference plane, m.</param>
/// <param name="Label">Short label ("open 41.9 m").</param>
/// <param name="Emphasised">True for findings that need attention (drawn solid and in the findings colour).</param>
public sealed record FigureMarker(double DistanceMeters, string Label, bool Emphasised = true);
