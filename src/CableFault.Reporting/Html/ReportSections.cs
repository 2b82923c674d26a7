using System.Globalization;
using System.Text;
using CableFault.Analysis;

namespace CableFault.Reporting.Html;

/// <summary>The report's body sections; each appends escaped HTML to the document.</summary>
internal static class ReportSections
{
    internal static void Heading(StringBuilder html, int number, string title, string id) =>
        html.Append("<h2 id=\"").Append(id).Append("\"><span class=\"num\">").Append(number).Append("</span>")
            .Append(HtmlText.Escape(title)).Append("</h2>\n");

    internal static void Events(StringBuilder html, int number, ReportInput input, IReadOnlyList<ReportFinding> findings)
    {
        var unit = input.Unit;
        Heading(html, number, "Events found", "events");
        if (findings.Count == 0)
        {
            html.Append("<p>No events beyond the blind zone (").Append(HtmlText.Escape(unit.Format(input.Result.BlindZoneMeters, 2)))
                .Append(").").Append(input.Result.LeavesTraceUnexplained
                    ? " The model leaves much of the trace unexplained (see the warnings): do not read this as a sound run."
                    : input.Result.LevelMovesWithoutEvent || input.Result.LevelStillMovingAtEnd
                        ? " The level is not that of a uniform run (see the warnings): do not read this as a sound run."
                        : "").Append("</p>\n");
            return;
        }
        html.Append("<div class=\"tablewrap\"><table class=\"events\">\n<thead><tr>")
            .Append("<th>#</th><th>Distance (").Append(unit.Symbol).Append(")</th><th>± 1σ (").Append(unit.Symbol).Append(")</th>")
            .Append("<th>What it is</th><th>Size</th><th>ρ</th><th>Confidence</th><th>Status</th>")
            .Append(input.AsBuilt is null ? "" : "<th>As built</th>")
            .Append("</tr></thead>\n<tbody>\n");
        foreach (var finding in findings.OrderBy(f => f.Number))
        {
            var e = finding.Event;
            int decimals = ReportNumbers.DecimalsFor(unit.FromMeters(e.DistanceSigmaMeters));
            string rowClass = finding.Role switch
            {
                FindingRole.Attention => "attention", FindingRole.Expected or FindingRole.Listed => "expected", FindingRole.BeyondEnd => "echo", _ => "possible",
            };
            string status = finding.Role switch
            {
                FindingRole.Attention => "<span class=\"tag attention\">attention</span>",
                FindingRole.Expected => "<span class=\"tag expected\">run end, as recorded</span>",
                FindingRole.Listed => "<span class=\"tag expected\">listed feature</span>",
                FindingRole.BeyondEnd => "<span class=\"tag possible\">echo beyond the end</span>",
                _ => "<span class=\"tag possible\">probable run end</span>",
            };
            string usually = finding.Role == FindingRole.BeyondEnd
                ? "a re-reflection of earlier events; nothing travels past an open or short"
                : FindingWords.LikelyCause(e.Kind);
            html.Append("<tr class=\"").Append(rowClass).Append("\">")
                .Append("<td class=\"n\" data-label=\"#\">").Append(finding.Number).Append("</td>")
                .Append("<td class=\"n\" data-label=\"Distance (").Append(unit.Symbol).Append(")\">").Append(ReportNumbers.Fixed(unit.FromMeters(e.DistanceMeters), decimals)).Append("</td>")
                .Append("<td class=\"n\" data-label=\"± 1σ (").Append(unit.Symbol).Append(")\">").Append(ReportNumbers.Fixed(unit.FromMeters(e.DistanceSigmaMeters), decimals)).Append("</td>")
                .Append("<td class=\"what\"><span class=\"kind\">").Append(HtmlText.Escape(FindingWords.Name(e.Kind))).Append("</span>")
                .Append("<span class=\"usually\">usually ").Append(HtmlText.Escape(usually)).Append("</span></td>")
                .Append("<td data-label=\"Size\">").Append(HtmlText.Escape(SizeCell(e))).Append("</td>")
                .Append("<td class=\"n\" data-label=\"ρ\">").Append(e.Reflection.ToString("+0.000;−0.000;0.000", CultureInfo.InvariantCulture)).Append("</td>")
                .Append("<td class=\"n\" data-label=\"Confidence\">").Append(ConfidenceText(e.Confidence)).Append("</td>")
                .Append("<td data-label=\"Status\">").Append(status).Append("</td>");
            if (input.AsBuilt is not null) AsBuiltCell(html, finding, unit);
            html.Append("</tr>\n");
        }
        html.Append("</tbody></table></div>\n")
            .Append("<p class=\"note method\">How the distances were found: ")
            .Append(HtmlText.Escape(Locate.DistanceMethod.Describe(input.Result.Options, input.Settings.Cable, null, unit)))
            .Append(".</p>\n");
        if (input.AsBuilt is { } asBuilt)
        {
            html.Append("<p class=\"note\">As built: events are held against ")
                .Append(input.AsBuiltName is null ? "the run's as-built list" : $"the as-built list <span class=\"file\">{HtmlText.Escape(input.AsBuiltName)}</span>")
                .Append(": an event is expected when a listed feature of a kind it can show as lies within √(T² + (2σ)²) of it, ")
                .Append("T the listed tolerance and σ the event's ± figure. Anything else is UNEXPECTED.</p>\n");
            if (asBuilt.Missing.Count > 0)
            {
                html.Append("<ul class=\"as-built-missing\">\n");
                foreach (var missing in asBuilt.Missing)
                    html.Append("<li>Listed but not found: ").Append(HtmlText.Escape(Locate.AsBuiltWording.Missing(missing, unit))).Append("</li>\n");
                html.Append("</ul>\n");
            }
        }
        html
            .Append("<p class=\"note\">± is one standard deviation: the fit's timing uncertainty and the velocity-factor uncertainty combined ")
            .Append("(about two in three such figures hold the true distance; double it for 95 %). ρ is the reflection coefficient of the event, ")
            .Append("−1 (short) to +1 (open). Confidence is how sure the analysis is that the event is real and of the kind named.</p>\n");
    }

