using System.Globalization;
using System.Text;
using CableFault.Analysis;
using CableFault.Workflows;

namespace CableFault.Reporting.Locate;

/// <summary>The readable table `cablefault locate` prints by default.</summary>
public static class LocateText
{
    /// <summary>Renders the result for a terminal.</summary>
    /// <param name="result">What the locator found.</param>
    /// <param name="traceName">Name for the first line.</param>
    /// <param name="unit">Distance unit.</param>
    /// <param name="asBuilt">The events held against an as-built list: adds a column and a summary, unexpected first.</param>
    /// <param name="method">How the distances were worked out (<see cref="DistanceMethod"/>), shown under the header;
    /// null for what the result's options alone tell.</param>
    public static string Render(LocateResult result, string traceName, DistanceUnit unit, AsBuiltMatch? asBuilt = null, string? method = null)
    {
        var text = new StringBuilder();
        var c = result.Characteristics;
        var o = result.Options;
        var inv = CultureInfo.InvariantCulture;
        text.AppendLine($"{traceName}");
        text.AppendLine(string.Create(inv,
            $"  VF {o.VelocityFactor:F3} ({o.VelocityFactorSource}, ±{o.VelocityFactorRelativeSigma * 100:0.#} %)   Z0 {o.ImpedanceOhms:0.#} Ω   source {o.SourceImpedanceOhms:0.#} Ω"));
        text.AppendLine(string.Create(inv,
            $"  rise {c.RiseTimeSeconds * 1e9:0.###} ns   noise {c.NoiseRmsVolts * 1e3:0.###} mV RMS   step {c.IncidentAmplitudeVolts:0.###} V   blind zone {unit.Format(result.BlindZoneMeters)}"));
        text.AppendLine($"  distances: {method ?? DistanceMethod.Describe(o, null, null, unit)}");
        text.AppendLine();
        if (result.Events.Count == 0)
        {
            text.AppendLine(result.LeavesTraceUnexplained
                ? "  No single event stands out, yet the model leaves much of the trace unexplained (see the warnings): do not read this as a sound run. Give the cable type (for its loss) or check VF and Z0."
                : result.LevelMovesWithoutEvent || result.LevelStillMovingAtEnd
                    ? "  No single event stands out, yet the level is not that of a uniform run (see the warnings): do not read this as a sound run. A slow change on a lossy cable can escape the detector; give the cable type and look at the trace."
                    : "  No events found: the run looks uniform and matched over the recorded length.");
        }
        else
        {
            text.AppendLine($"  {"#",2}  {"distance (" + unit.Symbol + ")",-22} {"kind",-19} {"ρ",7}  {"size",-16} {"confidence",10}{(asBuilt is null ? "" : "  as built")}");
            int index = 1;
            foreach (var e in result.Events)
            {
                string distance = string.Create(inv, $"{unit.FromMeters(e.DistanceMeters):F2} ± {unit.FromMeters(e.DistanceSigmaMeters):F2}");
                string status = asBuilt is null ? "" : "  " + AsBuiltWording.Status(asBuilt.Events[index - 1], unit);
                text.AppendLine(string.Create(inv,
                    $"  {index++,2}  {distance,-22} {EventWording.KindWords(e.Kind),-19} {e.Reflection,7:+0.000;-0.000;0.000}  {EventWording.SizeWords(e),-16} {e.Confidence,9:P0}{status}"));
            }
        }
        if (asBuilt is not null)
        {
            text.AppendLine();
            var lines = AsBuiltWording.Summary(asBuilt, unit);
            text.AppendLine($"  as-built list{(asBuilt.List.RunId is string run ? $" ({run})" : "")}: {lines[0]}");
            foreach (string line in lines.Skip(1)) text.AppendLine($"    {line}");
        }
        text.AppendLine();
        var fit = result.Fit;
        text.AppendLine(string.Create(inv,
            $"  model fit: {(fit.Converged ? "converged" : "did not converge")} after {fit.Iterations} iterations, residual {fit.ResidualRmsVolts * 1e3:0.###} mV RMS, {fit.ParameterCount} parameters ({fit.Criterion}){(string.IsNullOrWhiteSpace(fit.Message) ? "" : "; " + fit.Message)}"));
        text.AppendLine(string.Create(inv,
            $"  ± figures are 1 σ and include the VF uncertainty (δd/d = δVF/VF = {o.VelocityFactorRelativeSigma * 100:0.#} %); calibrate the VF on a known length to shrink them."));
        foreach (string warning in result.Warnings) text.AppendLine($"  warning: {warning}");
        return text.ToString();
    }
}
