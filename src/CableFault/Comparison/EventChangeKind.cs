namespace CableFault.Comparison;

/// <summary>What happened to an event between the baseline and the current trace.</summary>
public enum EventChangeKind
{
    /// <summary>On both, within the distance and reflection tolerances.</summary>
    Unchanged,
    /// <summary>On both, but shifted by more than the distance tolerance.</summary>
    Moved,
    /// <summary>On both, at the same place, but its reflection (or lumped value) changed beyond the tolerance.</summary>
    Changed,
    /// <summary>Only on the current trace.</summary>
    New,
    /// <summary>Only on the baseline.</summary>
    Gone,
}
