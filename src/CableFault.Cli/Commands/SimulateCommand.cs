using System.CommandLine;
using System.Globalization;
using CableFault.Cli.Infrastructure;
using CableFault.Networks;
using CableFault.Reporting;
using CableFault.Reporting.Plots;
using CableFault.Simulation;
using CableFault.Traces;

namespace CableFault.Cli.Commands;

/// <summary><c>cablefault simulate NETWORK.json</c>: the trace a reflectometer would record on a described run.</summary>
public static class SimulateCommand
{
    /// <summary>Builds the verb.</summary>
    public static Command Create(CliContext context)
    {
        var network = new Argument<FileInfo>("network") { Description = "Run description (JSON; see README, 'Describing a run')." };
        var output = new Option<FileInfo?>("--output", "-o") { Description = "Trace CSV to write. Without it the CSV goes to standard output." };
        var rise = new Option<double>("--rise-time-ns") { Description = "10–90 % rise time of the step at the port, ns.", DefaultValueFactory = _ => 1.0 };
        var interval = new Option<double?>("--sample-interval-ps") { Description = "Sample interval, ps. Default: rise time / 8." };
        var duration = new Option<double?>("--duration-ns") { Description = "Record length after the pre-trigger, ns. Default: 2.5 round trips of the longest path." };
        var samples = new Option<int?>("--samples") { Description = "Number of samples (instead of --duration-ns)." };
        var pre = new Option<double?>("--pre-trigger-ns") { Description = "Time recorded before the incident edge, ns. Default: max(5 ns, 5 rise times)." };
        var source = new Option<double>("--source-ohms") { Description = "Source impedance of the instrument, Ω.", DefaultValueFactory = _ => 50 };
        var amplitude = new Option<double>("--amplitude-v") { Description = "Incident step into a load equal to the source impedance, V.", DefaultValueFactory = _ => 1 };
        var noise = new Option<double>("--noise-mv") { Description = "RMS of white noise added to each sample, mV.", DefaultValueFactory = _ => 0 };
        var seed = new Option<int>("--seed") { Description = "Seed for the noise, so the trace is repeatable.", DefaultValueFactory = _ => 1 };
        var edge = new Option<string>("--edge") { Description = "Edge shape: gaussian (error-function step) or linear (ramp).", DefaultValueFactory = _ => "gaussian" }
            .AcceptOnlyFromAmong("gaussian", "linear");
        var png = CommonOptions.Png("a plot of the trace against distance");
        var svg = CommonOptions.Svg("a plot of the trace against distance");
        var units = CommonOptions.Units();
        var cables = CommonOptions.CableFile();
        var s1p = new Option<FileInfo?>("--s1p") { Description = "Also write the run's S11 as a Touchstone one-port file (what a vector network analyser would measure)." };
        var fMax = new Option<double>("--f-max-mhz") { Description = "Top frequency of the --s1p sweep, MHz (harmonic grid from Δf to this).", DefaultValueFactory = _ => 3000 };
        var points = new Option<int>("--points") { Description = "Number of frequency points of the --s1p sweep.", DefaultValueFactory = _ => 1601 };
        var meta = new Option<string[]>("--meta")
        {
            Description = "Extra metadata written into the trace, as KEY=VALUE (repeatable), e.g. --meta site=\"Depot 4\".",
            AllowMultipleArgumentsPerToken = false,
        };

        var command = new Command("simulate",
            "Compute the step-response trace a reflectometer would record on a described cable run.\n\n" +
            "Example:\n  cablefault simulate traces/quillon-bay/mast-feeder.network.json -o mast.csv --png mast.png")
        {
            network, output, rise, interval, duration, samples, pre, source, amplitude, noise, seed, edge, png, svg, units, cables, meta, s1p, fMax, points,
        };
        command.SetAction(parsed =>
        {
            var library = CableOptions.Library(parsed.GetValue(cables));
            var file = parsed.GetValue(network)!;
            var run = InputFiles.Read(file, "network", (stream, name) => NetworkJson.Read(stream, name, library));

            double riseSeconds = parsed.GetValue(rise) * 1e-9;
            if (!(riseSeconds > 0)) throw new InputException($"--rise-time-ns {parsed.GetValue(rise)}: must be a positive number of nanoseconds");
            var defaults = InstrumentSettings.DefaultFor(run, riseSeconds);
            double dt = parsed.GetValue(interval) is double ps ? ps * 1e-12 : defaults.SampleIntervalSeconds;
            double preSeconds = parsed.GetValue(pre) is double preNs ? preNs * 1e-9 : defaults.PreTriggerSeconds;
            int count = parsed.GetValue(samples) ?? (parsed.GetValue(duration) is double ns
                ? SampleCountFor(preSeconds + ns * 1e-9, dt)
                : SampleCountFor(defaults.DurationSeconds, dt));

            var settings = defaults with
            {
                SampleIntervalSeconds = dt,
                SampleCount = count,
                PreTriggerSeconds = preSeconds,
                SourceImpedanceOhms = parsed.GetValue(source),
                IncidentAmplitudeVolts = parsed.GetValue(amplitude),
                NoiseRmsVolts = parsed.GetValue(noise) * 1e-3,
                NoiseSeed = parsed.GetValue(seed),
                EdgeShape = parsed.GetValue(edge) == "linear" ? EdgeShape.Linear : EdgeShape.Gaussian,
            };
            var problems = settings.Problems();
            if (problems.Count > 0) throw new InputException($"simulate settings: {string.Join("; ", problems)}");

            var trace = ForwardModel.Simulate(run, settings);
            foreach (string pair in parsed.GetValue(meta) ?? [])
            {
                int equals = pair.IndexOf('=');
                if (equals <= 0) throw new InputException($"--meta '{pair}': expected KEY=VALUE");
                string key = pair[..equals].Trim().ToLowerInvariant();
                if (key.Any(c => !(char.IsLetterOrDigit(c) || c == '_'))) throw new InputException($"--meta '{pair}': keys may hold only letters, digits and '_'");
                trace = trace.WithMetadata(key, pair[(equals + 1)..].Trim());
            }
            if (parsed.GetValue(output) is FileInfo outFile)
            {
                AtomicFile.WriteText(outFile.FullName, writer => TraceCsvWriter.Write(trace, writer));
                context.Error.WriteLine(string.Create(CultureInfo.InvariantCulture,
                    $"wrote {outFile.Name}: {trace.Length} samples every {dt * 1e12:G4} ps ({trace.DurationSeconds * 1e9:G5} ns), rise {riseSeconds * 1e9:G3} ns"));
            }
            else
            {
                TraceCsvWriter.Write(trace, context.Output);
            }

            if (parsed.GetValue(s1p) is FileInfo touchstone)
            {
                int count1 = parsed.GetValue(points);
                double top = parsed.GetValue(fMax) * 1e6;
                if (count1 < 2 || count1 > 1_000_000 || !(top > 0)) throw new InputException("--points must be 2 … 1 000 000 and --f-max-mhz positive");
                var frequencies = Enumerable.Range(1, count1).Select(k => top * k / count1).ToArray();
                double reference = settings.SourceImpedanceOhms;
                var gamma = ForwardModel.ReflectionCoefficients(run, frequencies, reference);
                var data = new FrequencyDomain.ReflectionData(frequencies, gamma, reference,
                    [$"S11 of '{run.Name}' computed by cablefault simulate (lossless and lossy segments, lumped parts)"]);
                AtomicFile.WriteText(touchstone.FullName, writer => FrequencyDomain.TouchstoneWriter.Write(data, writer));
                context.Error.WriteLine(string.Create(CultureInfo.InvariantCulture,
                    $"wrote {touchstone.Name}: {count1} points, {top / count1 / 1e6:G4} to {top / 1e6:G5} MHz, reference {reference:G4} Ω"));
            }

            var unit = DistanceUnit.Parse(parsed.GetValue(units));
            var vf = run.Run.Elements.OfType<CableSegment>().FirstOrDefault()?.Medium.VelocityFactor ?? 0.66;
            PlotOutput.Write(parsed.GetValue(png), parsed.GetValue(svg), () => TraceFigures.Simulated(trace, vf, unit, run.Name), context);
            return CliApp.Success;
        });
        return command;
    }

    private static int SampleCountFor(double spanSeconds, double dt)
    {
        double count = Math.Ceiling(spanSeconds / dt) + 1;
        if (!(count <= InstrumentSettings.MaximumSampleCount))
            throw new InputException($"that record needs {count:G3} samples, over the {InstrumentSettings.MaximumSampleCount} limit; shorten --duration-ns or raise --sample-interval-ps");
        return (int)Math.Max(2, count);
    }
}
