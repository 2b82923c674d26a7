namespace CableFault.Comparison;

/// <summary>
/// How the current run differs from its reference as a whole, beyond single events: its electrical length and its
/// impedance. For a reference pair these are the ordinary pair-to-pair spread of one cable, reported rather than failed
/// within the tolerances.
/// </summary>
/// <param name="LengthScale">Round-trip time scale s of the current trace against the reference, dimensionless: an event
/// at time t on the reference appears at s·t on the current run. The current trace was stretched by 1/s before the
/// sample comparison when <see cref="LengthFitted"/>; 1 otherwise.</param>
/// <param name="LengthFitted">True when s was fitted from a common far event.</param>
/// <param name="LengthFitDistanceMeters">Reference distance of the event s was fitted on (normally the far end), m, or
/// null when none was fitted.</param>
/// <param name="ReferenceImpedanceOhms">Z₀ the reference is taken to have (the cable setting), Ω.</param>
/// <param name="CurrentImpedanceOhms">Z₀ of the current run estimated from the ratio of the two incident steps, Ω
/// (<see cref="PairImpedance.Estimate"/>), or null when it could not be estimated.</param>
public sealed record PairSpread(double LengthScale, bool LengthFitted, double? LengthFitDistanceMeters,
    double ReferenceImpedanceOhms, double? CurrentImpedanceOhms)
{
    /// <summary>Relative electrical-length difference s − 1, dimensionless (+0.015 = the current run is 1.5 % longer
    /// electrically), or null when not fitted.</summary>
    public double? LengthDifferenceFraction => LengthFitted ? LengthScale - 1 : null;

    /// <summary>Current minus reference Z₀, Ω, or null.</summary>
    public double? ImpedanceOffsetOhms => CurrentImpedanceOhms - ReferenceImpedanceOhms;

    /// <summary>(Z_current − Z_reference)/Z_reference, dimensionless, or null.</summary>
    public double? ImpedanceOffsetFraction => ImpedanceOffsetOhms / ReferenceImpedanceOhms;

    /// <summary>No stretch and no impedance estimate.</summary>
    public static PairSpread None(double referenceImpedanceOhms) => new(1, false, null, referenceImpedanceOhms, null);
}
