using System.Globalization;
using System.Text;
using CableFault.Reporting.Plots;

namespace CableFault.Reporting.Html;

/// <summary>
/// Renders a technician report: one self-contained HTML document (styles inline, figure embedded as an SVG data URI,
/// no scripts, no fetches). A pure function: the same input gives the same text. Every piece of user text is escaped.
/// </summary>
public static class HtmlReport
{
    /// <summary>The HTML document for <paramref name="input"/>.</summary>
    public static string Render(ReportInput input)
    {
        ArgumentNullException.ThrowIfNull(input);
        var findings = FindingWords.Rank(input.Result.Events, input.Job.ExpectedLengthMeters, input.AsBuilt);
        var html = new StringBuilder(64 * 1024);
        string runId = string.IsNullOrWhiteSpace(input.Job.RunId) ? "Cable run" : input.Job.RunId!;
        html.Append("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n")
            .Append("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n")
            .Append("<meta name=\"generator\" content=\"CableFault ").Append(HtmlText.Escape(input.ToolVersion)).Append("\">\n")
            .Append("<title>").Append(HtmlText.Escape(runId)).Append(" — cable run report</title>\n")
            .Append("<style>").Append(ReportStyleSheet.Css).Append("</style>\n</head>\n<body>\n");

        Masthead(html, input, runId);
        Summary(html, input, findings);
        int section = 1;
        ReportSections.Events(html, section++, input, findings);
        FigureSection(html, section++, input, findings);
        if (input.RepairCheck is { } repair) ReportSections.RepairCheck(html, section++, repair, input.Unit);
        if (input.History is { Count: > 0 } history) ReportSections.History(html, section++, history);
        ReportSections.Settings(html, section++, input);
        ReportSections.Notes(html, section++, input);
        ReportSections.Safety(html, section++);

        html.Append("<footer><p>Written by CableFault ").Append(HtmlText.Escape(input.ToolVersion)).Append(" on ")
            .Append(input.GeneratedAt.ToString("yyyy-MM-dd HH:mm 'UTC'zzz", CultureInfo.InvariantCulture))
            .Append(" from <span class=\"file\">").Append(HtmlText.Escape(input.TraceName)).Append("</span>. ")
            .Append("Distances are one-way along the cable from the instrument connector, in ")
            .Append(input.Unit.Symbol == "ft" ? "feet (ft)" : "metres (m)").Append(".</p></footer>\n</body>\n</html>\n");
        return html.ToString();
    }

    private static void Masthead(StringBuilder html, ReportInput input, string runId)
    {
        var job = input.Job;
        html.Append("<header class=\"masthead\">\n<p class=\"kicker\">Cable run report</p>\n<h1>")
            .Append(HtmlText.Escape(runId)).Append("</h1>\n<dl class=\"job\">\n");
        Field(html, "Site", job.Site);
        Field(html, "Cable run ID", job.RunId);
        Field(html, "Cable type", job.CableType ?? input.Settings.Cable?.Designation);
        Field(html, "Technician", job.Technician);
        Field(html, "Measured", job.MeasuredAt);
        if (job.Customer is not null) Field(html, "Customer", job.Customer);
        if (job.WorkOrder is not null) Field(html, "Work order", job.WorkOrder);
        if (job.ExpectedLengthMeters is double length) Field(html, "Recorded run length", input.Unit.Format(length, 1));
        foreach (var pair in job.Instrument ?? []) Field(html, pair.Key, pair.Value);
        Field(html, "Trace file", input.TraceName);
        html.Append("</dl>\n");
        if (!string.IsNullOrWhiteSpace(job.Notes))
            html.Append("<p class=\"note\"><strong>Notes:</strong> ").Append(HtmlText.Escape(job.Notes)).Append("</p>\n");
        html.Append("</header>\n");
    }

    private static void Field(StringBuilder html, string label, string? value)
    {
        html.Append("<div><dt>").Append(HtmlText.Escape(label)).Append("</dt><dd>");
        if (string.IsNullOrWhiteSpace(value)) html.Append("<span class=\"missing\">not recorded</span>");
        else html.Append(HtmlText.Escape(value));
        html.Append("</dd></div>\n");
    }

