using System.Diagnostics;
using CableFault.Analysis;
using CableFault.Cables;
using CableFault.Networks;
using CableFault.Simulation;
using CableFault.Traces;
using Trace = CableFault.Traces.Trace;

namespace CableFault.Benchmarks.Accuracy;

/// <summary>
/// Speed target (issue: locate): `cablefault locate` on a 32 768-sample trace, whole process (start-up, reading, analysis,
/// output), median of <see cref="Repeats"/> runs of the Release-built CLI dll, ≤ 0.5 s on these 2-core machines. Timed the
/// way ProcessBenchmark times `simulate`. The stated trace is the first of <see cref="Scenarios"/>; the others (a lossy
/// feeder, a short drop with a tap, a plain open) show how far one trace's time is from the typical one: the model
/// selection's path, and so its cost, changes from trace to trace.
/// </summary>
public static class LocateSpeed
{
    public const int Repeats = 7;

    public const int SampleCount = 32768;

    /// <summary>One timed trace: its name, network, instrument and the CLI's cable arguments.</summary>
    private sealed record Scenario(string Name, CableNetwork Network, double RiseSeconds, double IntervalSeconds, string[] CableArguments,
        LocateOptions Options);

    private static IReadOnlyList<Scenario> Scenarios()
    {
        var medium = new CableMedium(50, 0.66);
        var rg213 = CableLibrary.BuiltIn.Get("RG-213").Medium;
        var coax75 = new CableMedium(75, 0.82);
        return
        [
            new("stated: C, L, 3 m of 75 Ω, 500 Ω leak, open at 198 m", new CableNetwork(new NetworkBranch(
                new CableSegment(20, medium), new ShuntCapacitor(8e-12), new CableSegment(15, medium), new SeriesInductor(25e-9),
                new CableSegment(3, new CableMedium(75, 0.66)), new ShuntResistor(500), new CableSegment(10, medium),
                new CableSegment(150, medium), RunEnd.Open), "speed"), 1e-9, 125e-12, ["--vf", "0.66", "--z0", "50"],
                new LocateOptions { VelocityFactor = 0.66, ImpedanceOhms = 50 }),
            new("lossy RG-213 feeder: 4 Ω splice at 80 m, 4 m wet (40 Ω) at 150 m, short at 240 m", new CableNetwork(new NetworkBranch(
                new CableSegment(80, rg213), new SeriesResistor(4), new CableSegment(70, rg213),
                new CableSegment(4, new CableMedium(40, 0.66, rg213.Loss)), new CableSegment(86, rg213), RunEnd.Short), "feeder"),
                1e-9, 100e-12, ["--cable", "RG-213"],
                new LocateOptions { VelocityFactor = 0.66, ImpedanceOhms = 50, Loss = rg213.Loss }),
            new("75 Ω drop: tap (1.5 m open branch) at 25 m, 5 pF at 40 m, open at 60 m", new CableNetwork(new NetworkBranch(
                new CableSegment(25, coax75), new Junction([
                    new NetworkBranch(new CableSegment(15, coax75), new ShuntCapacitor(5e-12), new CableSegment(20, coax75), RunEnd.Open),
                    new NetworkBranch(new CableSegment(1.5, coax75), RunEnd.Open)])), "drop"),
                0.3e-9, 25e-12, ["--vf", "0.82", "--z0", "75"], new LocateOptions { VelocityFactor = 0.82, ImpedanceOhms = 75 }),
            new("plain 120 m of 50 Ω to an open", new CableNetwork(new NetworkBranch(new CableSegment(120, medium), RunEnd.Open), "plain"),
                1e-9, 125e-12, ["--vf", "0.66", "--z0", "50"], new LocateOptions { VelocityFactor = 0.66, ImpedanceOhms = 50 }),
        ];
    }

