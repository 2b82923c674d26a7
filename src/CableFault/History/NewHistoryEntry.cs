using CableFault.Traces;

namespace CableFault.History;

/// <summary>Everything stored for one trace. The caller computes the settings and locate JSON; the store adds the hash.</summary>
public sealed record NewHistoryEntry
{
    /// <summary>The run (cable installation) the trace belongs to, e.g. "mast-feeder". Not empty.</summary>
    public required string RunId { get; init; }

    /// <summary>The file name the trace came from (no folder), shown in listings and used by export.</summary>
    public required string FileName { get; init; }

    /// <summary>The original file, byte for byte; export gives it back unchanged and its SHA-256 detects re-imports.</summary>
    public required byte[] OriginalBytes { get; init; }

    /// <summary>The trace as read (samples, timing, metadata).</summary>
    public required Trace Trace { get; init; }

    /// <summary>The cable settings the trace was read with, as JSON.</summary>
    public required string SettingsJson { get; init; }

    /// <summary>The locate result as its JSON (DESIGN.md §4), or null when it was not computed.</summary>
    public string? LocateJson { get; init; }

    /// <summary>A free-text note, or null.</summary>
    public string? Note { get; init; }

    /// <summary>When the trace was stored (UTC).</summary>
    public required DateTimeOffset AddedUtc { get; init; }

    /// <summary>Record or check.</summary>
    public HistoryPurpose Purpose { get; init; } = HistoryPurpose.Record;

    /// <summary>True to make this trace the run's current baseline (earlier baselines stay on record).</summary>
    public bool MakeBaseline { get; init; }

    /// <summary>For a check: true for pass, false for fail; null for a record.</summary>
    public bool? Passed { get; init; }

    /// <summary>For a check: the id of the baseline it was compared against.</summary>
    public long? CheckedAgainstId { get; init; }

    /// <summary>For a check: the verdict and reasons as JSON.</summary>
    public string? CheckJson { get; init; }
}
