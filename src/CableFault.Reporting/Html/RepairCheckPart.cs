namespace CableFault.Reporting.Html;

/// <summary>What the report says about a baseline comparison.</summary>
/// <param name="BaselineName">File name of the baseline trace.</param>
/// <param name="UnavailableReason">Why no comparison is shown (one sentence).</param>
public sealed record RepairCheckPart(string BaselineName, string? UnavailableReason);
