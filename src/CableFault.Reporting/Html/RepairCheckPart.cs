using CableFault.Comparison;

namespace CableFault.Reporting.Html;

/// <summary>What the report says about a baseline comparison.</summary>
/// <param name="BaselineName">File name of the baseline trace.</param>
/// <param name="Comparison">The repair check's result, or null when it could not be made.</param>
/// <param name="UnavailableReason">Why no comparison is shown (one sentence), when <paramref name="Comparison"/> is null.</param>
public sealed record RepairCheckPart(string BaselineName, CompareResult? Comparison, string? UnavailableReason = null);
