using CableFault.Analysis;

namespace CableFault.Workflows;

/// <summary>A listed feature that no located event matched, and the likeliest reason.</summary>
/// <param name="Entry">The listed feature.</param>
/// <param name="Reason">Why it was not matched.</param>
/// <param name="Explanation">One plain sentence for people (distances in metres).</param>
/// <param name="NearbyEvent">An event at about the right distance but of a kind the feature does not show as, or null.</param>
public sealed record AsBuiltMissing(AsBuiltEntry Entry, AsBuiltMissReason Reason, string Explanation, LocatedEvent? NearbyEvent);

/// <summary>Why a listed feature was not found.</summary>
public enum AsBuiltMissReason
{
    /// <summary>Nothing was located within its tolerance: the feature is gone, moved, or too small to see.</summary>
    NotSeen,
    /// <summary>An event lies there, but of a kind the feature does not show as (a joint gone resistive, ...).</summary>
    KindDiffers,
    /// <summary>Past the end of the record: the trace stops before the feature.</summary>
    BeyondRecord,
    /// <summary>Past an open or short found nearer: nothing of the cable can be seen beyond it.</summary>
    BeyondFullReflection,
}
