namespace CableFault.FrequencyDomain;

/// <summary>The kind of network parameter a Touchstone file holds (the option line's parameter field).</summary>
public enum NetworkParameterKind
{
    /// <summary>Scattering parameters (the Touchstone default).</summary>
    S,
    /// <summary>Admittance parameters.</summary>
    Y,
    /// <summary>Impedance parameters.</summary>
    Z,
    /// <summary>Hybrid-h parameters (two-port only).</summary>
    H,
    /// <summary>Hybrid-g parameters (two-port only).</summary>
    G,
}