    private static void Summary(StringBuilder html, ReportInput input, IReadOnlyList<ReportFinding> findings)
    {
        bool calm = findings.All(f => f.Role != FindingRole.Attention);
        html.Append("<section class=\"summary").Append(calm ? " calm" : "").Append("\" aria-label=\"Summary\">\n<p class=\"headline\">");
        var asBuilt = input.AsBuilt;
        // With an as-built list, listed features are not findings: the headline is the first unexpected event, or says
        // that there is none.
        bool nothingUnexpected = asBuilt is not null && findings.Count > 0 && calm && findings[0].Role is FindingRole.Listed or FindingRole.Expected;
        if (nothingUnexpected)
            html.Append(HtmlText.Escape(FindingWords.NothingUnexpected(asBuilt!.ExpectedCount))).Append('.');
        else
        {
            html.Append(HtmlText.Escape(findings.Count > 0
                ? FindingWords.Headline(findings[0], input.Unit)
                : FindingWords.NothingFound(input.Result.BlindZoneMeters, input.Unit))).Append('.');
            if (findings.Count > 0) html.Append(" <span class=\"ref\">(event ").Append(findings[0].Number).Append(")</span>");
        }
        html.Append("</p>\n");
        if (input.RepairCheck is { Comparison: { } comparison })
        {
            string first = comparison.Reasons.Count > 0 ? " " + ReportNumbers.ConvertMeters(comparison.Reasons[0], input.Unit) : "";
            bool pair = comparison.ReferenceKind == Comparison.ReferenceKind.Pair;
            html.Append("<p class=\"repair-line\"><strong>").Append(pair ? "Pair check: " : "Repair check: ").Append(comparison.Pass ? "PASS" : "FAIL").Append(".</strong>")
                .Append(HtmlText.Escape(first)).Append(" <span class=\"ref\">(see the ").Append(pair ? "pair check" : "repair check").Append(")</span></p>\n");
        }
        var others = findings.Skip(nothingUnexpected ? 0 : 1)
            .Where(f => f.Role != FindingRole.BeyondEnd && f.AsBuilt?.Expected != true).ToList();
        if (others.Count > 0)
        {
            html.Append("<ul class=\"others\">\n");
            foreach (var finding in others)
                html.Append("<li>").Append(HtmlText.Escape(FindingWords.Headline(finding, input.Unit)))
                    .Append(". <span class=\"ref\">(event ").Append(finding.Number).Append(")</span></li>\n");
            html.Append("</ul>\n");
        }
        if (asBuilt is not null)
        {
            var listed = findings.Where(f => f.Role == FindingRole.Listed || (f.Role == FindingRole.Expected && f.AsBuilt?.Expected == true))
                .OrderBy(f => f.Number).ToList();
            if (listed.Count > 0 && !nothingUnexpected)
                html.Append("<p class=\"as-built-found\">").Append(HtmlText.Escape(
                        $"{Locate.AsBuiltWording.Count(listed.Count, "listed feature")} found as expected: " +
                        string.Join("; ", listed.Select(f => $"{f.AsBuilt!.Entry!.Name} at {input.Unit.Format(f.Event.DistanceMeters, 2)}"))))
                    .Append(". <span class=\"ref\">(as-built list)</span></p>\n");
            foreach (var missing in asBuilt.Missing)
                html.Append("<p class=\"as-built-missing\"><strong>Listed but not found:</strong> ")
                    .Append(HtmlText.Escape(Locate.AsBuiltWording.Missing(missing, input.Unit))).Append(".</p>\n");
        }
        int echoes = findings.Skip(1).Count(f => f.Role == FindingRole.BeyondEnd);
        if (echoes > 0)
            html.Append("<p class=\"note\">").Append(echoes).Append(echoes == 1 ? " further reflection lies" : " further reflections lie")
                .Append(" beyond the open or short: echoes, not places on the cable (see the table).</p>\n");
        html.Append("</section>\n");
    }

    private static void FigureSection(StringBuilder html, int number, ReportInput input, IReadOnlyList<ReportFinding> findings)
    {
        ReportSections.Heading(html, number, "Trace and impedance profile", "figure");
        var figure = ReportFigures.Build(input.Result, findings, input.Unit);
        string svg = FigureRenderer.ToSvg(figure);
        string data = Convert.ToBase64String(Encoding.UTF8.GetBytes(svg));
        html.Append("<figure class=\"figure\">\n<img alt=\"Upper panel: the measured step response against distance from the connector; ")
            .Append("lower panel: the line impedance along the run. Numbered lines mark the events of the table.\" src=\"data:image/svg+xml;base64,")
            .Append(data).Append("\">\n<figcaption>")
            .Append("Upper: port voltage against distance (solid), with the fitted model (dashed). ")
            .Append("Lower: impedance along the run from layer peeling, drawn up to ")
            .Append(ReportNumbers.Plain(ReportFigures.ProfileTopTimesZ0 * input.Result.Options.ImpedanceOhms)).Append(" Ω. ")
            .Append("Numbered lines are the events of the table (solid: needs attention; dotted: expected or probable end). ")
            .Append("The shaded strip at the start is the blind zone. Top axis: round-trip time at the VF used.")
            .Append("</figcaption>\n</figure>\n");
    }
}
