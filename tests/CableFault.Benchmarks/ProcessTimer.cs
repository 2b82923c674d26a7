using System.Diagnostics;

namespace CableFault.Benchmarks;

/// <summary>Wall time of one process, start to exit, with its output read and discarded.</summary>
internal static class ProcessTimer
{
    /// <summary>Seconds from starting <paramref name="program"/> with <paramref name="arguments"/> to its exit; throws
    /// with its stderr when it exits non-zero.</summary>
    internal static double WallSeconds(string program, IEnumerable<string> arguments)
    {
        var info = new ProcessStartInfo(program, arguments)
        {
            RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false,
        };
        var watch = Stopwatch.StartNew();
        using var process = Process.Start(info)!;
        var stdout = process.StandardOutput.ReadToEndAsync();
        var stderr = process.StandardError.ReadToEndAsync();
        process.WaitForExit();
        watch.Stop();
        if (process.ExitCode != 0) throw new InvalidOperationException($"{program} {string.Join(' ', arguments)} exited with {process.ExitCode}: {stderr.Result}");
        return watch.Elapsed.TotalSeconds;
    }
}
