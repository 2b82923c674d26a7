namespace CableFault.Cables;

/// <summary>
/// Attenuation of a cable as two physical mechanisms plus DC resistance, stored in SI units:
/// conductor (skin-effect) loss α_c = k_c·√f and dielectric loss α_d = k_d·f, both in nepers per metre.
/// </summary>
/// <remarks>
/// Data sheets state attenuation in dB/100 m at a few frequencies; <see cref="FromDatasheet"/> solves
/// A(f) = k_c·√f + k_d·f for the two coefficients. The split into √f and f terms is the standard
/// low-loss line result (Pozar, <i>Microwave Engineering</i>, 4th ed., §2.7: α = R/(2Z₀) + G·Z₀/2,
/// with R ∝ √f from the skin effect and G = ωC·tanδ ∝ f).
/// </remarks>
public sealed record CableLossModel
{
    /// <summary>Nepers per decibel: 1 Np = 20/ln 10 dB ≈ 8.686 dB.</summary>
    public const double NepersPerDecibel = 0.11512925464970229;

    /// <summary>A lossless cable.</summary>
    public static CableLossModel Lossless { get; } = new(0, 0, 0);

    /// <summary>Creates a loss model from SI coefficients.</summary>
    /// <param name="skinLossNepersPerMeterPerRootHertz">k_c in α_c = k_c·√f (Np/m/√Hz), ≥ 0.</param>
    /// <param name="dielectricLossNepersPerMeterPerHertz">k_d in α_d = k_d·f (Np/m/Hz), ≥ 0.</param>
    /// <param name="dcResistanceOhmsPerMeter">Loop (go and return) DC resistance per metre, Ω/m, ≥ 0.</param>
    public CableLossModel(double skinLossNepersPerMeterPerRootHertz, double dielectricLossNepersPerMeterPerHertz,
        double dcResistanceOhmsPerMeter = 0)
    {
        if (!(skinLossNepersPerMeterPerRootHertz >= 0) || !double.IsFinite(skinLossNepersPerMeterPerRootHertz))
            throw new ArgumentOutOfRangeException(nameof(skinLossNepersPerMeterPerRootHertz), "Skin loss must be finite and ≥ 0.");
        if (!(dielectricLossNepersPerMeterPerHertz >= 0) || !double.IsFinite(dielectricLossNepersPerMeterPerHertz))
            throw new ArgumentOutOfRangeException(nameof(dielectricLossNepersPerMeterPerHertz), "Dielectric loss must be finite and ≥ 0.");
        if (!(dcResistanceOhmsPerMeter >= 0) || !double.IsFinite(dcResistanceOhmsPerMeter))
            throw new ArgumentOutOfRangeException(nameof(dcResistanceOhmsPerMeter), "DC resistance must be finite and ≥ 0.");
        SkinLossNepersPerMeterPerRootHertz = skinLossNepersPerMeterPerRootHertz;
        DielectricLossNepersPerMeterPerHertz = dielectricLossNepersPerMeterPerHertz;
        DcResistanceOhmsPerMeter = dcResistanceOhmsPerMeter;
    }

    /// <summary>k_c in α_c = k_c·√f, Np/m/√Hz.</summary>
    public double SkinLossNepersPerMeterPerRootHertz { get; }

    /// <summary>k_d in α_d = k_d·f, Np/m/Hz.</summary>
    public double DielectricLossNepersPerMeterPerHertz { get; }

    /// <summary>Loop DC resistance, Ω/m (matters for long thin pairs; zero for most coax at TDR time scales).</summary>
    public double DcResistanceOhmsPerMeter { get; }

    /// <summary>True when the model has no loss at all.</summary>
    public bool IsLossless => SkinLossNepersPerMeterPerRootHertz == 0 && DielectricLossNepersPerMeterPerHertz == 0 && DcResistanceOhmsPerMeter == 0;

    /// <summary>High-frequency attenuation α(f) = k_c·√f + k_d·f in dB per 100 m (DC resistance not included).</summary>
    public double AttenuationDbPer100m(double frequencyHz) =>
        100.0 * (SkinLossNepersPerMeterPerRootHertz * Math.Sqrt(frequencyHz) + DielectricLossNepersPerMeterPerHertz * frequencyHz)
        / NepersPerDecibel;

    /// <summary>
    /// Builds the model from data-sheet attenuation. With one point all loss is taken as conductor loss
    /// (the dominant term below about 1 GHz for common coax and pairs: common practice). With two points
    /// the 2×2 system A₁ = k_c√f₁ + k_d f₁, A₂ = k_c√f₂ + k_d f₂ is solved; a negative coefficient
    /// (inconsistent data) is clamped to zero and the other refitted from the higher-frequency point.
    /// </summary>
    public static CableLossModel FromDatasheet(double attenuationDbPer100mAtF1, double f1Hz,
        double? attenuationDbPer100mAtF2 = null, double? f2Hz = null, double dcResistanceOhmsPerMeter = 0)
    {
        if (!(f1Hz > 0) || !(attenuationDbPer100mAtF1 >= 0))
            throw new ArgumentOutOfRangeException(nameof(f1Hz), "Attenuation must be ≥ 0 at a frequency > 0.");
        double a1 = attenuationDbPer100mAtF1 * NepersPerDecibel / 100.0;
        if (attenuationDbPer100mAtF2 is null || f2Hz is null)
            return new CableLossModel(a1 / Math.Sqrt(f1Hz), 0, dcResistanceOhmsPerMeter);
        double f2 = f2Hz.Value, a2 = attenuationDbPer100mAtF2.Value * NepersPerDecibel / 100.0;
        if (!(f2 > 0) || !(a2 >= 0) || f2 == f1Hz)
            throw new ArgumentOutOfRangeException(nameof(f2Hz), "The second attenuation point needs its own frequency > 0 and attenuation ≥ 0.");
        double s1 = Math.Sqrt(f1Hz), s2 = Math.Sqrt(f2);
        double det = s1 * f2 - s2 * f1Hz;
        double kc = (a1 * f2 - a2 * f1Hz) / det;
        double kd = (s1 * a2 - s2 * a1) / det;
        double fHigh = Math.Max(f1Hz, f2), aHigh = f2 > f1Hz ? a2 : a1;
        if (kc < 0) { kc = 0; kd = aHigh / fHigh; }
        if (kd < 0) { kd = 0; kc = aHigh / Math.Sqrt(fHigh); }
        return new CableLossModel(kc, kd, dcResistanceOhmsPerMeter);
    }
}
