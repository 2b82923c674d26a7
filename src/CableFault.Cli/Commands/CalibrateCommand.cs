using System.CommandLine;
using System.Globalization;
using System.Text.Json;
using CableFault.Analysis;
using CableFault.Cables;
using CableFault.Cli.Infrastructure;
using CableFault.Reporting;
using CableFault.Reporting.Locate;
using CableFault.Workflows;

namespace CableFault.Cli.Commands;

/// <summary>
/// <c>cablefault calibrate TRACE --length L</c>: the velocity factor that puts the far end at the known length,
/// VF = 2L / (c·t_end), with its uncertainty from the fitted end time and the length's own uncertainty.
/// <c>--known-event D</c> (or <c>--as-built FILE --use-label S2</c>) uses an event at a known distance instead of the end.
/// </summary>
public static class CalibrateCommand
{
    /// <summary>Builds the verb.</summary>
    public static Command Create(CliContext context)
    {
        var trace = new Argument<FileInfo>("trace") { Description = "Trace of a run whose length is known (far end open, shorted or terminated)." };
        var length = new Option<double?>("--length") { Description = "Known physical length of the run, in --units (the far end is used)." };
        var knownEvent = new Option<double?>("--known-event") { Description = "Known distance of an event from the connector, in --units (a surveyed splice or connector): the located event nearest it under the VF now in use is taken, instead of the far end." };
        var knownSigma = new Option<double?>("--known-event-uncertainty") { Description = $"1-σ uncertainty of --known-event, in --units (default {KnownEventCalibration.DefaultDistanceSigmaMeters} m: a position from the records)." };
        var asBuilt = new AsBuiltOptions();
        var useLabel = new Option<string?>("--use-label") { Description = "With --as-built: calibrate on the listed feature with this label (its distance, and half its tolerance as the 1-σ uncertainty)." };
        var lengthSigma = new Option<double>("--length-uncertainty") { Description = "1-σ uncertainty of that length, in --units.", DefaultValueFactory = _ => 0 };
        var units = CommonOptions.Units();
        var cable = new CableSettingOptions();
        var write = new Option<FileInfo?>("--write-cable") { Description = "Add the calibrated type to this cable file (created if missing; other entries kept)." };
        var designation = new Option<string?>("--designation") { Description = "Name for the calibrated cable type (default: the --cable name with '-CAL')." };
        var format = new Option<string>("--format") { Description = "text or json.", DefaultValueFactory = _ => "text" }.AcceptOnlyFromAmong("text", "json");

        var command = new Command("calibrate",
            "Work out the velocity factor from a trace of a run of known length, or of an event at a known distance.\n\n" +
            "Examples:\n  cablefault calibrate reel-100m.csv --length 100 --cable RG-213 --write-cable my-cables.json --designation RG213-REEL7\n" +
            "  cablefault calibrate traces/quillon-bay/mast-feeder-damaged.csv --known-event 12.0 --known-event-uncertainty 0.05")
        {
            trace, length, lengthSigma, knownEvent, knownSigma, useLabel, units, write, designation, format,
        };
        cable.AddTo(command);
        asBuilt.AddTo(command);
        command.SetAction(parsed =>
        {
            var unit = DistanceUnit.Parse(parsed.GetValue(units));
            var known = KnownDistance(parsed, knownEvent, knownSigma, asBuilt, useLabel, unit);
            if (known is not null && parsed.GetValue(length) is not null)
                throw new InputException("give either --length (the far end) or a known event (--known-event, or --as-built with --use-label), not both");
            if (known is null && parsed.GetValue(length) is null)
                throw new InputException("calibrate needs a known distance: --length L for a run of known length, or --known-event D for an event at a known distance");
            if (known is null && (parsed.GetValue(knownSigma) is not null))
                throw new InputException("--known-event-uncertainty goes with --known-event");

            var loaded = TraceFiles.Load(parsed.GetValue(trace)!);
            var settings = cable.Resolve(parsed, loaded.Trace);
            // The VF itself is what we solve for: locate with no VF uncertainty so the end's σ is the timing σ alone.
            var result = Locator.Locate(loaded.Trace, settings.ToLocateOptions() with { VelocityFactorRelativeSigma = 0 });
            bool json = parsed.GetValue(format) == "json";
            double vf, relative;
            string describedAs;
            if (known is { } k)
            {
                KnownEventCalibrationResult fit;
                try
                {
                    fit = KnownEventCalibration.Calibrate(result, k.Meters, k.SigmaMeters, settings.VelocityFactorRelativeSigma);
                }
                catch (InputException e)
                {
                    throw new InputException($"{loaded.Name}: {e.Message}", e);
                }
                vf = fit.VelocityFactor;
                relative = fit.VelocityFactorRelativeSigma;
                describedAs = $"the known {(k.Label is null ? "event" : k.Label)} at {unit.Format(k.Meters)}";
                if (json)
                {
                    context.Output.WriteLine(JsonSerializer.Serialize(new Dictionary<string, object?>
                    {
                        ["trace"] = loaded.Name, ["vf"] = vf, ["vf_sigma"] = fit.VelocityFactorSigma, ["vf_relative_sigma"] = relative,
                        ["method"] = "known_event", ["known_distance_m"] = k.Meters, ["known_distance_sigma_m"] = k.SigmaMeters, ["label"] = k.Label,
                        ["event_kind"] = EventKindNames.ToJsonName(fit.Event.Kind), ["event_round_trip_s"] = fit.Event.RoundTripSeconds,
                        ["event_distance_m_at_search_vf"] = fit.Event.DistanceMeters, ["search_vf"] = fit.SearchVelocityFactor,
                    }, new JsonSerializerOptions { WriteIndented = true }));
                }
                else
                {
                    context.Output.WriteLine(string.Create(CultureInfo.InvariantCulture,
                        $"VF {vf:F4} ± {fit.VelocityFactorSigma:F4} (1 σ, {relative * 100:0.###} %) from the {EventWording.KindWords(fit.Event.Kind)} at {fit.Event.RoundTripSeconds * 1e9:F3} ns round trip, taken as {describedAs} (± {unit.Format(k.SigmaMeters)})"));
                    context.Output.WriteLine(string.Create(CultureInfo.InvariantCulture,
                        $"  event used: the one nearest {unit.Format(k.Meters)} under the VF in use before ({fit.SearchVelocityFactor:0.000}, from {settings.VelocityFactorSource}), where it lay at {unit.Format(fit.Event.DistanceMeters)}"));
                }
            }
            else
            {
                double lengthMeters = parsed.GetValue(length)!.Value * unit.MetersPerUnit;
                double lengthSigmaMeters = parsed.GetValue(lengthSigma) * unit.MetersPerUnit;
                if (!(lengthMeters > 0) || !double.IsFinite(lengthMeters)) throw new InputException($"--length {parsed.GetValue(length)}: must be a positive length");
                if (!(lengthSigmaMeters >= 0)) throw new InputException("--length-uncertainty must be zero or positive");
                var end = result.Events.LastOrDefault(e => e.Kind is EventKind.Open or EventKind.Short or EventKind.Termination)
                    ?? throw new InputException($"{loaded.Name}: no far end (open, short or termination) found; calibrate needs the end of the run inside the record, or an event at a known distance (--known-event)");

                double c = PhysicalConstants.SpeedOfLightMetersPerSecond;
                vf = 2 * lengthMeters / (c * end.RoundTripSeconds);
                double v = settings.VelocityFactor * c;
                double timeSigma = 2 * end.DistanceSigmaMeters / v;
                // δVF/VF = √((δt/t)² + (δL/L)²), first-order propagation of VF = 2L/(c·t).
                relative = Math.Sqrt(Math.Pow(timeSigma / end.RoundTripSeconds, 2) + Math.Pow(lengthSigmaMeters / lengthMeters, 2));
                if (!(vf > 0 && vf <= 1))
                    throw new InputException(string.Create(CultureInfo.InvariantCulture, $"{loaded.Name}: the end at {end.RoundTripSeconds * 1e9:F2} ns round trip and a length of {unit.Format(lengthMeters)} give VF {vf:F3}, which is impossible; check --length and that the far end is the last event"));
                describedAs = $"a run of known length {unit.Format(lengthMeters)}";

                if (json)
                {
                    context.Output.WriteLine(JsonSerializer.Serialize(new Dictionary<string, object?>
                    {
                        ["trace"] = loaded.Name, ["vf"] = vf, ["vf_sigma"] = vf * relative, ["vf_relative_sigma"] = relative,
                        ["length_m"] = lengthMeters, ["end_round_trip_s"] = end.RoundTripSeconds, ["end_kind"] = EventKindNames.ToJsonName(end.Kind),
                    }, new JsonSerializerOptions { WriteIndented = true }));
                }
                else
                {
                    context.Output.WriteLine(string.Create(CultureInfo.InvariantCulture,
                        $"VF {vf:F4} ± {vf * relative:F4} (1 σ, {relative * 100:0.###} %) from the {EventKindNames.ToJsonName(end.Kind)} end at {end.RoundTripSeconds * 1e9:F3} ns round trip and a length of {unit.Format(lengthMeters, 3)}"));
                }
            }

            if (parsed.GetValue(write) is FileInfo cableFile)
            {
                string name = parsed.GetValue(designation) ?? (settings.Cable is { } namedCable ? namedCable.Designation + "-CAL" : "CALIBRATED");
                var basis = settings.Cable ?? new CableType(name, "calibrated", settings.ImpedanceOhms, vf, CableLossModel.Lossless);
                var calibrated = basis with
                {
                    Designation = name,
                    VelocityFactor = Math.Round(vf, 5),
                    Description = $"{basis.Description}; VF calibrated on {describedAs}",
                    Source = string.Create(CultureInfo.InvariantCulture, $"calibrated on {describedAs}, VF ± {relative * 100:0.##} % (1 σ), {DateTime.UtcNow:yyyy-MM-dd}"),
                };
                var existing = cableFile.Exists ? InputFiles.Read(cableFile, "cable", CableTypeJson.Read) : [];
                var kept = existing.Where(t => !string.Equals(t.Designation, name, StringComparison.OrdinalIgnoreCase)).Append(calibrated).ToList();
                AtomicFile.Write(cableFile.FullName, stream => CableTypeJson.Write(kept, stream));
                context.Error.WriteLine($"wrote {cableFile.Name}: cable type '{name}'");
            }
            return CliApp.Success;
        });
        return command;
    }

