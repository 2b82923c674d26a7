using ScottPlot;

namespace CableFault.Reporting.Plots;

/// <summary>
/// CableFault's own look: ink-blue trace on warm white, copper for findings, a muted green for the impedance profile.
/// Every series also differs in line pattern or width so a black-and-white print stays readable.
/// </summary>
public static class FigurePalette
{
    /// <summary>Main trace.</summary>
    public static Color Trace { get; } = Color.FromHex("#1d3557");
    /// <summary>A second trace (baseline, model).</summary>
    public static Color SecondTrace { get; } = Color.FromHex("#7a7a7a");
    /// <summary>Impedance profile.</summary>
    public static Color Profile { get; } = Color.FromHex("#2f6b4f");
    /// <summary>Findings (event markers).</summary>
    public static Color Finding { get; } = Color.FromHex("#b5562a");
    /// <summary>Secondary findings (expected, unchanged).</summary>
    public static Color QuietFinding { get; } = Color.FromHex("#8c7a5b");
    /// <summary>Shaded regions (blind zone, noise band).</summary>
    public static Color Shade { get; } = Color.FromHex("#e9e2d0");
    /// <summary>Figure background.</summary>
    public static Color Background { get; } = Color.FromHex("#fffdf8");
    /// <summary>Grid lines.</summary>
    public static Color Grid { get; } = Color.FromHex("#e4e0d8");
}
