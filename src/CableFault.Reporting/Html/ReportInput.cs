using CableFault.Analysis;

namespace CableFault.Reporting.Html;

/// <summary>Everything one technician report shows. The renderer reads only this record.</summary>
/// <param name="Job">Header fields: site, run, technician, date, instrument.</param>
/// <param name="TraceName">File name of the measured trace.</param>
/// <param name="Result">What the analysis found.</param>
/// <param name="Settings">The cable settings used and where each came from.</param>
/// <param name="Unit">Distance unit for every figure in the document.</param>
/// <param name="GeneratedAt">When the report was written (passed in, so rendering stays a pure function).</param>
/// <param name="ToolVersion">CableFault version, for the footer.</param>
/// <param name="RepairCheck">The repair-check section's content, or null when no baseline was given.</param>
/// <param name="History">Earlier measurements of the run from the history database, or null when none was asked for.</param>
/// <param name="AsBuilt">The events held against the run's as-built list (made from <paramref name="Result"/>'s events), or
/// null when no list was given.</param>
/// <param name="AsBuiltName">File name of the as-built list, for the document.</param>
public sealed record ReportInput(
    JobSheet Job,
    string TraceName,
    LocateResult Result,
    CableSettings Settings,
    DistanceUnit Unit,
    DateTimeOffset GeneratedAt,
    string ToolVersion,
    RepairCheckPart? RepairCheck = null,
    IReadOnlyList<PastCheck>? History = null,
    Workflows.AsBuiltMatch? AsBuilt = null,
    string? AsBuiltName = null);