    private static void AsBuiltCell(StringBuilder html, ReportFinding finding, DistanceUnit unit)
    {
        html.Append("<td class=\"as-built\" data-label=\"As built\">");
        if (finding.AsBuilt is not { } match) html.Append('—');
        else if (match.Expected || !match.Unexpected || finding.Role == FindingRole.BeyondEnd) html.Append(HtmlText.Escape(Locate.AsBuiltWording.Status(match, unit)));
        else html.Append("<span class=\"tag attention\">").Append(HtmlText.Escape(Locate.AsBuiltWording.Status(match, unit))).Append("</span>");
        html.Append("</td>");
    }

    private static string SizeCell(LocatedEvent e)
    {
        var parts = new List<string>();
        string size = FindingWords.Size(e);
        if (size.Length > 0) parts.Add(size);
        if (e.ImpedanceOhms is double z && e.Kind is not (EventKind.ImpedanceDrop or EventKind.ImpedanceRise))
            parts.Add("line beyond about " + ReportNumbers.Ohms(z));
        return parts.Count > 0 ? string.Join("; ", parts) : "—";
    }

    private static string ConfidenceText(double confidence)
    {
        string word = confidence >= 0.9 ? "high" : confidence >= 0.6 ? "medium" : "low";
        return string.Create(CultureInfo.InvariantCulture, $"{confidence * 100:0} % ({word})");
    }

