using System.Diagnostics;
using System.Globalization;

namespace CableFault.Tests.Reference.Ngspice;

/// <summary>
/// Runs a netlist through ngspice in batch mode (<c>ngspice -b</c>) in a fresh temporary folder and reads the port
/// voltage the netlist writes with <c>wrdata port.txt v(port)</c>.
/// </summary>
internal static class NgspiceRunner
{
    /// <summary>Environment variable that turns a missing ngspice from a skip into a failure (CI sets it to 1).</summary>
    internal const string RequireVariable = "CABLEFAULT_REQUIRE_NGSPICE";

    /// <summary>Safety net against a hung simulator, not a performance check: the slowest netlist takes seconds.</summary>
    private static readonly TimeSpan Timeout = TimeSpan.FromMinutes(5);

    /// <summary>The ngspice executable on PATH, or null.</summary>
    internal static string? ExecutablePath { get; } = FindOnPath("ngspice");

    internal static bool IsRequired => Environment.GetEnvironmentVariable(RequireVariable) == "1";

    private static string? FindOnPath(string name)
    {
        foreach (string dir in (Environment.GetEnvironmentVariable("PATH") ?? "").Split(Path.PathSeparator, StringSplitOptions.RemoveEmptyEntries))
        {
            string candidate = Path.Combine(dir, name);
            if (File.Exists(candidate)) return candidate;
        }
        return null;
    }

    /// <summary>Simulates the netlist; returns ngspice's own time points and v(port) there.</summary>
    internal static (double[] TimesSeconds, double[] Volts) Run(string netlistPath)
    {
        if (ExecutablePath is null)
            throw new InvalidOperationException($"ngspice is not on PATH but {RequireVariable}=1 requires it (Debian: apt-get install ngspice).");
        string folder = Path.Combine(Path.GetTempPath(), "cablefault-ngspice-" + Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(folder);
        try
        {
            string netlist = Path.Combine(folder, Path.GetFileName(netlistPath));
            File.Copy(netlistPath, netlist);
            var start = new ProcessStartInfo(ExecutablePath, new[] { "-b", Path.GetFileName(netlist) })
            {
                WorkingDirectory = folder,
                RedirectStandardOutput = true,
                RedirectStandardError = true,
                UseShellExecute = false,
            };
            using var process = Process.Start(start) ?? throw new InvalidOperationException("could not start ngspice");
            var stdout = process.StandardOutput.ReadToEndAsync();
            var stderr = process.StandardError.ReadToEndAsync();
            if (!process.WaitForExit(Timeout))
            {
                process.Kill(entireProcessTree: true);
                throw new TimeoutException($"ngspice did not finish {Path.GetFileName(netlistPath)} within {Timeout.TotalMinutes} minutes");
            }
            process.WaitForExit();
            string output = Path.Combine(folder, "port.txt");
            if (process.ExitCode != 0 || !File.Exists(output))
                throw new InvalidOperationException($"ngspice failed on {Path.GetFileName(netlistPath)} (exit {process.ExitCode}):\n{stdout.Result}\n{stderr.Result}");
            return Parse(File.ReadLines(output));
        }
        finally
        {
            try { Directory.Delete(folder, recursive: true); } catch (IOException) { }
        }
    }

    /// <summary>
    /// Reads whitespace-separated "time value" rows; lines that are not two numbers (the vector-name header) are skipped,
    /// and a time that does not increase (ngspice can repeat a breakpoint) is dropped so the result can be interpolated.
    /// </summary>
    internal static (double[] TimesSeconds, double[] Volts) Parse(IEnumerable<string> lines)
    {
        var times = new List<double>();
        var volts = new List<double>();
        foreach (string line in lines)
        {
            string[] fields = line.Split((char[]?)null, StringSplitOptions.RemoveEmptyEntries);
            if (fields.Length < 2) continue;
            if (!double.TryParse(fields[0], NumberStyles.Float, CultureInfo.InvariantCulture, out double t)) continue;
            if (!double.TryParse(fields[1], NumberStyles.Float, CultureInfo.InvariantCulture, out double v)) continue;
            if (times.Count > 0 && t <= times[^1]) continue;
            times.Add(t);
            volts.Add(v);
        }
        if (times.Count < 2) throw new InvalidDataException("ngspice output has fewer than two data rows");
        return (times.ToArray(), volts.ToArray());
    }
}
