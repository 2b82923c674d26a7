using System.Globalization;
using System.Text.RegularExpressions;

namespace CableFault.Reporting.Html;

/// <summary>Number formatting for the report: invariant culture, precision that follows the uncertainty.</summary>
public static partial class ReportNumbers
{
    /// <summary>Decimals to show a distance with, in the display unit: the 1-σ figure rounded to one significant
    /// digit (two when it starts with 1, so 0.14 is not shown as 0.1), 0 to 3 decimals.</summary>
    public static int DecimalsFor(double sigmaInUnit)
    {
        if (!(sigmaInUnit > 0) || !double.IsFinite(sigmaInUnit)) return 2;
        double exponent = Math.Floor(Math.Log10(sigmaInUnit));
        double leading = sigmaInUnit / Math.Pow(10, exponent);
        int decimals = (int)-exponent + (leading < 1.95 ? 1 : 0);
        return Math.Clamp(decimals, 0, 3);
    }

    /// <summary>"143.2 m ± 0.4 m": the distance and its 1-σ figure in <paramref name="unit"/>.</summary>
    public static string DistanceWithSigma(double meters, double sigmaMeters, DistanceUnit unit)
    {
        int decimals = DecimalsFor(unit.FromMeters(sigmaMeters));
        return $"{unit.Format(meters, decimals)} ± {unit.Format(sigmaMeters, decimals)}";
    }

    /// <summary>A plain number with up to <paramref name="significant"/> significant digits.</summary>
    public static string Plain(double value, int significant = 3) =>
        double.IsFinite(value) ? value.ToString("G" + significant, CultureInfo.InvariantCulture) : "—";

    /// <summary>A number with a fixed count of decimals.</summary>
    public static string Fixed(double value, int decimals) =>
        double.IsFinite(value) ? value.ToString("F" + decimals, CultureInfo.InvariantCulture) : "—";

    /// <summary>Time with an engineering prefix: "1.25 ns", "480 ps".</summary>
    public static string Seconds(double seconds) => Prefixed(seconds, "s", [(1, ""), (1e-3, "m"), (1e-6, "µ"), (1e-9, "n"), (1e-12, "p")]);

    /// <summary>Voltage with a prefix: "0.42 mV".</summary>
    public static string Volts(double volts) => Prefixed(volts, "V", [(1, ""), (1e-3, "m"), (1e-6, "µ")]);

    /// <summary>Rounds to three significant digits first, then picks the largest prefix that keeps the number ≥ 1, so
    /// 0.9996 ns shows as "1 ns", not "1e+03 ps".</summary>
    private static string Prefixed(double value, string unit, (double Scale, string Prefix)[] prefixes)
    {
        if (!double.IsFinite(value)) return "—";
        if (value == 0) return "0 " + unit;
        double rounded = double.Parse(value.ToString("G3", CultureInfo.InvariantCulture), CultureInfo.InvariantCulture);
        foreach (var (scale, prefix) in prefixes)
            if (Math.Abs(rounded) >= scale * 0.9999999) return Plain(rounded / scale) + " " + prefix + unit;
        var (smallest, smallestPrefix) = prefixes[^1];
        return Plain(rounded / smallest) + " " + smallestPrefix + unit;
    }

    /// <summary>A lumped value in SI shown with the usual prefix for its kind: pF, nH or Ω/kΩ/MΩ.</summary>
    public static string Lumped(double value, string siUnit) => siUnit switch
    {
        "F" => Plain(value * 1e12) + " pF",
        "H" => Plain(value * 1e9) + " nH",
        "Ω" => Ohms(value),
        _ => Plain(value) + " " + siUnit,
    };

    /// <summary>Resistance or impedance with a prefix: "36.4 Ω", "75.8 kΩ"; "very high (over 1 MΩ)" beyond that.</summary>
    public static string Ohms(double ohms)
    {
        double magnitude = Math.Abs(ohms);
        if (!double.IsFinite(ohms) || magnitude >= 1e6) return "over 1 MΩ";
        if (magnitude >= 1e3) return Plain(ohms / 1e3) + " kΩ";
        return Plain(ohms) + " Ω";
    }

    /// <summary>Attenuation per 100 of the display unit: dB/100 m → dB/100 ft multiplies by 0.3048.</summary>
    public static string AttenuationPer100(double dbPer100m, DistanceUnit unit) =>
        Plain(dbPer100m * unit.MetersPerUnit) + " dB/100 " + unit.Symbol;

    /// <summary>
    /// Rewrites "12.3 m" figures inside a library message into <paramref name="unit"/>, keeping the decimals, so a
    /// report in feet carries no stray metres. Messages from the analysis state distances in metres followed by " m".
    /// </summary>
    public static string ConvertMeters(string message, DistanceUnit unit)
    {
        if (unit.MetersPerUnit == 1.0) return message;
        return MetresFigure().Replace(message, match =>
        {
            string number = match.Groups[1].Value;
            int dot = number.IndexOf('.');
            int decimals = dot < 0 ? 0 : number.Length - dot - 1;
            double meters = double.Parse(number, CultureInfo.InvariantCulture);
            return unit.Format(meters, decimals);
        });
    }

    [GeneratedRegex(@"(?<![\w.])(-?\d+(?:\.\d+)?) m\b")]
    private static partial Regex MetresFigure();
}