    internal static void RepairCheck(StringBuilder html, int number, RepairCheckPart repair, DistanceUnit unit)
    {
        bool pair = repair.Comparison?.ReferenceKind == Comparison.ReferenceKind.Pair;
        Heading(html, number, pair ? "Pair check against a reference pair" : "Repair check against the baseline", "repair");
        html.Append(pair ? "<p>Reference pair (a healthy pair of the same cable): <span class=\"file\">" : "<p>Baseline: <span class=\"file\">")
            .Append(HtmlText.Escape(repair.BaselineName)).Append("</span></p>\n");
        if (repair.Comparison is not { } comparison)
        {
            html.Append("<p class=\"verdict\">Comparison not available.</p>\n<p>")
                .Append(HtmlText.Escape(repair.UnavailableReason ?? "No reason was given.")).Append("</p>\n");
            return;
        }
        if (pair)
            html.Append(comparison.Pass
                ? "<p class=\"verdict pass\">Verdict: PASS — the pair matches the reference pair within the pair tolerances below.</p>\n"
                : "<p class=\"verdict fail\">Verdict: FAIL — the pair differs from the reference pair beyond the pair tolerances below.</p>\n");
        else
            html.Append(comparison.Pass
                ? "<p class=\"verdict pass\">Verdict: PASS — the run matches its baseline within the tolerances below.</p>\n"
                : "<p class=\"verdict fail\">Verdict: FAIL — the run differs from its baseline beyond the tolerances below.</p>\n");
        if (pair && comparison.Spread is { } spread)
        {
            html.Append("<p>Pair spread against the reference pair: electrical length ")
                .Append(spread.LengthDifferenceFraction is double l ? HtmlText.Escape(l.ToString("+0.00 %;−0.00 %;0.00 %", CultureInfo.InvariantCulture)) : "not fitted (no common far end)")
                .Append(", Z₀ ")
                .Append(spread.CurrentImpedanceOhms is double z
                    ? HtmlText.Escape(string.Create(CultureInfo.InvariantCulture, $"{z:0.0} Ω against {spread.ReferenceImpedanceOhms:0.0} Ω ({spread.ImpedanceOffsetFraction:+0.0 %;−0.0 %;0.0 %})"))
                    : "not estimated")
                .Append(comparison.FirstDifferenceMeters is double first ? "; the traces first part at " + HtmlText.Escape(unit.Format(first, 2)) : "")
                .Append(".</p>\n");
        }
        html.Append("<ul class=\"reasons\">\n");
        foreach (string reason in comparison.Reasons)
            html.Append("<li>").Append(HtmlText.Escape(ReportNumbers.ConvertMeters(reason, unit))).Append("</li>\n");
        html.Append("</ul>\n");

        var listed = comparison.Events.Where(e => e.Kind != Comparison.EventChangeKind.Unchanged || e.ExceedsTolerance)
            .Concat(comparison.Events.Where(e => e.Kind == Comparison.EventChangeKind.Unchanged && !e.ExceedsTolerance))
            .ToList();
        var figure = RepairCheckFigures.Build(comparison, listed, unit);
        string data = Convert.ToBase64String(Encoding.UTF8.GetBytes(Plots.FigureRenderer.ToSvg(figure)));
        string referenceWord = pair ? "reference pair" : "baseline", currentWord = pair ? "suspect pair" : "current";
        html.Append("<figure class=\"figure\">\n<img alt=\"Upper panel: ").Append(referenceWord).Append(" (dashed) and ").Append(currentWord)
            .Append(" (solid) traces against distance; lower panel: their difference with the noise band shaded.\" src=\"data:image/svg+xml;base64,").Append(data).Append("\">\n")
            .Append("<figcaption>Upper: ").Append(referenceWord).Append(" (dashed) and ").Append(currentWord)
            .Append(" (solid), each divided by its own incident step and aligned on its edge")
            .Append(pair && comparison.Spread?.LengthFitted == true ? "; the suspect's time axis stretched to line its far end up with the reference pair's. " : ". ")
            .Append("Lower: ").Append(currentWord).Append(" − ").Append(referenceWord).Append("; the shaded band (± ").Append(ReportNumbers.Plain(comparison.NoiseBand))
            .Append(" of the step) is what noise alone can explain. Lines c1, c2, … are the changes of the table below.</figcaption>\n</figure>\n");

        if (listed.Count > 0)
        {
            html.Append("<div class=\"tablewrap\"><table class=\"changes\">\n<thead><tr><th>Mark</th><th>Distance (").Append(unit.Symbol)
                .Append(")</th><th>Change</th><th>Shift (").Append(unit.Symbol).Append(")</th><th>Δρ</th><th>Outside tolerance</th><th>Details</th></tr></thead>\n<tbody>\n");
            for (int i = 0; i < listed.Count; i++)
            {
                var change = listed[i];
                html.Append("<tr class=\"").Append(change.ExceedsTolerance ? "attention" : "expected").Append("\">")
                    .Append("<td data-label=\"Mark\">c").Append(i + 1).Append("</td>")
                    .Append("<td class=\"n\" data-label=\"Distance (").Append(unit.Symbol).Append(")\">").Append(ReportNumbers.Fixed(unit.FromMeters(change.DistanceMeters), 2)).Append("</td>")
                    .Append("<td data-label=\"Change\">").Append(HtmlText.Escape(Comparison.EventChangeKindNames.ToJsonName(change.Kind))).Append("</td>")
                    .Append("<td class=\"n\" data-label=\"Shift (").Append(unit.Symbol).Append(")\">")
                    .Append(change.ShiftMeters is double shift ? ReportNumbers.Fixed(unit.FromMeters(shift), 2) : "—").Append("</td>")
                    .Append("<td class=\"n\" data-label=\"Δρ\">").Append(change.ReflectionChange.ToString("+0.000;−0.000;0.000", CultureInfo.InvariantCulture)).Append("</td>")
                    .Append("<td data-label=\"Outside tolerance\">").Append(change.ExceedsTolerance ? "<span class=\"tag attention\">yes</span>" : "no").Append("</td>")
                    .Append("<td class=\"what\">").Append(HtmlText.Escape(ReportNumbers.ConvertMeters(change.Description, unit))).Append("</td></tr>\n");
            }
            html.Append("</tbody></table></div>\n");
        }
        var t = comparison.Tolerances;
        if (pair)
            html.Append("<p class=\"note\">Pair tolerances (pairs of one cable differ in lay length and impedance): a stretch of the suspect's ")
                .Append("length by up to ").Append(HtmlText.Escape(string.Create(CultureInfo.InvariantCulture, $"±{t.LengthFraction * 100:0.#} %")))
                .Append(" is absorbed and reported; a Z₀ difference up to ").Append(HtmlText.Escape(string.Create(CultureInfo.InvariantCulture, $"±{(t.ImpedanceFraction ?? 0) * 100:0.#} %")))
                .Append(" is reported, beyond it fails; the distance tolerance grows to ").Append(HtmlText.Escape(string.Create(CultureInfo.InvariantCulture, $"{t.DistanceFraction * 100:0.##} %")))
                .Append(" of the distance where that is more than the fixed figure below.</p>\n");
        html.Append("<p class=\"note\">Tolerances: an event may move by up to ").Append(HtmlText.Escape(unit.Format(t.DistanceMeters, 2)))
            .Append(" and its reflection change by up to ").Append(ReportNumbers.Plain(t.Reflection))
            .Append(" of the step; a new or vanished event, or an unexplained difference, larger than that fails the check. ")
            .Append(pair ? "Rise times: reference pair " : "Rise times: baseline ").Append(ReportNumbers.Seconds(comparison.BaselineRiseTimeSeconds))
            .Append(", current ").Append(ReportNumbers.Seconds(comparison.CurrentRiseTimeSeconds))
            .Append(comparison.RiseMatched ? " (the sharper one was slowed to match)." : ".").Append("</p>\n");
        if (comparison.Warnings.Count > 0)
        {
            html.Append("<ul class=\"note\">\n");
            foreach (string warning in comparison.Warnings)
                html.Append("<li>").Append(HtmlText.Escape(AsSentence(ReportNumbers.ConvertMeters(warning, unit)))).Append("</li>\n");
            html.Append("</ul>\n");
        }
    }

