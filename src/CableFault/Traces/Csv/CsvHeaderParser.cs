using System.Text.RegularExpressions;

namespace CableFault.Traces.Csv;

/// <summary>
/// Reads a header cell such as <c>time_s</c>, <c>time [ns]</c>, <c>Time (s)</c>, <c>t/ps</c>, <c>ns</c>,
/// <c>voltage (V)</c>, <c>mV</c>, <c>CH1 (V)</c> or <c>rho</c>. The unit decides the quantity when the name is not
/// one we know, so a channel label with a voltage unit is still a voltage.
/// </summary>
internal static partial class CsvHeaderParser
{
    private static readonly Dictionary<string, double> TimeUnits = new()
    {
        ["s"] = 1, ["sec"] = 1, ["secs"] = 1, ["second"] = 1, ["seconds"] = 1,
        ["ms"] = 1e3, ["msec"] = 1e3,
        ["us"] = 1e6, ["usec"] = 1e6,
        ["ns"] = 1e9, ["nsec"] = 1e9,
        ["ps"] = 1e12, ["psec"] = 1e12,
    };

    private static readonly Dictionary<string, double> VoltageUnits = new()
    {
        ["v"] = 1, ["volt"] = 1, ["volts"] = 1,
        ["mv"] = 1e3, ["millivolt"] = 1e3, ["millivolts"] = 1e3,
        ["uv"] = 1e6,
    };

    private static readonly Dictionary<string, double> RhoUnits = new()
    {
        ["rho"] = 1, ["ρ"] = 1, ["mrho"] = 1e3, ["mρ"] = 1e3,
    };

    private static readonly HashSet<string> TimeNames = ["time", "t"];
    private static readonly HashSet<string> VoltageNames = ["voltage", "volts", "volt", "v", "amplitude", "signal", "level"];
    private static readonly HashSet<string> RhoNames =
        ["rho", "ρ", "reflection", "reflection coefficient", "reflection_coefficient", "refl", "gamma", "γ"];

    [GeneratedRegex(@"^(?<name>.*?)\s*[\(\[](?<unit>[^\)\]]*)[\)\]]$")]
    private static partial Regex BracketedUnit();

    /// <summary>Understands one header cell; unknown cells come back as <see cref="ColumnQuantity.Unknown"/>.</summary>
    public static CsvColumn Parse(string header)
    {
        string h = Normalise(header);

        var m = BracketedUnit().Match(h);
        if (m.Success)
        {
            string name = m.Groups["name"].Value.Trim();
            string unit = m.Groups["unit"].Value.Trim();
            if (ByUnit(header, unit) is { } byUnit) return byUnit;
            if (RhoNames.Contains(name)) return new(header, ColumnQuantity.Rho, 1, true); // "rho (-)": dimensionless
            if (TimeNames.Contains(name) || VoltageNames.Contains(name))
                return new(header, ColumnQuantity.Unknown, 1, true) { UnrecognisedUnit = unit };
            return new(header, ColumnQuantity.Unknown, 1, false);
        }

        if (ByUnit(header, h) is { } bare) return bare; // "ns", "mV", "volts", "rho"
        if (TimeNames.Contains(h)) return new(header, ColumnQuantity.Time, 1, false);
        if (RhoNames.Contains(h)) return new(header, ColumnQuantity.Rho, 1, true);
        if (VoltageNames.Contains(h)) return new(header, ColumnQuantity.Voltage, 1, false);

        // "time_ns", "t/ps", "ch1_mv": a trailing unit after '_', '/' or a space. Anything else is not ours.
        int cut = h.LastIndexOfAny(['_', '/', ' ']);
        if (cut > 0 && cut < h.Length - 1 && ByUnit(header, h[(cut + 1)..].Trim()) is { } suffixed) return suffixed;
        return new(header, ColumnQuantity.Unknown, 1, false);
    }

    private static CsvColumn? ByUnit(string header, string unit)
    {
        if (TimeUnits.TryGetValue(unit, out double d)) return new(header, ColumnQuantity.Time, d, true);
        if (VoltageUnits.TryGetValue(unit, out d)) return new(header, ColumnQuantity.Voltage, d, true);
        if (RhoUnits.TryGetValue(unit, out d)) return new(header, ColumnQuantity.Rho, d, true);
        return null;
    }

    private static string Normalise(string header) =>
        header.Trim().Trim('"').Trim().ToLowerInvariant().Replace('µ', 'u').Replace('μ', 'u');
}
