using System.Globalization;
using CableFault.Traces;

namespace CableFault.Tests.Traces;

/// <summary>Writer output format, and write-then-read round trips of random traces (fixed seed).</summary>
public class TraceCsvRoundTripTests
{
    /// <summary>
    /// Allowed difference between a written and a re-read sample time, as a fraction of the step. The reader gets
    /// the step back as (t_last − t_first)/(n − 1) from times that carry the double rounding of start + i·step, an
    /// error of about 2.2e-16·|t|/step; with |t| at most a few thousand steps here that is below 1e-12, and 1e-10
    /// keeps a wide margin while failing on any real off-grid or unit error.
    /// </summary>
    private const double TimeToleranceInSteps = 1e-10;

    [Fact]
    public void Writer_emits_sorted_metadata_a_fixed_header_and_round_trip_numbers()
    {
        var trace = new Trace(-1e-9, 5e-10, [0, 0.1, -0.25],
            new Dictionary<string, string> { ["vf"] = "0.66", ["Run"] = "Feeder B", ["cable"] = "generic coax 50" });
        var text = new StringWriter();
        TraceCsvWriter.Write(trace, text);
        // Expected text written by hand: "R" formats 1e-9 as 1E-09 and 0.1 as 0.1 (shortest round-trip form).
        Assert.Equal(
            "# cable=generic coax 50\n# run=Feeder B\n# vf=0.66\ntime_s,volts\n-1E-09,0\n-5E-10,0.1\n0,-0.25\n",
            text.ToString());
    }

    [Theory]
    [InlineData("bad key", "x")]
    [InlineData("k=v", "x")]
    [InlineData("note", "two\nlines")]
    [InlineData("note", " padded")]
    public void Writer_refuses_metadata_the_format_cannot_carry(string key, string value)
    {
        var trace = new Trace(0, 1e-9, [0, 1], new Dictionary<string, string> { [key] = value });
        Assert.Throws<ArgumentException>(() => TraceCsvWriter.Write(trace, new StringWriter()));
    }

    [Fact]
    public void Random_traces_survive_write_then_read()
    {
        var random = new Random(20310401);
        for (int trial = 0; trial < 200; trial++)
        {
            var original = RandomTrace(random);
            var bytes = new MemoryStream();
            TraceCsvWriter.Write(original, bytes);
            bytes.Position = 0;
            var result = TraceCsvReader.ReadWithWarnings(bytes, $"trial{trial}.csv");
            var read = result.Trace;

            Assert.Empty(result.Warnings);
            Assert.Equal(original.Length, read.Length);
            for (int i = 0; i < original.Length; i++)
                Assert.Equal(BitConverter.DoubleToInt64Bits(original.SamplesVolts[i]), BitConverter.DoubleToInt64Bits(read.SamplesVolts[i]));
            Assert.Equal(original.StartTimeSeconds, read.StartTimeSeconds);
            for (int i = 0; i < original.Length; i++)
                Assert.True(Math.Abs(original.TimeAt(i) - read.TimeAt(i)) <= TimeToleranceInSteps * original.SampleIntervalSeconds,
                    $"trial {trial}, sample {i}: {original.TimeAt(i):R} vs {read.TimeAt(i):R}");
            Assert.Equal(original.Metadata.OrderBy(kv => kv.Key), read.Metadata.OrderBy(kv => kv.Key));
        }
    }

    private static Trace RandomTrace(Random random)
    {
        int n = random.Next(2, 400);
        double step = Math.Pow(10, -13 + 5 * random.NextDouble());          // 0.1 ps .. 10 ns
        double start = step * (4000 * random.NextDouble() - 2000);           // pre-trigger or delayed start
        var samples = new double[n];
        for (int i = 0; i < n; i++)
        {
            samples[i] = random.Next(20) switch
            {
                0 => 0.0,
                1 => -0.0,
                2 => random.Next(-5, 6),                                     // whole volts
                _ => (2 * random.NextDouble() - 1) * Math.Pow(10, -6 + 9 * random.NextDouble()), // 1 µV .. 1 kV
            };
        }
        var metadata = new Dictionary<string, string>();
        if (random.Next(2) == 0) metadata["vf"] = (0.5 + 0.5 * random.NextDouble()).ToString("R", CultureInfo.InvariantCulture);
        if (random.Next(2) == 0) metadata["z0"] = random.Next(25, 200).ToString(CultureInfo.InvariantCulture);
        if (random.Next(2) == 0) metadata["rise_s"] = (1e-10 * (1 + random.NextDouble())).ToString("R", CultureInfo.InvariantCulture);
        int extra = random.Next(4);
        for (int k = 0; k < extra; k++) metadata[RandomKey(random)] = RandomValue(random);
        return new Trace(start, step, samples, metadata);
    }

    private static string RandomKey(Random random)
    {
        const string first = "abcdefghijklmnopqrstuvwxyz_";
        const string rest = "abcdefghijklmnopqrstuvwxyz0123456789_.-";
        var chars = new char[random.Next(1, 12)];
        chars[0] = first[random.Next(first.Length)];
        for (int i = 1; i < chars.Length; i++) chars[i] = rest[random.Next(rest.Length)];
        return new string(chars);
    }

    private static string RandomValue(Random random)
    {
        // Anything a value may hold, including '=', '#', ',' and non-ASCII; no line breaks or edge spaces.
        const string alphabet = "abcXYZ019 =#,;\t.-+éΩ±µ";
        var chars = new char[random.Next(0, 20)];
        for (int i = 0; i < chars.Length; i++) chars[i] = alphabet[random.Next(alphabet.Length)];
        return new string(chars).Trim();
    }
}
