namespace CableFault.Comparison;

/// <summary>What the reference trace of a comparison is, which sets the default tolerances of the check.</summary>
public enum ReferenceKind
{
    /// <summary>An earlier capture of the same conductors (at installation, before the damage): re-measurement
    /// tolerances (<see cref="CompareTolerances.ForBaseline"/>).</summary>
    Baseline,

    /// <summary>A healthy pair (or core pair) of the same cable, captured in the same session: pair-to-pair tolerances
    /// that absorb the spread of impedance and lay length between pairs (<see cref="CompareTolerances.ForPair"/>).</summary>
    Pair,
}
