using CableFault.Analysis;

namespace CableFault.Workflows;

/// <summary>One event of a run measured from both ends.</summary>
/// <param name="DistanceFromAMeters">Distance from end A, m (0 … L). Both ends: x = L·t_A/(t_A + t_B); one end only:
/// x = L·t_A/T or L·(1 − t_B/T) with T the run's end-to-end round trip.</param>
/// <param name="DistanceSigmaMeters">1-σ of that distance, m, from the fitted time σ's and the length's σ (first-order
/// error propagation); no velocity-factor term.</param>
/// <param name="SeenFrom">Which measurements show it; anything but <see cref="SeenFrom.BothEnds"/> deserves a check.</param>
/// <param name="FromA">The event as located from end A, or null.</param>
/// <param name="FromB">The event as located from end B, or null.</param>
public sealed record BothEndsEvent(double DistanceFromAMeters, double DistanceSigmaMeters, SeenFrom SeenFrom,
    LocatedEvent? FromA, LocatedEvent? FromB);
