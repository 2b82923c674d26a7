using CableFault.Analysis;

namespace CableFault.Workflows;

/// <summary>The velocity factor worked out from an event at a known distance (<see cref="KnownEventCalibration"/>).</summary>
/// <param name="Event">The located event taken as the known one.</param>
/// <param name="VelocityFactor">VF = 2·D/(c·t_event), dimensionless, (0, 1].</param>
/// <param name="VelocityFactorRelativeSigma">1-σ relative uncertainty δVF/VF = √((δt/t)² + (δD/D)²).</param>
/// <param name="KnownMeters">The known distance D, m.</param>
/// <param name="KnownSigmaMeters">Its 1-σ uncertainty, m.</param>
/// <param name="SearchVelocityFactor">The VF under which the event was searched for (the one the trace was located with).</param>
public sealed record KnownEventCalibrationResult(LocatedEvent Event, double VelocityFactor, double VelocityFactorRelativeSigma,
    double KnownMeters, double KnownSigmaMeters, double SearchVelocityFactor)
{
    /// <summary>1-σ uncertainty of the VF, absolute.</summary>
    public double VelocityFactorSigma => VelocityFactor * VelocityFactorRelativeSigma;
}
