namespace CableFault.Analysis;

/// <summary>One event found on the run.</summary>
/// <param name="DistanceMeters">One-way distance from the reference plane, m: d = v·t/2, v = VF·c (DESIGN.md §2).</param>
/// <param name="DistanceSigmaMeters">One standard deviation of the distance, m:
/// √((v·σ_t/2)² + (d·σ_VF/VF)²), the fit's time uncertainty and the VF uncertainty in quadrature.</param>
/// <param name="Kind">What the event is (<see cref="EventKind.Unknown"/> when the evidence is weak).</param>
/// <param name="Reflection">Reflection coefficient of the event, dimensionless, −1…+1: the local ρ of a boundary, end,
/// shunt/series resistor or tap; for a capacitive or inductive spot the peak of its signature over the incident level
/// (which depends on the rise time).</param>
/// <param name="ImpedanceOhms">Line impedance after a boundary, Ω; null for other kinds.</param>
/// <param name="Value">Lumped size in SI: F (capacitive), H (inductive), Ω (partial short, series resistance,
/// termination); null otherwise.</param>
/// <param name="Confidence">How sure the event is real and of this kind, 0…1.</param>
/// <param name="RoundTripSeconds">Round-trip time from the reference plane, s.</param>
public sealed record LocatedEvent(double DistanceMeters, double DistanceSigmaMeters, EventKind Kind,
    double Reflection, double? ImpedanceOhms, double? Value, double Confidence, double RoundTripSeconds);