    /// <summary>Per trace: its name, the process median, s, the in-process Locate median, s, the events found, and the
    /// native executable's process median, s (null when none was given).</summary>
    public sealed record TraceSpeed(string Name, double ProcessSeconds, double InProcessSeconds, int Events, double? NativeSeconds);

    /// <summary>Each scenario's medians, and the medians over every process run of them all, s (the native one null when
    /// <paramref name="nativePath"/>, a natively compiled cablefault executable, is not given).</summary>
    public static (IReadOnlyList<TraceSpeed> Traces, double AllProcessSeconds, double? AllNativeSeconds) Measure(string cliPath, string? nativePath)
    {
        var allNative = new List<double>();
        string folder = Directory.CreateTempSubdirectory("cf-acc-speed-").FullName;
        var all = new List<double>();
        var traces = new List<TraceSpeed>();
        try
        {
            foreach (var scenario in Scenarios())
            {
                var (trace, file) = WriteTrace(scenario, folder);

                var inProcess = new List<double>();
                int events = 0;
                for (int i = 0; i < Repeats; i++)
                {
                    var watch = Stopwatch.StartNew();
                    events = Locator.Locate(trace, scenario.Options).Events.Count;
                    inProcess.Add(watch.Elapsed.TotalSeconds);
                }
                var times = new List<double>();
                var native = new List<double>();
                string[] locate = ["locate", file, .. scenario.CableArguments, "--format", "json"];
                for (int i = 0; i < Repeats; i++)
                {
                    // Interleaved, so that both builds see the same machine load.
                    times.Add(ProcessTimer.WallSeconds("dotnet", ["exec", cliPath, .. locate]));
                    if (nativePath is not null) native.Add(ProcessTimer.WallSeconds(nativePath, locate));
                }
                all.AddRange(times);
                allNative.AddRange(native);
                traces.Add(new TraceSpeed(scenario.Name, Median(times), Median(inProcess), events, native.Count > 0 ? Median(native) : null));
            }
        }
        finally
        {
            try { Directory.Delete(folder, true); } catch (IOException) { }
        }
        return (traces, Median(all), allNative.Count > 0 ? Median(allNative) : null);
    }

    /// <summary>Simulates a scenario's trace and writes it as CSV into <paramref name="folder"/>.</summary>
    private static (Trace Trace, string File) WriteTrace(Scenario scenario, string folder)
    {
        var settings = new InstrumentSettings
        {
            RiseTimeSeconds = scenario.RiseSeconds, SampleIntervalSeconds = scenario.IntervalSeconds, SampleCount = SampleCount,
            PreTriggerSeconds = 5e-9, NoiseRmsVolts = 1e-3, NoiseSeed = 7,
        };
        var trace = ForwardModel.Simulate(scenario.Network, settings);
        string file = Path.Combine(folder, scenario.Network.Name + ".csv");
        using (var stream = File.Create(file)) TraceCsvWriter.Write(trace, stream);
        return (trace, file);
    }

    /// <summary>Writes the timed traces into <paramref name="folder"/> (for profiling one by hand) and prints each
    /// file with its CLI cable arguments.</summary>
    public static void WriteTraces(string folder)
    {
        Directory.CreateDirectory(folder);
        foreach (var scenario in Scenarios())
        {
            var (_, file) = WriteTrace(scenario, folder);
            Console.WriteLine($"{file} {string.Join(' ', scenario.CableArguments)}   # {scenario.Name}");
        }
    }

    private static double Median(List<double> values)
    {
        values.Sort();
        return values[values.Count / 2];
    }

    /// <summary>cablefault.dll beside this benchmark (the project references the CLI, so a Release benchmark build
    /// carries a Release CLI).</summary>
    public static string? FindCli()
    {
        string beside = Path.Combine(AppContext.BaseDirectory, "cablefault.dll");
        return File.Exists(beside) && File.Exists(Path.Combine(AppContext.BaseDirectory, "cablefault.runtimeconfig.json")) ? beside : null;
    }
}
