using System.Numerics;
using System.Text;
using CableFault.Cables;
using CableFault.FrequencyDomain;
using CableFault.Networks;
using CableFault.Simulation;
using CableFault.Tests.Cli;
using CableFault.Traces;

namespace CableFault.Tests.Hardening;

/// <summary>
/// Seeded random mutations of valid files fed to the readers: every case must end in success (with a sane result) or
/// an <see cref="InputException"/> — never another exception, a hang or runaway memory. The case counts are fixed;
/// a failure names the seed, and <see cref="FuzzMutator.Mutate"/> with that seed reproduces the file.
/// </summary>
public class ReaderFuzzTests
{
    private const int CsvCases = 12_000;
    private const int TouchstoneCases = 12_000;
    private const int TouchstoneTransformCases = 2_000;
    private const int NetworkCases = 12_000;
    private const int NetworkSimulateEvery = 20;
    private const int CliCases = 150;

    [Fact]
    public void Trace_csv_reader_survives_mutations()
    {
        var bases = FuzzBases.TraceCsv();
        FuzzHarness.Run("trace CSV", 1_000_000, CsvCases, seed =>
        {
            byte[] bytes = FuzzMutator.Mutate(bases[seed % bases.Count], seed);
            var trace = TraceCsvReader.Read(new MemoryStream(bytes), "fuzz.csv");
            Assert.True(trace.Length >= 2, $"seed {seed}: {trace.Length} samples accepted");
            Assert.True(double.IsFinite(trace.SampleIntervalSeconds) && trace.SampleIntervalSeconds > 0, $"seed {seed}: interval {trace.SampleIntervalSeconds}");
            Assert.True(double.IsFinite(trace.StartTimeSeconds), $"seed {seed}: start {trace.StartTimeSeconds}");
            Assert.True(trace.SamplesVolts.All(double.IsFinite), $"seed {seed}: a non-finite sample was accepted");
        });
    }

    [Fact]
    public void Touchstone_reader_survives_mutations()
    {
        var bases = FuzzBases.Touchstone();
        FuzzHarness.Run("Touchstone", 2_000_000, TouchstoneCases, seed =>
        {
            var (name, original) = bases[seed % bases.Count];
            byte[] bytes = FuzzMutator.Mutate(original, seed);
            var data = TouchstoneReader.Read(new StreamReader(new MemoryStream(bytes)), name);
            Assert.True(data.Count >= 1, $"seed {seed}: no points accepted");
            for (int i = 0; i < data.Count; i++)
            {
                Assert.True(double.IsFinite(data.FrequenciesHz[i]) && data.FrequenciesHz[i] >= 0, $"seed {seed}: frequency {data.FrequenciesHz[i]}");
                if (i > 0) Assert.True(data.FrequenciesHz[i] > data.FrequenciesHz[i - 1], $"seed {seed}: frequencies not increasing");
                Complex g = data.ReflectionCoefficients[i];
                Assert.True(double.IsFinite(g.Real) && double.IsFinite(g.Imaginary), $"seed {seed}: Γ {g}");
            }
        });
    }

    [Fact]
    public void Touchstone_to_trace_survives_mutations()
    {
        var bases = FuzzBases.Touchstone();
        FuzzHarness.Run("Touchstone transform", 3_000_000, TouchstoneTransformCases, seed =>
        {
            var (name, original) = bases[seed % bases.Count];
            byte[] bytes = FuzzMutator.Mutate(original, seed);
            var loaded = TouchstoneTraceLoader.Load(new StreamReader(new MemoryStream(bytes)), name);
            Assert.True(loaded.Trace.Length >= 2, $"seed {seed}: {loaded.Trace.Length} samples");
            Assert.True(loaded.Trace.SamplesVolts.All(double.IsFinite), $"seed {seed}: a non-finite sample in the step response");
        });
    }

    [Fact]
    public void Network_reader_survives_mutations()
    {
        var bases = FuzzBases.Networks();
        var settings = new InstrumentSettings { RiseTimeSeconds = 1e-9, SampleIntervalSeconds = 0.125e-9, SampleCount = 256, PreTriggerSeconds = 5e-9 };
        FuzzHarness.Run("network JSON", 4_000_000, NetworkCases, seed =>
        {
            byte[] bytes = FuzzMutator.Mutate(bases[seed % bases.Count], seed);
            var network = NetworkJson.Read(new MemoryStream(bytes), "fuzz.json", CableLibrary.BuiltIn);
            Assert.Empty(network.Problems());
            if (seed % NetworkSimulateEvery == 0)
            {
                var trace = ForwardModel.Simulate(network, settings);
                Assert.True(trace.SamplesVolts.All(double.IsFinite), $"seed {seed}: the simulated trace has a non-finite sample");
            }
        });
    }

