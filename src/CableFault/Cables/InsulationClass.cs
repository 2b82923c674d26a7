namespace CableFault.Cables;

/// <summary>Dielectric families with their usual velocity-factor ranges (see <see cref="InsulationClassRanges"/>).</summary>
public enum InsulationClass
{
    /// <summary>Not known.</summary>
    Unknown,
    /// <summary>Solid polyethylene (VF about 0.66).</summary>
    SolidPolyethylene,
    /// <summary>Foamed or gas-injected polyethylene (VF about 0.78–0.88).</summary>
    FoamPolyethylene,
    /// <summary>Solid PTFE (VF about 0.69–0.70).</summary>
    Ptfe,
    /// <summary>Twisted pairs with PVC, PE or FEP insulation, as in data and telephone cable (VF about 0.58–0.72).</summary>
    TwistedPair,
    /// <summary>Cross-linked polyethylene power cable (VF about 0.50–0.60).</summary>
    Xlpe,
}
