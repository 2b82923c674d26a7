namespace CableFault.Workflows;

/// <summary>The known features of one run with their recorded distances (read by <see cref="AsBuiltJson"/>).</summary>
/// <param name="Entries">The features, nearest first.</param>
/// <param name="RunId">The run the list belongs to, or null.</param>
/// <param name="Notes">Free notes, or null.</param>
public sealed record AsBuiltList(IReadOnlyList<AsBuiltEntry> Entries, string? RunId = null, string? Notes = null)
{
    /// <summary>
    /// Tolerance of a recorded distance when the list gives none, m: 0.5 m. Installed positions of joints and taps are
    /// usually recorded from drum marks or a tape along the route, to about half a metre, and the slack left in pits and
    /// at bends is of that order too (common practice). Read as a 95 % bound (about 2 σ).
    /// </summary>
    public const double DefaultToleranceMeters = 0.5;
}
