namespace CableFault.Networks;

/// <summary>How a branch ends.</summary>
public enum EndKind
{
    /// <summary>Open circuit, ρ = +1 exactly.</summary>
    Open,
    /// <summary>Short circuit, ρ = −1 exactly.</summary>
    Short,
    /// <summary>Terminated in the characteristic impedance of the last segment (reflectionless at every frequency).</summary>
    Matched,
    /// <summary>A resistor of <see cref="RunEnd.ResistanceOhms"/>.</summary>
    Resistor,
    /// <summary>A resistor in parallel with a capacitor.</summary>
    ResistorParallelCapacitor,
}

/// <summary>The end of a branch. Must be the last element of its branch.</summary>
/// <param name="Kind">What the end is.</param>
/// <param name="ResistanceOhms">For <see cref="EndKind.Resistor"/> and <see cref="EndKind.ResistorParallelCapacitor"/>, Ω (&gt; 0).</param>
/// <param name="CapacitanceFarads">For <see cref="EndKind.ResistorParallelCapacitor"/>, F (≥ 0).</param>
public sealed record RunEnd(EndKind Kind, double ResistanceOhms = 0, double CapacitanceFarads = 0) : NetworkElement
{
    /// <summary>An open end.</summary>
    public static RunEnd Open => new(EndKind.Open);
    /// <summary>A short-circuited end.</summary>
    public static RunEnd Short => new(EndKind.Short);
    /// <summary>A reflectionless end.</summary>
    public static RunEnd Matched => new(EndKind.Matched);
    /// <summary>A resistive end.</summary>
    public static RunEnd Resistor(double ohms) => new(EndKind.Resistor, ohms);
}
