using CableFault.Analysis;

namespace CableFault.Workflows;

/// <summary>
/// The feature names of an as-built list and the located event kinds each may show up as. Besides the words below, any
/// event kind of DESIGN.md §4 (<c>open</c>, <c>inductive</c>, ...) may be listed, and then only that kind matches.
/// <list type="table">
/// <item><term>connector, splice</term><description>inductive, capacitive or unknown: a joint is a small lumped
/// discontinuity (the pin and its gap add series inductance; a crimp or a compressed dielectric adds shunt
/// capacitance), common practice.</description></item>
/// <item><term>tap</term><description>tap, impedance_drop or unknown: two equal lines in parallel look like a step
/// down to Z₀/2 (ρ ≈ −1/3) until the branch's own echoes arrive.</description></item>
/// <item><term>cable_change</term><description>impedance_rise, impedance_drop or unknown: a lasting step to the
/// impedance of the other cable.</description></item>
/// <item><term>end</term><description>open, short or termination: how the far end was left for the test.</description></item>
/// </list>
/// A series resistance, partial short or open at a listed joint is deliberately not "expected": a joint that has
/// turned resistive or leaky is the fault the list is meant to bring out.
/// </summary>
public static class AsBuiltKinds
{
    private static readonly (string Name, EventKind[] Kinds)[] Features =
    [
        ("connector", [EventKind.Inductive, EventKind.Capacitive, EventKind.Unknown]),
        ("splice", [EventKind.Inductive, EventKind.Capacitive, EventKind.Unknown]),
        ("tap", [EventKind.Tap, EventKind.ImpedanceDrop, EventKind.Unknown]),
        ("cable_change", [EventKind.ImpedanceRise, EventKind.ImpedanceDrop, EventKind.Unknown]),
        ("end", [EventKind.Open, EventKind.Short, EventKind.Termination]),
    ];

    /// <summary>The feature words (not the event kinds), in the order documented.</summary>
    public static IReadOnlyList<string> FeatureNames => Array.ConvertAll(Features, f => f.Name);

    /// <summary>Every name a list entry's <c>kind</c> may take: the feature words, then the event kinds.</summary>
    public static IReadOnlyList<string> AllNames => [.. FeatureNames, .. EventKindNames.All];

    /// <summary>The located kinds that <paramref name="name"/> accepts (case-insensitive); false for an unknown name.</summary>
    public static bool TryAccepted(string? name, out IReadOnlyList<EventKind> kinds)
    {
        string trimmed = name?.Trim() ?? "";
        foreach (var (n, k) in Features)
        {
            if (string.Equals(n, trimmed, StringComparison.OrdinalIgnoreCase)) { kinds = k; return true; }
        }
        if (EventKindNames.TryParse(trimmed, out var kind)) { kinds = [kind]; return true; }
        kinds = [];
        return false;
    }
}