    private sealed record Known(double Meters, double SigmaMeters, string? Label);

    /// <summary>The known event's distance and σ in metres from --known-event or --as-built/--use-label; null for neither.</summary>
    private static Known? KnownDistance(ParseResult parsed, Option<double?> knownEvent, Option<double?> knownSigma, AsBuiltOptions asBuilt,
        Option<string?> useLabel, DistanceUnit unit)
    {
        var inv = CultureInfo.InvariantCulture;
        string? label = parsed.GetValue(useLabel);
        var list = asBuilt.Load(parsed);
        if ((label is null) != (list is null))
            throw new InputException("--as-built and --use-label go together: the list, and the label of the feature to calibrate on");
        if (label is not null && parsed.GetValue(knownEvent) is not null)
            throw new InputException("give the known event once: --known-event D, or --as-built FILE --use-label NAME");
        if (list is not null)
        {
            var entries = list.Entries.Where(e => string.Equals(e.Label, label!.Trim(), StringComparison.OrdinalIgnoreCase)).ToList();
            if (entries.Count != 1)
            {
                string labels = string.Join(", ", list.Entries.Where(e => e.Label is not null).Select(e => e.Label));
                throw new InputException(entries.Count == 0
                    ? $"{parsed.GetValue(asBuilt.File)!.Name}: no feature labelled '{label}'; the labels are: {(labels.Length > 0 ? labels : "(none)")}"
                    : $"{parsed.GetValue(asBuilt.File)!.Name}: {entries.Count} features are labelled '{label}'; give each a label of its own");
            }
            var entry = entries[0];
            // The list's tolerance is a 95 % bound (about 2 σ); an explicit --known-event-uncertainty wins.
            double sigma = parsed.GetValue(knownSigma) is double given ? given * unit.MetersPerUnit : entry.ToleranceMeters / 2;
            if (!(sigma >= 0)) throw new InputException("--known-event-uncertainty must be zero or positive");
            return new Known(entry.DistanceMeters, sigma, entry.Name);
        }
        if (parsed.GetValue(knownEvent) is not double distance) return null;
        double meters = distance * unit.MetersPerUnit;
        double sigmaMeters = parsed.GetValue(knownSigma) is double s ? s * unit.MetersPerUnit : KnownEventCalibration.DefaultDistanceSigmaMeters;
        if (!(meters > 0) || !double.IsFinite(meters)) throw new InputException(string.Create(inv, $"--known-event {distance}: must be a positive distance in {unit.Symbol}"));
        if (!(sigmaMeters >= 0) || !double.IsFinite(sigmaMeters)) throw new InputException("--known-event-uncertainty must be zero or positive");
        return new Known(meters, sigmaMeters, null);
    }
}
