namespace CableFault.Traces;

/// <summary>
/// Metadata keys with an agreed meaning (lower case, as stored by the readers). Values are strings; numeric ones are
/// written in the invariant culture and in SI units as the key's suffix says.
/// </summary>
public static class TraceMetadataKeys
{
    /// <summary>Velocity factor v/c, dimensionless, in (0, 1].</summary>
    public const string VelocityFactor = "vf";

    /// <summary>Characteristic impedance of the cable, in ohms (&gt; 0).</summary>
    public const string CharacteristicImpedanceOhms = "z0";

    /// <summary>Cable type name from the cable library.</summary>
    public const string Cable = "cable";

    /// <summary>Name of the cable run.</summary>
    public const string Run = "run";

    /// <summary>10–90 % rise time of the instrument's step, in seconds (&gt; 0).</summary>
    public const string RiseTimeSeconds = "rise_s";

    /// <summary>Instrument source impedance, in ohms (≥ 0).</summary>
    public const string SourceImpedanceOhms = "source_ohms";

    /// <summary>Where the measurement was made.</summary>
    public const string Site = "site";

    /// <summary>Who made the measurement.</summary>
    public const string Technician = "technician";

    /// <summary>When the measurement was made (free text; ISO 8601 preferred).</summary>
    public const string Date = "date";

    /// <summary>Unit of the samples when they are not volts: <c>rho</c> for reflection coefficient.</summary>
    public const string Unit = "unit";
}
