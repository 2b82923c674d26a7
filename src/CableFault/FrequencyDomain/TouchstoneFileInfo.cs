namespace CableFault.FrequencyDomain;

/// <summary>What a Touchstone file declared about itself; kept so that a report can say what was read.</summary>
/// <param name="Version">The format edition.</param>
/// <param name="PortCount">Number of ports (1 or 2 are accepted).</param>
/// <param name="Parameter">The parameter kind in the file (converted to S11 on reading where possible).</param>
/// <param name="Format">The number format of the data.</param>
/// <param name="FrequencyUnit">The frequency unit as written (<c>Hz</c>, <c>kHz</c>, <c>MHz</c>, <c>GHz</c>).</param>
/// <param name="FrequencyScale">Hertz per file frequency unit (1, 10³, 10⁶ or 10⁹).</param>
public sealed record TouchstoneFileInfo(
    TouchstoneVersion Version,
    int PortCount,
    NetworkParameterKind Parameter,
    TouchstoneDataFormat Format,
    string FrequencyUnit,
    double FrequencyScale);
