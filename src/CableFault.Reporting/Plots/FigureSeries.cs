namespace CableFault.Reporting.Plots;

/// <summary>One line on a panel: x in metres along the run, y in the panel's unit.</summary>
/// <param name="DistancesMeters">x values, m.</param>
/// <param name="Values">y values.</param>
/// <param name="Name">Legend text.</param>
/// <param name="Style">How to draw it.</param>
public sealed record FigureSeries(double[] DistancesMeters, double[] Values, string Name, SeriesStyle Style = SeriesStyle.Primary);

/// <summary>Line styles that stay distinct in black and white.</summary>
public enum SeriesStyle
{
    /// <summary>Solid, heavy, ink blue.</summary>
    Primary,
    /// <summary>Dashed, grey.</summary>
    Secondary,
    /// <summary>Solid green (impedance).</summary>
    Profile,
    /// <summary>Dotted copper (differences).</summary>
    Difference,
}
