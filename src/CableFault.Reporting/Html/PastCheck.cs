namespace CableFault.Reporting.Html;

/// <summary>One earlier measurement of the run from the history database, for the report's history table.</summary>
/// <param name="Id">History entry number.</param>
/// <param name="AddedUtc">When it was stored.</param>
/// <param name="FileName">The trace file's name.</param>
/// <param name="Role">"baseline (current)", "baseline (earlier)", "record" or "check".</param>
/// <param name="Passed">The repair-check verdict for checks; null otherwise.</param>
/// <param name="Note">The technician's note, if any.</param>
public sealed record PastCheck(long Id, DateTimeOffset AddedUtc, string FileName, string Role, bool? Passed, string? Note);
