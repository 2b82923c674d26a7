namespace CableFault.Cables;

/// <summary>The usual velocity-factor range of each insulation class (common practice; values from memory).</summary>
public static class InsulationClassRanges
{
    /// <summary>(lowest, highest) VF for the class.</summary>
    public static (double Low, double High) VelocityFactorRange(InsulationClass insulation) => insulation switch
    {
        InsulationClass.SolidPolyethylene => (0.65, 0.67),
        InsulationClass.FoamPolyethylene => (0.78, 0.88),
        InsulationClass.Ptfe => (0.69, 0.71),
        InsulationClass.TwistedPair => (0.58, 0.72),
        InsulationClass.Xlpe => (0.50, 0.60),
        _ => (0.55, 0.90),
    };

    /// <summary>Parses a JSON/CLI name (solid_pe, foam_pe, ptfe, twisted_pair, xlpe); unknown for anything else.</summary>
    public static InsulationClass Parse(string? name) => name?.Trim().ToLowerInvariant().Replace('-', '_') switch
    {
        "solid_pe" => InsulationClass.SolidPolyethylene,
        "foam_pe" => InsulationClass.FoamPolyethylene,
        "ptfe" => InsulationClass.Ptfe,
        "twisted_pair" or "pair" or "pvc_pair" => InsulationClass.TwistedPair,
        "xlpe" => InsulationClass.Xlpe,
        _ => InsulationClass.Unknown,
    };

    /// <summary>The JSON/CLI name of a class.</summary>
    public static string Name(InsulationClass insulation) => insulation switch
    {
        InsulationClass.SolidPolyethylene => "solid_pe",
        InsulationClass.FoamPolyethylene => "foam_pe",
        InsulationClass.Ptfe => "ptfe",
        InsulationClass.TwistedPair => "twisted_pair",
        InsulationClass.Xlpe => "xlpe",
        _ => "unknown",
    };
}
