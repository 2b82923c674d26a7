using System.Globalization;
using CableFault.Analysis;

namespace CableFault.Reporting.Locate;

/// <summary>Plain words and engineering units for events, shared by text, HTML and plots.</summary>
public static class EventWording
{
    /// <summary>"open", "impedance rise", ... for people.</summary>
    public static string KindWords(EventKind kind) => kind switch
    {
        EventKind.Open => "open",
        EventKind.Short => "short",
        EventKind.ImpedanceRise => "impedance rise",
        EventKind.ImpedanceDrop => "impedance drop",
        EventKind.Capacitive => "capacitive spot",
        EventKind.Inductive => "inductive spot",
        EventKind.PartialShort => "partial short",
        EventKind.SeriesResistance => "series resistance",
        EventKind.Tap => "tap",
        EventKind.Termination => "termination",
        _ => "unidentified change",
    };

    /// <summary>The event's size with its unit: "→ 36.2 Ω", "4.7 pF", "310 Ω leak" ...; empty when it has none.</summary>
    public static string SizeWords(LocatedEvent e) => e.Kind switch
    {
        EventKind.ImpedanceRise or EventKind.ImpedanceDrop when e.ImpedanceOhms is double z => $"→ {Ohms(z)}",
        EventKind.Capacitive when e.Value is double c => Engineering(c, "F"),
        EventKind.Inductive when e.Value is double l => Engineering(l, "H"),
        EventKind.PartialShort when e.Value is double r => $"{Ohms(r)} leak",
        EventKind.SeriesResistance when e.Value is double r => $"{Ohms(r)} in series",
        EventKind.Termination when e.Value is double r => $"{Ohms(r)} load",
        _ when e.ImpedanceOhms is double z => $"→ {Ohms(z)}",
        _ => "",
    };

    /// <summary>Ohms with sensible precision.</summary>
    public static string Ohms(double ohms) => ohms.ToString(ohms >= 100 ? "F0" : "F1", CultureInfo.InvariantCulture) + " Ω";

    /// <summary>A value in engineering notation with an SI prefix: 4.7e-12 F → "4.7 pF".</summary>
    public static string Engineering(double value, string unit)
    {
        if (value == 0 || !double.IsFinite(value)) return $"{value.ToString(CultureInfo.InvariantCulture)} {unit}";
        string[] prefixes = ["f", "p", "n", "µ", "m", "", "k", "M", "G"];
        int exponent = (int)Math.Floor(Math.Log10(Math.Abs(value)) / 3);
        exponent = Math.Clamp(exponent, -5, 3);
        double scaled = value / Math.Pow(1000, exponent);
        return scaled.ToString("G3", CultureInfo.InvariantCulture) + " " + prefixes[exponent + 5] + unit;
    }

    /// <summary>One plain sentence: "Open at 42.51 m ± 0.85 m from the connector".</summary>
    public static string Sentence(LocatedEvent e, DistanceUnit unit)
    {
        string size = SizeWords(e);
        string kind = KindWords(e.Kind);
        string head = char.ToUpperInvariant(kind[0]) + kind[1..];
        return $"{head}{(size.Length > 0 ? $" ({size})" : "")} at {unit.Format(e.DistanceMeters)} ± {unit.Format(e.DistanceSigmaMeters)} from the connector";
    }

    /// <summary>How much attention an event needs, for ordering summaries: faults first, then changes, then ends.</summary>
    public static int Severity(LocatedEvent e) => e.Kind switch
    {
        EventKind.Short or EventKind.PartialShort => 0,
        EventKind.Open => 1,
        EventKind.SeriesResistance or EventKind.Capacitive or EventKind.ImpedanceDrop => 2,
        EventKind.ImpedanceRise or EventKind.Inductive or EventKind.Tap => 3,
        EventKind.Unknown => 4,
        _ => 5,
    };
}
