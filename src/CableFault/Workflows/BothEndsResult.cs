namespace CableFault.Workflows;

/// <summary>The faults of a run from two traces taken at its two ends.</summary>
/// <param name="LengthMeters">Physical length of the run as given, m.</param>
/// <param name="Events">Events in order of distance from end A; the run's own ends are not listed.</param>
/// <param name="EndToEndRoundTripSeconds">T, the round trip over the whole run, s: the inverse-variance mean of
/// t_A + t_B over the matched events (and of the two far-end times when both were seen).</param>
/// <param name="EndToEndRoundTripSigmaSeconds">1-σ of T, s.</param>
/// <param name="ImpliedVelocityFactor">VF = 2L/(c·T): the far end is reached after a round trip T = 2L/v from either end.</param>
/// <param name="ImpliedVelocityFactorSigma">1-σ of that VF: VF·√((σ_T/T)² + (σ_L/L)²).</param>
/// <param name="Warnings">Things the user should know (one-sided events, ambiguities).</param>
public sealed record BothEndsResult(double LengthMeters, IReadOnlyList<BothEndsEvent> Events,
    double EndToEndRoundTripSeconds, double EndToEndRoundTripSigmaSeconds,
    double ImpliedVelocityFactor, double ImpliedVelocityFactorSigma, IReadOnlyList<string> Warnings);
