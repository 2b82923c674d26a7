using System.Numerics;

namespace CableFault.Cables;

/// <summary>
/// A transmission-line medium described by its per-unit-length series impedance Z′(s) and shunt admittance Y′(s),
/// evaluated at a complex frequency s = σ + jω so that the forward model can use a damped (Laplace) contour.
/// Everything else — γ(s) = √(Z′Y′) with Re γ ≥ 0 meaning attenuation, Z_c(s) = √(Z′/Y′) — follows from these two.
/// </summary>
/// <remarks>
/// Telegrapher's equations (Pozar, <i>Microwave Engineering</i>, 4th ed., §2.1). Each loss term is a function of s
/// that is analytic in the right half-plane, so the impulse response is causal:
/// <list type="bullet">
/// <item>Conductor (skin effect): R(f)(1 + j) with R = 2Z₀k_c√f. At s = jω, (1 + j)√f = √(s/π), so Z′_skin = 2Z₀k_c√(s/π)
/// (its imaginary part is the internal inductance; Johnson &amp; Graham, <i>High-Speed Signal Propagation</i>, 2003, §3.6).</item>
/// <item>Dielectric: constant loss tangent tanδ = k_d·v/π (from α_d = G·Z₀/2 = k_d·f and G = ωC·tanδ). The causal constant-Q form
/// Y′ = sC·(s/ω_ref)^(−n) with tan(nπ/2) = tanδ satisfies Kramers–Kronig by construction.</item>
/// <item>DC resistance adds to Z′ as a constant.</item>
/// </list>
/// </remarks>
public sealed class CableMedium
{
    /// <summary>Frequency at which the nominal Z₀ and VF hold exactly for a lossy dielectric, Hz.</summary>
    public const double DielectricReferenceFrequencyHz = 100e6;

    /// <summary>Creates a medium from nominal values.</summary>
    /// <param name="impedanceOhms">Nominal Z₀, Ω (&gt; 0).</param>
    /// <param name="velocityFactor">VF in (0, 1].</param>
    /// <param name="loss">Loss model; null means lossless.</param>
    public CableMedium(double impedanceOhms, double velocityFactor, CableLossModel? loss = null)
    {
        if (!(impedanceOhms > 0) || !double.IsFinite(impedanceOhms))
            throw new ArgumentOutOfRangeException(nameof(impedanceOhms), "Z0 must be a positive number of ohms.");
        if (!(velocityFactor > 0 && velocityFactor <= 1))
            throw new ArgumentOutOfRangeException(nameof(velocityFactor), "VF must be in (0, 1].");
        ImpedanceOhms = impedanceOhms;
        VelocityFactor = velocityFactor;
        Loss = loss ?? CableLossModel.Lossless;
        double v = VelocityMetersPerSecond;
        InductanceHenriesPerMeter = impedanceOhms / v;
        CapacitanceFaradsPerMeter = 1.0 / (impedanceOhms * v);
        double tanDelta = Loss.DielectricLossNepersPerMeterPerHertz * v / Math.PI;
        DielectricExponent = 2.0 / Math.PI * Math.Atan(tanDelta);
        SkinCoefficient = 2.0 * impedanceOhms * Loss.SkinLossNepersPerMeterPerRootHertz / Math.Sqrt(Math.PI);
    }

    /// <summary>Nominal characteristic impedance Z₀, Ω.</summary>
    public double ImpedanceOhms { get; }

    /// <summary>Velocity factor v/c.</summary>
    public double VelocityFactor { get; }

    /// <summary>Loss model.</summary>
    public CableLossModel Loss { get; }

    /// <summary>Propagation speed v = VF·c, m/s.</summary>
    public double VelocityMetersPerSecond => VelocityFactor * PhysicalConstants.SpeedOfLightMetersPerSecond;

    /// <summary>External inductance L = Z₀/v, H/m.</summary>
    public double InductanceHenriesPerMeter { get; }

    /// <summary>Capacitance C = 1/(Z₀·v), F/m.</summary>
    public double CapacitanceFaradsPerMeter { get; }

    /// <summary>True when the medium has no loss; the forward model then uses the exact delay form.</summary>
    public bool IsLossless => Loss.IsLossless;

    internal double DielectricExponent { get; }

    internal double SkinCoefficient { get; }

    /// <summary>Series impedance per metre Z′(s), Ω/m.</summary>
    public Complex SeriesImpedanceOhmsPerMeter(Complex s) => SeriesImpedanceOhmsPerMeter(s, SkinCoefficient > 0 ? Complex.Sqrt(s) : 0);

    /// <summary>Z′(s) given √s (unread when the skin term is zero): the same operations, with the root every medium on a
    /// frequency grid shares computed once.</summary>
    internal Complex SeriesImpedanceOhmsPerMeter(Complex s, Complex rootS)
    {
        Complex z = s * InductanceHenriesPerMeter + Loss.DcResistanceOhmsPerMeter;
        if (SkinCoefficient > 0) z += SkinCoefficient * rootS;
        return z;
    }

    /// <summary>The dielectric factor (s/(2π·f_ref))^(−n) that multiplies sC in <see cref="ShuntAdmittanceSiemensPerMeter(Complex)"/>
    /// for exponent n (1 when there is no dielectric loss or s = 0).</summary>
    internal static Complex DielectricFactor(Complex s, double exponent) =>
        exponent > 0 && s != Complex.Zero ? Complex.Pow(s / (2 * Math.PI * DielectricReferenceFrequencyHz), -exponent) : Complex.One;

    /// <summary>Shunt admittance per metre Y′(s), S/m.</summary>
    public Complex ShuntAdmittanceSiemensPerMeter(Complex s) => ShuntAdmittanceSiemensPerMeter(s, DielectricFactor(s, DielectricExponent));

    /// <summary>Y′(s) given <see cref="DielectricFactor"/> for this medium's exponent (shared by every medium with it).</summary>
    internal Complex ShuntAdmittanceSiemensPerMeter(Complex s, Complex dielectricFactor)
    {
        Complex y = s * CapacitanceFaradsPerMeter;
        if (DielectricExponent > 0 && s != Complex.Zero) y *= dielectricFactor;
        return y;
    }

    /// <summary>Propagation constant γ(jω) = α + jβ at a real frequency, 1/m (α in Np/m, β in rad/m).</summary>
    public Complex PropagationConstantPerMeter(double frequencyHz)
    {
        var s = new Complex(0, 2 * Math.PI * frequencyHz);
        return Complex.Sqrt(SeriesImpedanceOhmsPerMeter(s) * ShuntAdmittanceSiemensPerMeter(s));
    }

    /// <summary>Characteristic impedance Z_c(jω) = √(Z′/Y′) at a real frequency f &gt; 0, Ω.</summary>
    public Complex CharacteristicImpedanceOhms(double frequencyHz)
    {
        var s = new Complex(0, 2 * Math.PI * frequencyHz);
        return Complex.Sqrt(SeriesImpedanceOhmsPerMeter(s) / ShuntAdmittanceSiemensPerMeter(s));
    }
}
