namespace CableFault.History;

/// <summary>What <see cref="HistoryStore.Add"/> did.</summary>
/// <param name="Id">The id of the stored trace (the existing one for a re-import).</param>
/// <param name="AlreadyStored">True when the same file (same SHA-256) was already stored for this run: nothing new was added.</param>
/// <param name="BaselineSet">True when the trace became the run's current baseline in this call.</param>
/// <param name="SameFileInOtherRuns">Ids of the same file stored under other runs (probably a mix-up worth a warning).</param>
public sealed record HistoryAddResult(long Id, bool AlreadyStored, bool BaselineSet, IReadOnlyList<long> SameFileInOtherRuns);