    [Fact]
    public void Cli_survives_mutated_files_with_exit_code_0_or_2()
    {
        string folder = Directory.CreateTempSubdirectory("cf-fuzz-").FullName;
        try
        {
            var csv = FuzzBases.TraceCsv();
            var touchstone = FuzzBases.Touchstone();
            var networks = FuzzBases.Networks();
            string output = Path.Combine(folder, "out.csv");
            FuzzHarness.Run("CLI", 5_000_000, CliCases, seed =>
            {
                string[] args;
                string name;
                switch (seed % 3)
                {
                    case 0:
                        name = "trace.csv";
                        File.WriteAllBytes(Path.Combine(folder, name), FuzzMutator.Mutate(csv[seed % csv.Count], seed));
                        args = ["convert", Path.Combine(folder, name), "-o", output];
                        break;
                    case 1:
                        var (baseName, bytes) = touchstone[seed % touchstone.Count];
                        name = "vna" + Path.GetExtension(baseName);
                        File.WriteAllBytes(Path.Combine(folder, name), FuzzMutator.Mutate(bytes, seed));
                        args = ["convert", Path.Combine(folder, name), "-o", output];
                        break;
                    default:
                        name = "run.json";
                        File.WriteAllBytes(Path.Combine(folder, name), FuzzMutator.Mutate(networks[seed % networks.Count], seed));
                        args = ["simulate", Path.Combine(folder, name), "--samples", "256", "-o", output];
                        break;
                }
                var result = CliRunner.Run(args);
                Assert.True(result.ExitCode is 0 or 2, $"seed {seed}: exit code {result.ExitCode}: {result.Error}");
                if (result.ExitCode == 2)
                {
                    var lines = result.Error.Split('\n', StringSplitOptions.RemoveEmptyEntries).Where(l => !l.StartsWith("warning:", StringComparison.Ordinal)).ToList();
                    Assert.True(lines.Count == 1, $"seed {seed}: {lines.Count} error lines: {result.Error}");
                    Assert.DoesNotContain("   at ", result.Error);
                    Assert.Contains(name, result.Error);
                }
            });
        }
        finally
        {
            Directory.Delete(folder, recursive: true);
        }
    }
}

/// <summary>The valid files the fuzz cases start from (small, so that each case is cheap).</summary>
internal static class FuzzBases
{
    internal static IReadOnlyList<byte[]> TraceCsv()
    {
        var samples = Enumerable.Range(0, 48).Select(i => i < 8 ? 0.0 : i < 30 ? 0.5 : 0.97).ToArray();
        var trace = new Trace(-1e-9, 0.125e-9, samples, new Dictionary<string, string> { ["vf"] = "0.66", ["z0"] = "50", ["run"] = "fuzz" });
        var written = new StringWriter();
        TraceCsvWriter.Write(trace, written);
        string handMade = "Invented instrument export\n# cable=RG-58\ntime (ns);CH1 (mV)\n" +
            string.Join("\n", Enumerable.Range(0, 40).Select(i => $"{i * 0.25:0.00};{(i < 10 ? 0 : 480 + i):0.0}".Replace('.', ','))) + "\n";
        return [Encoding.UTF8.GetBytes(written.ToString()), Encoding.UTF8.GetBytes(handMade)];
    }

    internal static IReadOnlyList<(string Name, byte[] Bytes)> Touchstone()
    {
        var frequencies = Enumerable.Range(1, 16).Select(k => k * 50e6).ToArray();
        var gamma = frequencies.Select(f => Complex.FromPolarCoordinates(0.3, -2 * Math.PI * f * 40e-9)).ToArray();
        var data = new ReflectionData(frequencies, gamma, 50, ["invented fuzz base"]);
        var list = new List<(string, byte[])>();
        foreach (var format in new[] { TouchstoneDataFormat.RealImaginary, TouchstoneDataFormat.MagnitudeAngle, TouchstoneDataFormat.DecibelAngle })
        {
            var writer = new StringWriter();
            TouchstoneWriter.Write(data, writer, format);
            list.Add(("fuzz.s1p", Encoding.UTF8.GetBytes(writer.ToString())));
        }
        string reference = Path.Combine(AppContext.BaseDirectory, "Reference", "Touchstone");
        list.Add(("fuzz.s1p", File.ReadAllBytes(Path.Combine(reference, "load-v2.s1p"))));
        list.Add(("fuzz.s2p", File.ReadAllBytes(Path.Combine(reference, "pad-v1.s2p"))));
        return list;
    }

    internal static IReadOnlyList<byte[]> Networks()
    {
        string[] texts =
        [
            """{ "name": "fuzz", "run": [ { "type": "segment", "length_m": 12, "cable": "RG-58" }, { "type": "shunt_c", "capacitance_pf": 20 }, { "type": "segment", "length_m": 8, "cable": "RG-58" }, { "type": "end", "end": "open" } ] }""",
            """{ "name": "fuzz-y", "cables": [ { "designation": "MY-COAX", "z0_ohms": 75, "vf": 0.8 } ], "run": [ { "type": "segment", "length_ft": 30, "cable": "MY-COAX" }, { "type": "junction", "branches": [ [ { "type": "segment", "length_m": 5, "z0_ohms": 50, "vf": 0.7 }, { "type": "end", "end": "short" } ], [ { "type": "segment", "length_m": 7, "z0_ohms": 50, "vf": 0.7, "loss": [ { "mhz": 100, "db_per_100m": 7 } ] }, { "type": "end", "end": "rc", "resistance_ohms": 75, "capacitance_pf": 10 } ] ] } ] }""",
            """{ "run": [ { "type": "segment", "length_m": 3, "cable": "RG-213", "label": "launch" }, { "type": "series_l", "inductance_nh": 15 }, { "type": "shunt_r", "resistance_ohms": 400 }, { "type": "series_r", "resistance_ohms": 2 }, { "type": "segment", "length_m": 20, "cable": "RG-213" }, { "type": "end", "end": "resistor", "resistance_ohms": 75 } ] }""",
        ];
        return texts.Select(t => Encoding.UTF8.GetBytes(t.Replace(", {", ",\n{"))).ToList();
    }
}
