namespace CableFault.Analysis;

/// <summary>
/// A place where the trace changes, before the model fit refines it. Produced by <see cref="EventDetector.Detect"/>.
/// </summary>
/// <param name="RoundTripSeconds">Round-trip time after time zero, in seconds (&gt; 0). Distance = v · t / 2.</param>
/// <param name="ReflectionStep">Change of the reflection coefficient seen at this point (Δρ, dimensionless, −2..+2),
/// corrected for loss and for the multiple reflections of earlier boundaries (from the layer-peeled profile).
/// For a Dip/Bump it is the signed peak excursion.</param>
/// <param name="Shape">Lasting step, transient dip or transient bump.</param>
/// <param name="SignalToNoise">Peak of the smoothed difference over its noise standard deviation (dimensionless).</param>
/// <param name="ImpedanceAfterOhms">Line impedance just after this point from the layer-peeled profile, in ohms,
/// where meaningful (null for transients and for ends).</param>
public sealed record EventCandidate(
    double RoundTripSeconds,
    double ReflectionStep,
    CandidateShape Shape,
    double SignalToNoise,
    double? ImpedanceAfterOhms);
