using CableFault.Cables;
using CableFault.History;
using CableFault.Networks;
using CableFault.Simulation;
using CableFault.Traces;

namespace CableFault.Tests.History;

/// <summary>Short simulated traces (a few hundred samples, so locate stays quick) and ready-made store entries.</summary>
internal static class HistoryFixtures
{
    private static readonly CableMedium Coax = new(50, 0.66);

    /// <summary>10 m of 50 Ω coax to an open end: the run as installed.</summary>
    internal static CableNetwork Installed() =>
        new(new NetworkBranch([new CableSegment(10, Coax), RunEnd.Open]));

    /// <summary>The same run with a 10 Ω partial short (a crushed, wet section) at 6 m: ρ = −50/(2·10 + 50) ≈ −0.71.</summary>
    internal static CableNetwork Damaged() =>
        new(new NetworkBranch([new CableSegment(6, Coax), new ShuntResistor(10), new CableSegment(4, Coax), RunEnd.Open]));

    /// <summary>1 ns rise, 0.25 ns sampling, 130 ns record (one round trip of 10 m at VF 0.66 is 101 ns): 541 samples.</summary>
    internal static Trace Capture(CableNetwork network, int seed) =>
        ForwardModel.Simulate(network, new InstrumentSettings
        {
            RiseTimeSeconds = 1e-9,
            SampleIntervalSeconds = 0.25e-9,
            PreTriggerSeconds = 5e-9,
            SampleCount = 541,
            NoiseRmsVolts = 1e-4,
            NoiseSeed = seed,
        }).WithMetadata("vf", "0.66").WithMetadata("z0", "50");

    /// <summary>The trace as the CSV file an instrument would write.</summary>
    internal static byte[] CsvBytes(Trace trace)
    {
        using var stream = new MemoryStream();
        TraceCsvWriter.Write(trace, stream);
        return stream.ToArray();
    }

    /// <summary>Writes the trace as CSV into the folder and returns the path.</summary>
    internal static string WriteCsv(string folder, string name, Trace trace)
    {
        string path = Path.Combine(folder, name);
        File.WriteAllBytes(path, CsvBytes(trace));
        return path;
    }

    /// <summary>An entry for the store alone (no locate work): the settings and locate JSON are placeholders.</summary>
    internal static NewHistoryEntry Entry(string run, int seed, bool baseline = false, string? note = null, DateTimeOffset? at = null)
    {
        var trace = Capture(Installed(), seed);
        return new NewHistoryEntry
        {
            RunId = run,
            FileName = $"capture-{seed}.csv",
            OriginalBytes = CsvBytes(trace),
            Trace = trace,
            SettingsJson = """{"vf":0.66}""",
            LocateJson = """{"events":[]}""",
            Note = note,
            AddedUtc = at ?? new DateTimeOffset(2026, 3, 1, 12, 0, 0, TimeSpan.Zero).AddMinutes(seed),
            MakeBaseline = baseline,
        };
    }
}
