namespace CableFault.Analysis;

/// <summary>
/// What an event on the run is. JSON names (DESIGN.md §4) come from <see cref="EventKindNames"/>.
/// </summary>
public enum EventKind
{
    /// <summary>Open circuit (ρ → +1).</summary>
    Open,
    /// <summary>Short circuit (ρ → −1).</summary>
    Short,
    /// <summary>Lasting rise of the line impedance (a section of higher Z0).</summary>
    ImpedanceRise,
    /// <summary>Lasting drop of the line impedance (a section of lower Z0, e.g. crushed or wet).</summary>
    ImpedanceDrop,
    /// <summary>Shunt capacitance (transient dip).</summary>
    Capacitive,
    /// <summary>Series inductance (transient bump).</summary>
    Inductive,
    /// <summary>Shunt resistance (lasting negative step, not to −1).</summary>
    PartialShort,
    /// <summary>Series resistance (lasting positive step, not to +1).</summary>
    SeriesResistance,
    /// <summary>A branch or junction (ρ ≈ −1/3 for two equal lines, then branch echoes).</summary>
    Tap,
    /// <summary>A resistive end; the value is the load in ohms.</summary>
    Termination,
    /// <summary>Something changes here but its kind cannot be told.</summary>
    Unknown,
}