    /// <summary>Earlier measurements of the run from the history database, oldest first.</summary>
    internal static void History(StringBuilder html, int number, IReadOnlyList<PastCheck> history)
    {
        Heading(html, number, "Earlier measurements of this run", "history");
        html.Append("<table class=\"history\">\n<thead><tr><th>#</th><th>Stored (UTC)</th><th>Trace</th><th>Role</th><th>Repair check</th><th>Note</th></tr></thead>\n<tbody>\n");
        foreach (var past in history)
        {
            string verdict = past.Passed switch { true => "pass", false => "FAIL", null => "—" };
            html.Append("<tr><td>").Append(past.Id.ToString(CultureInfo.InvariantCulture))
                .Append("</td><td>").Append(HtmlText.Escape(past.AddedUtc.UtcDateTime.ToString("yyyy-MM-dd HH:mm", CultureInfo.InvariantCulture)))
                .Append("</td><td class=\"file\">").Append(HtmlText.Escape(past.FileName))
                .Append("</td><td>").Append(HtmlText.Escape(past.Role))
                .Append("</td><td>").Append(verdict)
                .Append("</td><td>").Append(HtmlText.Escape(past.Note ?? "")).Append("</td></tr>\n");
        }
        html.Append("</tbody>\n</table>\n");
    }

