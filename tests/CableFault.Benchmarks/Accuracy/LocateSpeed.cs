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
/// way ProcessBenchmark times `simulate`.
/// </summary>
public static class LocateSpeed
{
    public const int Repeats = 7;

    public const int SampleCount = 32768;

    /// <summary>Median wall time of the process, s, and the in-process Locate median on the same trace, s.</summary>
    public static (double ProcessSeconds, double InProcessSeconds, int Events) Measure(string cliPath)
    {
        var medium = new CableMedium(50, 0.66);
        var network = new CableNetwork(new NetworkBranch(
            new CableSegment(20, medium), new ShuntCapacitor(8e-12), new CableSegment(15, medium), new SeriesInductor(25e-9),
            new CableSegment(3, new CableMedium(75, 0.66)), new ShuntResistor(500), new CableSegment(10, medium),
            new CableSegment(150, medium), RunEnd.Open), "speed");
        var settings = new InstrumentSettings
        {
            RiseTimeSeconds = 1e-9, SampleIntervalSeconds = 125e-12, SampleCount = SampleCount, PreTriggerSeconds = 5e-9,
            NoiseRmsVolts = 1e-3, NoiseSeed = 7,
        };
        var trace = ForwardModel.Simulate(network, settings);
        string folder = Directory.CreateTempSubdirectory("cf-acc-speed-").FullName;
        string file = Path.Combine(folder, "speed.csv");
        using (var stream = File.Create(file)) TraceCsvWriter.Write(trace, stream);

        var options = new LocateOptions { VelocityFactor = 0.66, ImpedanceOhms = 50 };
        var inProcess = new List<double>();
        int events = 0;
        for (int i = 0; i < Repeats; i++)
        {
            var watch = Stopwatch.StartNew();
            events = Locator.Locate(trace, options).Events.Count;
            inProcess.Add(watch.Elapsed.TotalSeconds);
        }

        var times = new List<double>();
        for (int i = 0; i < Repeats; i++)
        {
            var info = new ProcessStartInfo("dotnet", ["exec", cliPath, "locate", file, "--vf", "0.66", "--z0", "50", "--format", "json"])
            {
                RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false,
            };
            var watch = Stopwatch.StartNew();
            using var process = Process.Start(info)!;
            var stdout = process.StandardOutput.ReadToEndAsync();
            var stderr = process.StandardError.ReadToEndAsync();
            process.WaitForExit();
            watch.Stop();
            if (process.ExitCode != 0) throw new InvalidOperationException($"cablefault locate exited with {process.ExitCode}: {stderr.Result}");
            times.Add(watch.Elapsed.TotalSeconds);
        }
        try { Directory.Delete(folder, true); } catch (IOException) { }
        return (Median(times), Median(inProcess), events);
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
