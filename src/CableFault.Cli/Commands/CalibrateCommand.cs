using System.CommandLine;
using System.Globalization;
using System.Text.Json;
using CableFault.Analysis;
using CableFault.Cables;
using CableFault.Cli.Infrastructure;
using CableFault.Reporting;

namespace CableFault.Cli.Commands;

/// <summary>
/// <c>cablefault calibrate TRACE --length L</c>: the velocity factor that puts the far end at the known length,
/// VF = 2L / (c·t_end), with its uncertainty from the fitted end time and the length's own uncertainty.
/// </summary>
public static class CalibrateCommand
{
    /// <summary>Builds the verb.</summary>
    public static Command Create(CliContext context)
    {
        var trace = new Argument<FileInfo>("trace") { Description = "Trace of a run whose length is known (far end open, shorted or terminated)." };
        var length = new Option<double>("--length") { Description = "Known physical length of the run, in --units.", Required = true };
        var lengthSigma = new Option<double>("--length-uncertainty") { Description = "1-σ uncertainty of that length, in --units.", DefaultValueFactory = _ => 0 };
        var units = CommonOptions.Units();
        var cable = new CableSettingOptions();
        var write = new Option<FileInfo?>("--write-cable") { Description = "Add the calibrated type to this cable file (created if missing; other entries kept)." };
        var designation = new Option<string?>("--designation") { Description = "Name for the calibrated cable type (default: the --cable name with '-CAL')." };
        var format = new Option<string>("--format") { Description = "text or json.", DefaultValueFactory = _ => "text" }.AcceptOnlyFromAmong("text", "json");

        var command = new Command("calibrate",
            "Work out the velocity factor from a trace of a run of known length.\n\n" +
            "Example:\n  cablefault calibrate reel-100m.csv --length 100 --cable RG-213 --write-cable my-cables.json --designation RG213-REEL7")
        {
            trace, length, lengthSigma, units, write, designation, format,
        };
        cable.AddTo(command);
        command.SetAction(parsed =>
        {
            var unit = DistanceUnit.Parse(parsed.GetValue(units));
            double lengthMeters = parsed.GetValue(length) * unit.MetersPerUnit;
            double lengthSigmaMeters = parsed.GetValue(lengthSigma) * unit.MetersPerUnit;
            if (!(lengthMeters > 0) || !double.IsFinite(lengthMeters)) throw new InputException($"--length {parsed.GetValue(length)}: must be a positive length");
            if (!(lengthSigmaMeters >= 0)) throw new InputException("--length-uncertainty must be zero or positive");

            var loaded = TraceFiles.Load(parsed.GetValue(trace)!);
            var settings = cable.Resolve(parsed, loaded.Trace);
            // The VF itself is what we solve for: locate with no VF uncertainty so the end's σ is the timing σ alone.
            var result = Locator.Locate(loaded.Trace, settings.ToLocateOptions() with { VelocityFactorRelativeSigma = 0 });
            var end = result.Events.LastOrDefault(e => e.Kind is EventKind.Open or EventKind.Short or EventKind.Termination)
                ?? throw new InputException($"{loaded.Name}: no far end (open, short or termination) found; calibrate needs the end of the run inside the record");

            double c = PhysicalConstants.SpeedOfLightMetersPerSecond;
            double vf = 2 * lengthMeters / (c * end.RoundTripSeconds);
            double v = settings.VelocityFactor * c;
            double timeSigma = 2 * end.DistanceSigmaMeters / v;
            // δVF/VF = √((δt/t)² + (δL/L)²), first-order propagation of VF = 2L/(c·t).
            double relative = Math.Sqrt(Math.Pow(timeSigma / end.RoundTripSeconds, 2) + Math.Pow(lengthSigmaMeters / lengthMeters, 2));
            if (!(vf > 0 && vf <= 1))
                throw new InputException(string.Create(CultureInfo.InvariantCulture, $"{loaded.Name}: the end at {end.RoundTripSeconds * 1e9:F2} ns round trip and a length of {unit.Format(lengthMeters)} give VF {vf:F3}, which is impossible; check --length and that the far end is the last event"));

            if (parsed.GetValue(format) == "json")
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

            if (parsed.GetValue(write) is FileInfo cableFile)
            {
                string name = parsed.GetValue(designation) ?? (settings.Cable is { } known ? known.Designation + "-CAL" : "CALIBRATED");
                var basis = settings.Cable ?? new CableType(name, "calibrated", settings.ImpedanceOhms, vf, CableLossModel.Lossless);
                var calibrated = basis with
                {
                    Designation = name,
                    VelocityFactor = Math.Round(vf, 5),
                    Description = $"{basis.Description}; VF calibrated on {unit.Format(lengthMeters)}",
                    Source = string.Create(CultureInfo.InvariantCulture, $"calibrated on a run of known length, VF ± {relative * 100:0.##} % (1 σ), {DateTime.UtcNow:yyyy-MM-dd}"),
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
}
