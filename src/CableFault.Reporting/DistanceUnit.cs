using System.Globalization;

namespace CableFault.Reporting;

/// <summary>Display unit for distances; everything inside is metres.</summary>
public sealed record DistanceUnit(string Symbol, double MetersPerUnit)
{
    /// <summary>Metres.</summary>
    public static DistanceUnit Meters { get; } = new("m", 1.0);

    /// <summary>International feet.</summary>
    public static DistanceUnit Feet { get; } = new("ft", PhysicalConstants.MetersPerFoot);

    /// <summary>From the --units option value.</summary>
    public static DistanceUnit Parse(string? symbol) => symbol == "ft" ? Feet : Meters;

    /// <summary>Metres to this unit.</summary>
    public double FromMeters(double meters) => meters / MetersPerUnit;

    /// <summary>Formats a distance in metres with this unit's symbol.</summary>
    public string Format(double meters, int decimals = 2) =>
        FromMeters(meters).ToString("F" + decimals, CultureInfo.InvariantCulture) + " " + Symbol;
}
