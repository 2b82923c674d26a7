namespace CableFault.Comparison;

/// <summary>The stable command-line and JSON vocabulary for <see cref="ReferenceKind"/>.</summary>
public static class ReferenceKindNames
{
    /// <summary>baseline or pair.</summary>
    public static string ToName(ReferenceKind kind) => kind switch
    {
        ReferenceKind.Baseline => "baseline",
        ReferenceKind.Pair => "pair",
        _ => throw new ArgumentOutOfRangeException(nameof(kind), kind, "Unknown reference kind."),
    };

    /// <summary>Parses "baseline" or "pair" (case-insensitive); throws <see cref="InputException"/> otherwise.</summary>
    public static ReferenceKind Parse(string name) => name?.Trim().ToLowerInvariant() switch
    {
        "baseline" => ReferenceKind.Baseline,
        "pair" => ReferenceKind.Pair,
        _ => throw new InputException($"--reference-kind '{name}': expected 'baseline' (an earlier capture of the same run) or 'pair' (a healthy pair of the same cable)."),
    };

    /// <summary>How the reference is named in sentences: "baseline" or "reference pair".</summary>
    public static string Noun(ReferenceKind kind) => kind == ReferenceKind.Pair ? "reference pair" : "baseline";
}
