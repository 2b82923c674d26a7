using CableFault.Analysis;

namespace CableFault.Comparison;

/// <summary>One event of the event-level comparison.</summary>
/// <param name="Kind">What happened to it.</param>
/// <param name="Baseline">The event on the baseline, or null when it is new.</param>
/// <param name="Current">The event on the current trace, or null when it is gone.</param>
/// <param name="ExceedsTolerance">True when this change fails the check.</param>
/// <param name="Description">One readable sentence (distances in metres).</param>
/// <param name="PeakDifference">Largest trace difference (current − baseline, in units of the incident step, signed)
/// within a rise time of the event: the size of a new or gone event as the instrument saw it, independent of the
/// model fit.</param>
public sealed record EventChange(EventChangeKind Kind, LocatedEvent? Baseline, LocatedEvent? Current, bool ExceedsTolerance,
    string Description, double PeakDifference)
{
    /// <summary>Where the event is now (or was, when gone), m from the reference plane.</summary>
    public double DistanceMeters => (Current ?? Baseline)!.DistanceMeters;

    /// <summary>Current minus baseline distance, m; null unless the event is on both.</summary>
    public double? ShiftMeters => Baseline is not null && Current is not null ? Current.DistanceMeters - Baseline.DistanceMeters : null;

    /// <summary>Current minus baseline reflection (dimensionless); for a new event its reflection, for a gone one minus
    /// its reflection (the trace lost it).</summary>
    public double ReflectionChange => (Current?.Reflection ?? 0) - (Baseline?.Reflection ?? 0);
}
