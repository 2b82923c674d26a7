using System.Diagnostics;
using System.Globalization;
using CableFault.Cables;
using CableFault.Networks;
using CableFault.Simulation;
using CableFault.Traces;

namespace CableFault.Benchmarks;

/// <summary>
/// Batch `cablefault locate` over a folder of simulated traces (issue: everyday use and hardening): traces per second
/// with one worker and with two, and the speed-up. Each trace is 32 768 samples (125 ps, 1 ns rise, about 4 µs: some
/// 400 m of cable round trip) of an invented run with one lumped fault and an open end, noise 1 mV, all seeded. The
/// CLI runs as a separate process, as a user would start it; its start-up (well under a second) is included.
/// Usage: batch [COUNT] [CLI.dll] — COUNT defaults to 500.
/// </summary>
public static class BatchBenchmark
{
    private const int SamplesPerTrace = 32_768;

    public static int Run(string[] args)
    {
        int count = args.Length > 0 && int.TryParse(args[0], out int n) ? n : 500;
        string? cli = args.Length > 1 ? args[1] : FindCli();
        if (cli is null || !File.Exists(cli))
        {
            Console.Error.WriteLine("batch benchmark: give the path of cablefault.dll (build src/CableFault.Cli -c Release first)");
            return 2;
        }
        string folder = Directory.CreateTempSubdirectory("cf-batch-bench-").FullName;
        try
        {
            var generate = Stopwatch.StartNew();
            for (int i = 0; i < count; i++) WriteTrace(folder, i);
            Console.WriteLine($"generated {count} traces of {SamplesPerTrace} samples in {generate.Elapsed.TotalSeconds:F1} s ({folder})");

            double one = Time(cli, folder, 1);
            Console.WriteLine(string.Create(CultureInfo.InvariantCulture, $"--jobs 1: {one:F1} s, {count / one:F3} traces/s"));
            double two = Time(cli, folder, 2);
            Console.WriteLine(string.Create(CultureInfo.InvariantCulture, $"--jobs 2: {two:F1} s, {count / two:F3} traces/s"));
            Console.WriteLine(string.Create(CultureInfo.InvariantCulture, $"speed-up 2 vs 1 workers: {one / two:F2}× on {Environment.ProcessorCount} cores"));
            return 0;
        }
        finally
        {
            Directory.Delete(folder, recursive: true);
        }
    }

    private static void WriteTrace(string folder, int index)
    {
        var random = new Random(1000 + index);
        var coax = BuiltInCableTypes.All.First(t => t.Designation == "RG-58").Medium;
        double first = 20 + 130 * random.NextDouble();
        double second = 10 + 60 * random.NextDouble();
        NetworkElement fault = random.Next(3) switch
        {
            0 => new ShuntCapacitor((5 + 40 * random.NextDouble()) * 1e-12),
            1 => new SeriesInductor((10 + 60 * random.NextDouble()) * 1e-9),
            _ => new ShuntResistor(100 + 900 * random.NextDouble()),
        };
        var network = new CableNetwork(new NetworkBranch(new CableSegment(first, coax, "RG-58"), fault, new CableSegment(second, coax, "RG-58"), RunEnd.Open), $"bench {index}");
        var settings = new InstrumentSettings
        {
            RiseTimeSeconds = 1e-9, SampleIntervalSeconds = 125e-12, SampleCount = SamplesPerTrace, PreTriggerSeconds = 5e-9,
            NoiseRmsVolts = 1e-3, NoiseSeed = index + 1,
        };
        var trace = ForwardModel.Simulate(network, settings).WithMetadata("cable", "RG-58").WithMetadata("run", $"bench {index}");
        using var writer = new StreamWriter(Path.Combine(folder, $"trace-{index:D4}.csv"));
        TraceCsvWriter.Write(trace, writer);
    }

    private static double Time(string cli, string folder, int jobs) =>
        ProcessTimer.WallSeconds("dotnet", [cli, "locate", folder, "--jobs", jobs.ToString(System.Globalization.CultureInfo.InvariantCulture), "--format", "json"]);

    private static string? FindCli()
    {
        var dir = new DirectoryInfo(AppContext.BaseDirectory);
        while (dir is not null && !File.Exists(Path.Combine(dir.FullName, "CableFault.sln"))) dir = dir.Parent;
        if (dir is null) return null;
        string release = Path.Combine(dir.FullName, "src", "CableFault.Cli", "bin", "Release", "net10.0", "cablefault.dll");
        return File.Exists(release) ? release : null;
    }
}
