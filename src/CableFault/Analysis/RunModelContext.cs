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
internal sealed record RunModelContext(double VelocityFactor, double ImpedanceOhms, double SourceImpedanceOhms,
    CableLossModel? Loss, double ReferenceRiseSeconds, double ReferenceAmplitudeVolts)
{
    /// <summary>Propagation speed v = VF·c, m/s.</summary>
    internal double VelocityMetersPerSecond => VelocityFactor * PhysicalConstants.SpeedOfLightMetersPerSecond;

    /// <summary>A medium of impedance <paramref name="impedanceOhms"/> with the run's VF and loss.</summary>
    internal CableMedium Medium(double impedanceOhms) => new(impedanceOhms, VelocityFactor, Loss);
}