    internal static void Settings(StringBuilder html, int number, ReportInput input)
    {
        var s = input.Settings;
        var r = input.Result;
        var c = r.Characteristics;
        var unit = input.Unit;
        double v = s.VelocityFactor * PhysicalConstants.SpeedOfLightMetersPerSecond;
        Heading(html, number, "Settings, method and accuracy", "settings");
        html.Append("<dl class=\"settings\">\n");
        Setting(html, "Velocity factor", string.Create(CultureInfo.InvariantCulture,
            $"{s.VelocityFactor:0.000} ± {s.VelocityFactorRelativeSigma * 100:0.#} % (1σ), from {SourceWords(s.VelocityFactorSource)}"));
        Setting(html, "Cable impedance Z₀", $"{ReportNumbers.Plain(s.ImpedanceOhms)} Ω, from {SourceWords(s.ImpedanceSource)}");
        Setting(html, "Instrument source impedance", $"{ReportNumbers.Plain(s.SourceImpedanceOhms)} Ω");
        Setting(html, "Rise time (10–90 %, measured)", ReportNumbers.Seconds(c.RiseTimeSeconds));
        Setting(html, "Incident step", ReportNumbers.Volts(c.IncidentAmplitudeVolts) + (c.PolarityInverted ? " (inverted polarity, corrected)" : ""));
        Setting(html, "Noise (robust RMS)", string.Create(CultureInfo.InvariantCulture,
            $"{ReportNumbers.Volts(c.NoiseRmsVolts)}, {c.NoiseRelative * 100:0.###} % of the step"));
        Setting(html, "Sampling", $"every {ReportNumbers.Seconds(r.AlignedTrace.SampleIntervalSeconds)}, " +
            $"{r.AlignedTrace.Length.ToString(CultureInfo.InvariantCulture)} samples ({ReportNumbers.Seconds(r.AlignedTrace.DurationSeconds)})");
        Setting(html, "Blind zone", unit.Format(r.BlindZoneMeters, 2) + " from the connector");
        Setting(html, "Two-event resolution", "about " + unit.Format(v * c.RiseTimeSeconds / 2, 2) + " (v·t_r/2)");
        Setting(html, "Cable loss", LossWords(s, unit));
        Setting(html, "Model fit", (r.Fit.Converged ? "converged" : "did not converge") + "; " + r.Fit.Message);
        html.Append("</dl>\n");

        double relative = s.VelocityFactorRelativeSigma;
        double example = r.Events.Count > 0 ? r.Events.Max(e => e.DistanceMeters) : 100 * unit.MetersPerUnit;
        html.Append("<h3>Method</h3>\n<p>The instrument sends a voltage step into the cable; every change of impedance returns part of it. ")
            .Append("A reflection seen <span class=\"formula\">t</span> after the step left the connector lies at ")
            .Append("<span class=\"formula\">d = v·t/2</span>, with <span class=\"formula\">v = VF·c</span>. ")
            .Append("The trace is aligned on the step's 50 % point, turned into an impedance profile by layer peeling (which undoes the ")
            .Append("re-reflections between boundaries), and each candidate event is refined by a least-squares fit of a model of the run ")
            .Append("(Levenberg–Marquardt); the number of events is chosen by the Bayesian information criterion. ")
            .Append(s.Loss is null ? "No loss correction was applied (no cable type with a loss figure was named). " : "Impedances and sizes were corrected for the cable's loss. ")
            .Append("</p>\n<h3>What limits the accuracy</h3>\n<p>Above all the velocity factor: a relative error in VF is the same relative error in every distance, ")
            .Append("<span class=\"formula\">δd/d = δVF/VF</span>. ")
            .Append(HtmlText.Escape(string.Create(CultureInfo.InvariantCulture,
                $"With VF known to ±{relative * 100:0.#} %, a point {unit.Format(example, 1)} away is uncertain by ±{unit.Format(example * relative, 2)} from the VF alone, however fine the sampling. ")))
            .Append("Calibrating the VF on a run of known length, or on this run when its installed length is on record, removes most of this. ")
            .Append("Beyond the VF: events inside the blind zone cannot be seen; two events closer than the resolution above may show as one; ")
            .Append("cable loss rounds and shrinks far echoes, so far events are placed and sized less precisely; ")
            .Append("and the VF of a wet or damaged section differs from the rest of the cable, which shifts every event beyond it slightly.</p>\n");
    }

