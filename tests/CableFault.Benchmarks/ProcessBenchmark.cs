using System.Diagnostics;
using System.Globalization;

namespace CableFault.Benchmarks;

/// <summary>
/// Target (issue: Foundation): whole-process `cablefault simulate` is at least 20× faster than ngspice on the same
/// network, time span and step. Both are started as processes the same way, several times, and the medians compared.
/// The network is lossless here so that ngspice's ideal line (T element) models exactly the same thing.
/// </summary>
public static class ProcessBenchmark
{
    private const int Repeats = 9;

    public static int Run(string[] args)
    {
        string? native = null;
        int nativeAt = Array.IndexOf(args, "--native");
        if (nativeAt >= 0 && nativeAt + 1 < args.Length)
        {
            native = args[nativeAt + 1];
            args = args.Where((_, i) => i != nativeAt && i != nativeAt + 1).ToArray();
        }
        string? cli = args.FirstOrDefault() ?? FindCli();
        if (cli is null || !File.Exists(cli))
        {
            Console.Error.WriteLine("process benchmark: give the path of cablefault.dll (build src/CableFault.Cli -c Release first)");
            return 2;
        }
        string folder = Directory.CreateTempSubdirectory("cf-bench-").FullName;
        string network = Path.Combine(folder, "run.network.json");
        File.WriteAllText(network, NetworkJson);
        string netlist = Path.Combine(folder, "run.cir");
        File.WriteAllText(netlist, Netlist);

        // Same span and step: 1 ns Gaussian-like edge, 125 ps sampling, 1 µs.
        string simulateArguments = $"simulate \"{network}\" -o \"{Path.Combine(folder, "out.csv")}\" --rise-time-ns 1 --sample-interval-ps 125 --duration-ns 1000";
        var ours = Time(() => Start("dotnet", $"\"{cli}\" {simulateArguments}"));
        Console.WriteLine($"cablefault simulate (dotnet, JIT):  median {ours:F3} s over {Repeats} runs");
        double? oursNative = null;
        if (native is not null && File.Exists(native))
        {
            oursNative = Time(() => Start(native, simulateArguments));
            Console.WriteLine($"cablefault simulate (native AOT):   median {oursNative:F3} s over {Repeats} runs");
        }
        if (!OnPath("ngspice"))
        {
            Console.WriteLine("ngspice not found on PATH: install it (apt-get install ngspice) for the ratio");
            return 0;
        }
        var theirs = Time(() => Start("ngspice", $"-b \"{netlist}\"", folder));
        Console.WriteLine($"ngspice -b:           median {theirs:F3} s over {Repeats} runs");
        Console.WriteLine($"ratio ngspice / cablefault (JIT)    = {theirs / ours:F1}× (target ≥ 20×)");
        if (oursNative is double n) Console.WriteLine($"ratio ngspice / cablefault (native) = {theirs / n:F1}× (target ≥ 20×)");
        return 0;
    }

    private static double Time(Func<Process> start)
    {
        var times = new List<double>();
        for (int i = 0; i < Repeats; i++)
        {
            var watch = Stopwatch.StartNew();
            using var process = start();
            process.WaitForExit();
            watch.Stop();
            if (process.ExitCode != 0) throw new InvalidOperationException($"{process.StartInfo.FileName} exited with {process.ExitCode}: {process.StandardError.ReadToEnd()}");
            times.Add(watch.Elapsed.TotalSeconds);
        }
        times.Sort();
        return times[times.Count / 2];
    }

    private static Process Start(string file, string arguments, string? workingDirectory = null)
    {
        var info = new ProcessStartInfo(file, arguments) { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        if (workingDirectory is not null) info.WorkingDirectory = workingDirectory;
        var process = Process.Start(info)!;
        process.StandardOutput.ReadToEndAsync();
        return process;
    }

    private static bool OnPath(string name) =>
        (Environment.GetEnvironmentVariable("PATH") ?? "").Split(':').Any(dir => File.Exists(Path.Combine(dir, name)));

    private static string? FindCli()
    {
        var dir = new DirectoryInfo(AppContext.BaseDirectory);
        while (dir is not null && !File.Exists(Path.Combine(dir.FullName, "CableFault.sln"))) dir = dir.Parent;
        if (dir is null) return null;
        return Directory.EnumerateFiles(Path.Combine(dir.FullName, "src", "CableFault.Cli", "bin"), "cablefault.dll", SearchOption.AllDirectories)
            .OrderByDescending(File.GetLastWriteTimeUtc).FirstOrDefault();
    }

    // 20 m + 15 m + 3 m (75 Ω) + 10 m, shunt C 8 pF, series L 25 nH, shunt R 500 Ω, Y split 12 m open / 7 m 100 Ω; VF 0.66.
    private const string NetworkJson = """
    { "name": "benchmark", "run": [
      { "type": "segment", "length_m": 20, "z0_ohms": 50, "vf": 0.66 },
      { "type": "shunt_c", "capacitance_pf": 8 },
      { "type": "segment", "length_m": 15, "z0_ohms": 50, "vf": 0.66 },
      { "type": "series_l", "inductance_nh": 25 },
      { "type": "segment", "length_m": 3, "z0_ohms": 75, "vf": 0.66 },
      { "type": "shunt_r", "resistance_ohms": 500 },
      { "type": "segment", "length_m": 10, "z0_ohms": 50, "vf": 0.66 },
      { "type": "junction", "branches": [
        [ { "type": "segment", "length_m": 12, "z0_ohms": 50, "vf": 0.66 }, { "type": "end", "end": "open" } ],
        [ { "type": "segment", "length_m": 7, "z0_ohms": 50, "vf": 0.66 }, { "type": "end", "end": "resistor", "resistance_ohms": 100 } ] ] } ] }
    """;

    private static string Delay(double meters) => (meters / (0.66 * 299_792_458.0)).ToString("R", CultureInfo.InvariantCulture);

    private static string Netlist => $"""
    * benchmark run, same as the JSON above; 1 ns ramp, 1 us span
    VS src 0 PWL(0 0 4.375n 0 5.625n 2)
    RS src p1 50
    T1 p1 0 n1 0 Z0=50 TD={Delay(20)}
    C1 n1 0 8p
    T2 n1 0 n2 0 Z0=50 TD={Delay(15)}
    L1 n2 n3 25n
    T3 n3 0 n4 0 Z0=75 TD={Delay(3)}
    R1 n4 0 500
    T4 n4 0 n5 0 Z0=50 TD={Delay(10)}
    T5 n5 0 e1 0 Z0=50 TD={Delay(12)}
    ROPEN e1 0 1e12
    T6 n5 0 e2 0 Z0=50 TD={Delay(7)}
    R2 e2 0 100
    .tran 125p 1u 0 125p
    .control
    run
    wrdata out.txt v(p1)
    quit
    .endc
    .end
    """;
}
