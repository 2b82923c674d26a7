namespace CableFault.FrequencyDomain;

/// <summary>Which edition of the Touchstone format a file follows.</summary>
public enum TouchstoneVersion
{
    /// <summary>Version 1.x: option line and data only; the number of ports comes from the file name (<c>.s1p</c>, <c>.s2p</c>).</summary>
    V1,
    /// <summary>Version 2.0: keywords in square brackets ([Version], [Number of Ports], [Network Data], ...).</summary>
    V2,
}
