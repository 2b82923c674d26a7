using System.Globalization;
using System.Text;
using CableFault.Simulation;
using CableFault.Traces;
using CableFault.Traces.Csv;

namespace CableFault.Tests.Traces;

/// <summary>
/// A long record's rows are parsed in batches, side by side, and then checked and kept in file order. Whatever the
/// batching, every printed number must come back as the double it was printed from (round-trip formatting, .NET's "R"),
/// comments between rows must still be read as metadata, and a bad row must be the one reported, with its line, even
/// when it lies deep inside a batch or before the point where the input was refused.
/// </summary>
public class TraceCsvLongRecordTests
{
    private const int Rows = 20_000;

    /// <summary>Rows of time (ns, 25 ps apart, from −5 ns) and a noisy value, printed round-trip; line 1 is the header.</summary>
    private static (string Text, double[] Values) Record(Func<int, string?>? replaceRow = null, string? commentAfterRow = null, int commentRow = -1)
    {
        var random = new Random(2024);
        var values = new double[Rows];
        var text = new StringBuilder("time_ns,volts\n");
        for (int i = 0; i < Rows; i++)
        {
            values[i] = (i > Rows / 3 ? 0.8 : 0) + 1e-3 * (random.NextDouble() - 0.5) * Math.PI;
            string row = (-5 + i * 0.025).ToString("0.###", CultureInfo.InvariantCulture) + "," + values[i].ToString("R", CultureInfo.InvariantCulture);
            text.Append(replaceRow?.Invoke(i) ?? row).Append('\n');
            if (i == commentRow) text.Append(commentAfterRow).Append('\n');
        }
        return (text.ToString(), values);
    }

    [Fact]
    public void EveryPrintedValueComesBackAsTheDoubleItWasPrintedFrom()
    {
        var (text, values) = Record();
        var result = TraceCsvReader.ReadWithWarnings(new StringReader(text), "long.csv");
        Assert.Equal(Rows, result.Trace.Length);
        Assert.True(result.Trace.SamplesVolts.SequenceEqual(values), "a parsed value differs from the printed double");
        Assert.Equal(-5e-9, result.Trace.StartTimeSeconds, 1e-18);
        Assert.Equal(25e-12, result.Trace.SampleIntervalSeconds, 1e-18);
        Assert.Empty(result.Warnings);
        // One pass on this thread (as work beside other work reads) gives the same samples.
        Trace single;
        using (BinSplitting.SideBySide()) single = TraceCsvReader.Read(new StringReader(text), "long.csv");
        Assert.True(single.SamplesVolts.SequenceEqual(result.Trace.SamplesVolts));
    }

    [Fact]
    public void MetadataBetweenRowsIsRead()
    {
        var (text, values) = Record(commentAfterRow: "# vf=0.71", commentRow: 12_345);
        var trace = TraceCsvReader.Read(new StringReader(text), "long.csv");
        Assert.Equal("0.71", trace.Metadata["vf"]);
        Assert.True(trace.SamplesVolts.SequenceEqual(values));
    }

    [Theory]
    [InlineData(9_000, "abc,1", "line 9002: ")]
    [InlineData(15_001, "0.5,1", "line 15003: ")]
    [InlineData(17_777, "3,4,5", "line 17779: ")]
    public void ABadRowDeepInALongRecordIsTheOneReported(int row, string replacement, string expectedLine)
    {
        var (text, _) = Record(i => i == row ? replacement : null);
        var error = Assert.Throws<InputException>(() => TraceCsvReader.Read(new StringReader(text), "long.csv"));
        Assert.StartsWith("long.csv: " + expectedLine, error.Message);
    }

    [Fact]
    public void ABadRowBeforeTheSizeLimitIsReportedRatherThanTheLimit()
    {
        var (text, _) = Record(i => i == 18_000 ? "x,1" : null);
        // The limit falls after the bad row, within the batch that holds it.
        var limits = new TraceCsvLimits(text.Length - 1_000, TraceCsvReader.MaxSamples, TraceCsvReader.MaxLineChars);
        var error = Assert.Throws<InputException>(() => TraceCsvReader.ReadWithWarnings(new StringReader(text), "long.csv", limits));
        Assert.StartsWith("long.csv: line 18002: ", error.Message);
    }
}
