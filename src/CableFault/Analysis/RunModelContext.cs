using CableFault.Cables;

namespace CableFault.Analysis;

/// <summary>What the run model takes as known: the cable and instrument settings and the scales used to make the
/// fit's parameters dimensionless.</summary>
/// <param name="VelocityFactor">VF of every segment (distance and delay are one-to-one through it).</param>
/// <param name="ImpedanceOhms">Z₀ of the first segment, Ω: every later impedance is relative to it.</param>
/// <param name="SourceImpedanceOhms">Instrument source impedance Z_s, Ω.</param>
/// <param name="Loss">Cable loss model, null for lossless.</param>
/// <param name="ReferenceRiseSeconds">Scale of time parameters (the measured rise), s.</param>
/// <param name="ReferenceAmplitudeVolts">Scale of the amplitude parameter (the measured incident step), V.</param>
/// <param name="EstimateLoss">True when the loss was not given: <see cref="Loss"/> is then an estimate, and its two
/// coefficients are parameters of the run model (see <see cref="RunModel.ToVector"/>).</param>
/// <param name="SettlingFraction">Part of the instrument's step that settles slowly after its edge (see
/// <see cref="Simulation.InstrumentSettings.SettlingFraction"/>); 0 for an edge that settles at once.</param>
/// <param name="SettlingSeconds">Time constant of that settling, s.</param>
/// <param name="EstimateSettling">True while the settling's two numbers are parameters of the run model (the probe of
/// <see cref="SettlingEstimation"/>).</param>
/// <param name="ResistiveEnd">True when a run that ends in neither an open, a short nor a tap ends in a resistor of the
/// last line impedance (a termination or a device), false when the last line goes on matched beyond the record. The
/// two differ only on a lossy cable: its characteristic impedance Z_c(s) = √((R′ + sL′)/(G′ + sC′)) departs from the
/// nominal one at low frequencies, so a resistor there reflects slowly where a continuing line does not.</param>
internal sealed record RunModelContext(double VelocityFactor, double ImpedanceOhms, double SourceImpedanceOhms,
    CableLossModel? Loss, double ReferenceRiseSeconds, double ReferenceAmplitudeVolts, bool EstimateLoss = false,
    double SettlingFraction = 0, double SettlingSeconds = 0, bool EstimateSettling = false, bool ResistiveEnd = false)
{
    /// <summary>Scale of an estimated settling fraction: 1 % of the step (common practice for a step generator's creep;
    /// from memory).</summary>
    internal const double SettlingFractionScale = 0.01;

    /// <summary>Scale of the estimated skin-effect coefficient: 10 dB/100 m at 100 MHz (a mid-size coax; common practice),
    /// in Np/m/√Hz.</summary>
    internal const double SkinLossScale = 10.0 / 100 * CableLossModel.NepersPerDecibel / 1e4;

    /// <summary>Scale of the estimated loop DC resistance: 0.05 Ω/m (a thin coax or pair; from memory).</summary>
    internal const double DcResistanceScale = 0.05;

    /// <summary>Largest estimated coefficient, in units of its scale (100 dB/100 m at 100 MHz; 0.5 Ω/m): above any cable a
    /// step reflectometer is used on, so that a misfit of another kind is not taken for an absurd loss.</summary>
    internal const double MaximumLossScales = 10;

    /// <summary>Where the estimate starts: a fifth of each scale (2 dB/100 m at 100 MHz and 0.01 Ω/m), small enough for a
    /// lossless run and large enough that the fit's derivatives with respect to both are not zero.</summary>
    internal static CableLossModel EstimateStart { get; } = new(0.2 * SkinLossScale, 0, 0.2 * DcResistanceScale);

    /// <summary>Propagation speed v = VF·c, m/s.</summary>
    internal double VelocityMetersPerSecond => VelocityFactor * PhysicalConstants.SpeedOfLightMetersPerSecond;

    /// <summary>A medium of impedance <paramref name="impedanceOhms"/> with the run's VF and loss.</summary>
    internal CableMedium Medium(double impedanceOhms) => new(impedanceOhms, VelocityFactor, Loss);
}
