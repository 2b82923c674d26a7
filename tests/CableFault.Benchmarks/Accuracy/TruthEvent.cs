using CableFault.Analysis;

namespace CableFault.Benchmarks.Accuracy;

/// <summary>One event a generated run really has: where it is, what DESIGN.md §4 calls it, and how big it looks at the port.</summary>
/// <param name="DistanceMeters">One-way distance from the port along the main line, m.</param>
/// <param name="Kind">The kind a correct <c>locate</c> names it (DESIGN.md §4 vocabulary).</param>
/// <param name="Element">What was put into the network, in words (e.g. "shunt R 120 Ω").</param>
/// <param name="SeenSize">Estimated size of its signature at the port as a fraction of the incident step (see
/// <see cref="RunGenerator"/> for the rule), dimensionless, &gt; 0.</param>
/// <param name="EquivalentKind">A second kind that is just as right, because no trace taken at the port can tell the two
/// apart (see <see cref="RunGenerator"/>: a resistor as the last thing before a matched end); null when there is none.</param>
public sealed record TruthEvent(double DistanceMeters, EventKind Kind, string Element, double SeenSize, EventKind? EquivalentKind = null)
{
    /// <summary>True when <paramref name="reported"/> names this event rightly.</summary>
    public bool IsRightKind(EventKind reported) => reported == Kind || reported == EquivalentKind;
}
