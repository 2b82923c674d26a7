namespace CableFault.Traces;

/// <summary>
/// A trace read from a file together with the things the reader assumed or repaired on the way (a missing header,
/// a dropped truncated last line, jitter resampled, a repeated metadata key). Each warning is one line that names the
/// source and, where there is one, the line.
/// </summary>
/// <param name="Trace">The trace, on a uniform grid, in seconds and volts (or rho, see metadata <c>unit</c>).</param>
/// <param name="Warnings">What the user may want to know; empty when the file was read as written.</param>
public sealed record TraceReadResult(Trace Trace, IReadOnlyList<string> Warnings);
