namespace CableFault.History;

/// <summary>One stored trace as listed: everything but the bulky parts (file bytes, samples, JSON documents).</summary>
/// <param name="Id">Row id, the number users give to show and export.</param>
/// <param name="RunId">The run the trace belongs to.</param>
/// <param name="AddedUtc">When it was stored (UTC).</param>
/// <param name="Purpose">Record or check.</param>
/// <param name="FileName">The original file name.</param>
/// <param name="Sha256">SHA-256 of the original file, lower-case hex.</param>
/// <param name="SampleCount">Samples in the trace.</param>
/// <param name="Note">The note, or null.</param>
/// <param name="Passed">For a check: the verdict; null for a record.</param>
/// <param name="CheckedAgainstId">For a check: the baseline's id.</param>
/// <param name="IsCurrentBaseline">True when this is the run's current baseline.</param>
/// <param name="WasBaseline">True when this trace has ever been made the run's baseline.</param>
public sealed record HistoryEntry(
    long Id, string RunId, DateTimeOffset AddedUtc, HistoryPurpose Purpose, string FileName, string Sha256, int SampleCount,
    string? Note, bool? Passed, long? CheckedAgainstId, bool IsCurrentBaseline, bool WasBaseline);