    private static void Setting(StringBuilder html, string label, string value) =>
        html.Append("<dt>").Append(HtmlText.Escape(label)).Append("</dt><dd>").Append(HtmlText.Escape(value)).Append("</dd>\n");

    private static string SourceWords(string source) => source switch
    {
        "option" => "the command line",
        "metadata" => "the trace file",
        "cable" => "the cable type's nominal value",
        "calibrated" => "a calibration recorded in the trace file",
        "job" => "the job file",
        "default" => "a default (nothing else given: check it)",
        _ => source,
    };

    private static string LossWords(CableFault.Analysis.CableSettings s, DistanceUnit unit)
    {
        if (s.Loss is null || s.Loss.IsLossless) return "not known; no loss correction";
        string name = s.Cable is { } cable ? $" ({cable.Designation})" : "";
        return $"{ReportNumbers.AttenuationPer100(s.Loss.AttenuationDbPer100m(100e6), unit)} at 100 MHz, " +
               $"{ReportNumbers.AttenuationPer100(s.Loss.AttenuationDbPer100m(1e9), unit)} at 1 GHz{name}";
    }

    /// <summary>A warning as a list item's sentence: the analysis writes them to follow "warning: ", lower-case.</summary>
    private static string AsSentence(string warning) =>
        warning.Length > 0 ? char.ToUpperInvariant(warning[0]) + warning[1..] : warning;

    internal static void Notes(StringBuilder html, int number, ReportInput input)
    {
        var warnings = input.Settings.Warnings.Concat(input.Result.Warnings).Distinct().ToList();
        Heading(html, number, "Notes from the analysis", "notes");
        if (warnings.Count == 0)
        {
            html.Append("<p>None: the trace was clean and the settings complete.</p>\n");
            return;
        }
        html.Append("<ul>\n");
        foreach (string warning in warnings)
            html.Append("<li>").Append(HtmlText.Escape(AsSentence(ReportNumbers.ConvertMeters(warning, input.Unit)))).Append("</li>\n");
        html.Append("</ul>\n");
    }

    internal static void Safety(StringBuilder html, int number)
    {
        Heading(html, number, "Safety", "safety");
        html.Append("<div class=\"safety\">\n<p>Cable testing can meet live conductors and stored charge. Before connecting any instrument:</p>\n<ul>\n")
            .Append("<li>Work only on cable that is de-energised, isolated at both ends and discharged; prove it dead with a suitable tester.</li>\n")
            .Append("<li>Follow lock-out/tag-out practice; long runs can carry induced voltages from nearby power lines and lightning.</li>\n")
            .Append("<li>Respect the instrument's own input limits; use the protective adapters its maker specifies.</li>\n")
            .Append("<li>Power, telecom and antenna installations are covered by local codes and licensed practice. This report gives distances ")
            .Append("and likelihoods, not permission to dig, climb or cut: those decisions stay with qualified people who follow the rules where the work is done.</li>\n")
            .Append("</ul>\n</div>\n");
    }
}
