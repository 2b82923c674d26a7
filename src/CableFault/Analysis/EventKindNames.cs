namespace CableFault.Analysis;

/// <summary>The stable JSON vocabulary for <see cref="EventKind"/> (DESIGN.md §4).</summary>
public static class EventKindNames
{
    private static readonly (EventKind Kind, string Name)[] Names =
    [
        (EventKind.Open, "open"),
        (EventKind.Short, "short"),
        (EventKind.ImpedanceRise, "impedance_rise"),
        (EventKind.ImpedanceDrop, "impedance_drop"),
        (EventKind.Capacitive, "capacitive"),
        (EventKind.Inductive, "inductive"),
        (EventKind.PartialShort, "partial_short"),
        (EventKind.SeriesResistance, "series_resistance"),
        (EventKind.Tap, "tap"),
        (EventKind.Termination, "termination"),
        (EventKind.Unknown, "unknown"),
    ];

    /// <summary>The JSON name of <paramref name="kind"/>, e.g. <c>impedance_rise</c>.</summary>
    public static string ToJsonName(EventKind kind)
    {
        foreach (var (k, n) in Names)
            if (k == kind) return n;
        throw new ArgumentOutOfRangeException(nameof(kind), kind, "Unknown event kind.");
    }

    /// <summary>Parses a JSON name (case-insensitive); false when the name is not in the vocabulary.</summary>
    public static bool TryParse(string? name, out EventKind kind)
    {
        foreach (var (k, n) in Names)
            if (string.Equals(n, name?.Trim(), StringComparison.OrdinalIgnoreCase)) { kind = k; return true; }
        kind = EventKind.Unknown;
        return false;
    }

    /// <summary>All JSON names, in enum order.</summary>
    public static IReadOnlyList<string> All => Array.ConvertAll(Names, p => p.Name);
}
