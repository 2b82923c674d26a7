namespace CableFault.Workflows;

/// <summary>A located run held against its as-built list (made by <see cref="AsBuiltMatcher"/>).</summary>
/// <param name="Events">One entry per located event, in the order the events were given.</param>
/// <param name="Missing">Listed features no event matched, nearest first.</param>
/// <param name="List">The list used.</param>
public sealed record AsBuiltMatch(IReadOnlyList<AsBuiltEventMatch> Events, IReadOnlyList<AsBuiltMissing> Missing, AsBuiltList List)
{
    /// <summary>Events on the cable that are not on the list: these are the ones to look at.</summary>
    public IReadOnlyList<AsBuiltEventMatch> Unexpected => Events.Where(e => e.Unexpected).ToList();

    /// <summary>Unlisted events beyond an open or short: echoes of earlier events, not places on the cable.</summary>
    public IReadOnlyList<AsBuiltEventMatch> Echoes => Events.Where(e => !e.Expected && e.BeyondFullReflection is not null).ToList();

    /// <summary>How many listed features were found as expected.</summary>
    public int ExpectedCount => Events.Count(e => e.Expected);
}
