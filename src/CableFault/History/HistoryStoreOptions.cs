namespace CableFault.History;

/// <summary>How a history database is opened.</summary>
public sealed record HistoryStoreOptions
{
    /// <summary>
    /// How long a write waits for another process's write to finish before giving up with a "busy, try again" message, ms.
    /// Writes are short (one trace), so 10 s covers any honest wait. Range: 0 or more.
    /// </summary>
    public int BusyTimeoutMilliseconds { get; init; } = 10_000;

    /// <summary>Create the database file when it does not exist (false for read-only verbs).</summary>
    public bool CreateIfMissing { get; init; } = true;

    /// <summary>
    /// Called inside the write transaction of <see cref="HistoryStore.Add"/> after the trace row is written and before
    /// the commit. For crash tests only (a hook that pauses so a test can kill the process mid-write).
    /// </summary>
    public Action? InsideWriteTransaction { get; init; }
}
