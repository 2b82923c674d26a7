namespace CableFault.Cables;

/// <summary>
/// Generic cable types by open designation with nominal values. These are typical values, not any one maker's
/// product: Z₀ and VF are the nominal values that military-style designations and the common construction imply
/// (common practice); attenuation figures are typical data-sheet values recalled from memory and rounded.
/// Always prefer the data sheet of the cable actually installed, or calibrate the VF on a known length.
/// </summary>
public static class BuiltInCableTypes
{
    private static CableType Coax(string name, string description, double z, double vf, InsulationClass insulation,
        double dbAt100MHz, double dbAt1GHz, string source) =>
        new(name, description, z, vf, CableLossModel.FromDatasheet(dbAt100MHz, 100e6, dbAt1GHz, 1e9), insulation, source);

    /// <summary>Every built-in type, in listing order.</summary>
    public static IReadOnlyList<CableType> All { get; } =
    [
        // Solid-PE dielectric gives VF = 1/√2.25 ≈ 0.66 (ε_r of polyethylene ≈ 2.25–2.3: common practice).
        Coax("RG-58", "50 Ω coax, solid PE, ~5 mm", 50, 0.66, InsulationClass.SolidPolyethylene, 16.0, 60.0,
            "Z0/VF nominal for the designation (common practice); loss typical data-sheet values, from memory"),
        Coax("RG-174", "50 Ω miniature coax, solid PE, ~2.8 mm", 50, 0.66, InsulationClass.SolidPolyethylene, 29.0, 100.0,
            "Z0/VF nominal (common practice); loss typical, from memory"),
        Coax("RG-213", "50 Ω coax, solid PE, ~10 mm", 50, 0.66, InsulationClass.SolidPolyethylene, 7.0, 26.0,
            "Z0/VF nominal (common practice); loss typical, from memory"),
        Coax("RG-8X", "50 Ω coax, foam PE, ~6 mm", 50, 0.78, InsulationClass.FoamPolyethylene, 11.0, 40.0,
            "Z0 nominal; VF of foamed PE 0.78–0.82 (common practice); loss typical, from memory"),
        Coax("RG-59", "75 Ω coax, solid PE, ~6 mm", 75, 0.66, InsulationClass.SolidPolyethylene, 11.0, 39.0,
            "Z0/VF nominal (common practice); loss typical, from memory"),
        Coax("RG-6", "75 Ω coax, foam PE, ~7 mm (antenna and video drops)", 75, 0.85, InsulationClass.FoamPolyethylene, 6.6, 21.0,
            "Z0 nominal; VF of gas-injected foam PE ≈ 0.82–0.87 (common practice); loss typical, from memory"),
        Coax("RG-11", "75 Ω coax, foam PE, ~10 mm (trunk runs)", 75, 0.84, InsulationClass.FoamPolyethylene, 4.3, 14.0,
            "Z0/VF nominal (common practice); loss typical, from memory"),
        Coax("RG-316", "50 Ω miniature coax, PTFE", 50, 0.695, InsulationClass.Ptfe, 27.0, 90.0,
            "VF of solid PTFE = 1/√2.07 ≈ 0.695 (ε_r of PTFE ≈ 2.1: common practice); loss typical, from memory"),
        new("CAT5E", "100 Ω balanced pair, category 5e data cable", 100, 0.68,
            CableLossModel.FromDatasheet(6.5, 10e6, 22.0, 100e6), InsulationClass.TwistedPair,
            "Z0 = 100 Ω nominal and 100 MHz insertion-loss limit about 22 dB/100 m (ANSI/TIA-568 category 5e, from memory); VF 0.64–0.72 typical (common practice)"),
        new("CAT6", "100 Ω balanced pair, category 6 data cable", 100, 0.68,
            CableLossModel.FromDatasheet(6.0, 10e6, 19.8, 100e6), InsulationClass.TwistedPair,
            "Z0 = 100 Ω nominal and 100 MHz insertion-loss limit about 19.8 dB/100 m (ANSI/TIA-568 category 6, from memory); VF typical (common practice)"),
        new("TEL-0.5", "telephone pair, 0.5 mm (24 AWG) PE-insulated copper", 110, 0.67,
            CableLossModel.FromDatasheet(1.6, 1e6, 5.5, 10e6, dcResistanceOhmsPerMeter: 0.17), InsulationClass.TwistedPair,
            "Z0 ≈ 100–120 Ω at high frequency and loop resistance ≈ 170 Ω/km for 0.5 mm copper (from memory); loss typical, from memory"),
        new("TEL-0.4", "telephone pair, 0.4 mm (26 AWG) PE-insulated copper", 120, 0.66,
            CableLossModel.FromDatasheet(2.1, 1e6, 7.0, 10e6, dcResistanceOhmsPerMeter: 0.27), InsulationClass.TwistedPair,
            "Z0 and loop resistance ≈ 270 Ω/km for 0.4 mm copper (from memory); loss typical, from memory"),
        new("XLPE-MV", "medium-voltage single-core power cable, XLPE insulation, screen as return", 30, 0.56,
            CableLossModel.FromDatasheet(1.0, 10e6, 3.5, 100e6), InsulationClass.Xlpe,
            "Z0 20–40 Ω and VF 0.50–0.60 typical of XLPE power cable (common practice); loss rough, from memory"),
    ];
}
