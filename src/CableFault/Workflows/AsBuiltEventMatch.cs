using CableFault.Analysis;

namespace CableFault.Workflows;

/// <summary>What the as-built list says about one located event.</summary>
/// <param name="Event">The located event.</param>
/// <param name="Entry">The listed feature it was matched to, or null when it is not on the list (unexpected).</param>
/// <param name="OffsetMeters">Located minus listed distance, m, when matched.</param>
/// <param name="NearbyEntry">For an unexpected event: a listed feature close enough in distance whose kind does not fit
/// (e.g. a splice that now shows as a series resistance), or null.</param>
/// <param name="BeyondFullReflection">For an unexpected event: the open or short found nearer, when the event lies
/// beyond it. Nothing travels past a full reflection, so such an event is an echo of earlier ones, not a place on
/// the cable. Null otherwise.</param>
public sealed record AsBuiltEventMatch(LocatedEvent Event, AsBuiltEntry? Entry, double? OffsetMeters, AsBuiltEntry? NearbyEntry,
    LocatedEvent? BeyondFullReflection = null)
{
    /// <summary>True when the event is a listed feature, found where and as it should be.</summary>
    public bool Expected => Entry is not null;

    /// <summary>True when the event is not listed and lies on the cable (not an echo past an open or short): a finding.</summary>
    public bool Unexpected => Entry is null && BeyondFullReflection is null;
}
