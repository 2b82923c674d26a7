using System.Text;
using CableFault.Traces;

namespace CableFault.Tests.Traces;

/// <summary>
/// Accepted variants of the trace CSV (DESIGN §4). Expected values come from the literal file text written in each
/// test: unit prefixes are SI definitions (1 ns = 1e-9 s, 1 mV = 1e-3 V).
/// </summary>
public class TraceCsvReaderTests
{
    /// <summary>
    /// Relative tolerance on times and steps: the reader divides by exact powers of ten and averages the step over the
    /// record, so results are within a few units in the last place of the decimal literal (2.2e-16 each); 1e-12
    /// leaves room for that and still fails on any wrong unit or off-by-one sample.
    /// </summary>
    private const double RelativeTimeTolerance = 1e-12;

    private static TraceReadResult ReadText(string text) =>
        TraceCsvReader.ReadWithWarnings(new StringReader(text), "test.csv");

    private static void AssertClose(double expected, double actual) =>
        Assert.True(Math.Abs(expected - actual) <= RelativeTimeTolerance * Math.Abs(expected),
            $"expected {expected:R}, got {actual:R}");

    private static void AssertSamples(double[] expected, Trace trace) =>
        Assert.Equal(expected, trace.SamplesVolts.ToArray());

    [Fact]
    public void Plain_file_in_seconds_and_volts_reads_exactly_without_warnings()
    {
        var r = ReadText("time_s,volts\n-1e-9,0\n0,0.5\n1e-9,0.25\n2e-9,0.125\n");
        Assert.Empty(r.Warnings);
        Assert.Equal(-1e-9, r.Trace.StartTimeSeconds);
        AssertClose(1e-9, r.Trace.SampleIntervalSeconds);
        AssertSamples([0, 0.5, 0.25, 0.125], r.Trace);
    }

    [Theory]
    [InlineData("time_s", 1.0)]
    [InlineData("time_ns", 1e-9)]
    [InlineData("time (s)", 1.0)]
    [InlineData("Time (s)", 1.0)]
    [InlineData("time [ns]", 1e-9)]
    [InlineData("Time[ns]", 1e-9)]
    [InlineData("t_ps", 1e-12)]
    [InlineData("ps", 1e-12)]
    [InlineData("us", 1e-6)]
    [InlineData("µs", 1e-6)]
    [InlineData("t/ns", 1e-9)]
    [InlineData("\"Time (ns)\"", 1e-9)]
    [InlineData("time_ms", 1e-3)]
    public void Time_header_names_its_unit(string header, double secondsPerUnit)
    {
        var r = ReadText($"{header},volts\n0,1\n0.002,2\n0.004,3\n");
        Assert.Empty(r.Warnings);
        AssertClose(0.002 * secondsPerUnit, r.Trace.SampleIntervalSeconds);
        AssertSamples([1, 2, 3], r.Trace);
    }

    [Theory]
    [InlineData("volts", 1.0)]
    [InlineData("v", 1.0)]
    [InlineData("V", 1.0)]
    [InlineData("voltage (V)", 1.0)]
    [InlineData("mV", 1e-3)]
    [InlineData("mv", 1e-3)]
    [InlineData("voltage [mV]", 1e-3)]
    [InlineData("CH1 (mV)", 1e-3)]
    [InlineData("ch2_v", 1.0)]
    public void Voltage_header_names_its_unit(string header, double voltsPerUnit)
    {
        var r = ReadText($"time_ns,{header}\n0,250\n1,-500\n");
        Assert.Empty(r.Warnings);
        Assert.Equal(250 * voltsPerUnit, r.Trace.SamplesVolts[0], 15);
        Assert.Equal(-500 * voltsPerUnit, r.Trace.SamplesVolts[1], 15);
        Assert.Null(r.Trace.MetadataOrNull(TraceMetadataKeys.Unit));
    }

    [Theory]
    [InlineData("rho", 1.0)]
    [InlineData("Reflection coefficient", 1.0)]
    [InlineData("reflection_coefficient", 1.0)]
    [InlineData("rho (mrho)", 1e-3)]
    [InlineData("ρ", 1.0)]
    public void Reflection_coefficient_column_is_kept_dimensionless_with_unit_metadata(string header, double perUnit)
    {
        var r = ReadText($"time_ns,{header}\n0,0\n1,-333\n2,-333\n");
        Assert.Empty(r.Warnings);
        Assert.Equal("rho", r.Trace.MetadataOrNull(TraceMetadataKeys.Unit));
        Assert.Equal(-333 * perUnit, r.Trace.SamplesVolts[1], 15);
    }

    [Fact]
    public void Time_column_may_come_second()
    {
        var r = ReadText("mV,time_ns\n100,10\n200,11\n300,12\n");
        AssertClose(10e-9, r.Trace.StartTimeSeconds);
        AssertClose(1e-9, r.Trace.SampleIntervalSeconds);
        Assert.Equal(0.2, r.Trace.SamplesVolts[1], 15);
    }

    [Fact]
    public void Semicolon_with_decimal_comma_is_read()
    {
        var r = ReadText("time_ns;volts\n0,0;0,5\n0,5;1,25\n1,0;-2,5E-3\n");
        AssertClose(0.5e-9, r.Trace.SampleIntervalSeconds);
        AssertSamples([0.5, 1.25, -2.5e-3], r.Trace);
    }

    [Fact]
    public void Semicolon_with_decimal_point_is_read()
    {
        var r = ReadText("time_ns;volts\n0;0.5\n1;1.25\n");
        AssertSamples([0.5, 1.25], r.Trace);
    }

    [Fact]
    public void Tab_delimited_with_decimal_comma_is_read()
    {
        var r = ReadText("time_ns\tvolts\n0\t0,5\n1\t1,5\n");
        AssertSamples([0.5, 1.5], r.Trace);
        AssertClose(1e-9, r.Trace.SampleIntervalSeconds);
    }

    [Fact]
    public void Instrument_preamble_before_the_header_is_skipped()
    {
        const string text =
            "Model,XYZ-100\nSerial,00042\nSample Rate,10e9\nRecord Length,3\n\nTime (ns),CH1 (V)\n0,0.1\n0.1,0.2\n0.2,0.3\n";
        var r = ReadText(text);
        Assert.Empty(r.Warnings);
        AssertClose(0.1e-9, r.Trace.SampleIntervalSeconds);
        AssertSamples([0.1, 0.2, 0.3], r.Trace);
    }

    [Fact]
    public void Missing_header_assumes_seconds_and_volts_and_warns()
    {
        var r = ReadText("0,1\n1e-9,2\n2e-9,3\n");
        AssertClose(1e-9, r.Trace.SampleIntervalSeconds);
        AssertSamples([1, 2, 3], r.Trace);
        Assert.Contains(r.Warnings, w => w.Contains("no header row") && w.Contains("seconds") && w.Contains("volts"));
    }

    [Fact]
    public void Preamble_without_recognisable_header_warns_and_assumes_seconds_and_volts()
    {
        var r = ReadText("Exported by bench,unit 7\n0,1\n1e-9,2\n");
        AssertSamples([1, 2], r.Trace);
        Assert.Contains(r.Warnings, w => w.Contains("line 1: not a header"));
        Assert.Contains(r.Warnings, w => w.Contains("no header row"));
    }

    [Fact]
    public void Header_names_without_units_assume_seconds_and_volts_and_warn()
    {
        var r = ReadText("Time,Voltage\n0,1\n1e-9,2\n");
        AssertClose(1e-9, r.Trace.SampleIntervalSeconds);
        Assert.Contains(r.Warnings, w => w.Contains("line 1: column 'Time' states no unit; assumed seconds"));
        Assert.Contains(r.Warnings, w => w.Contains("line 1: column 'Voltage' states no unit; assumed volts"));
    }

    [Fact]
    public void Extra_signal_columns_are_ignored_with_a_warning()
    {
        var r = ReadText("time_ns,ch1 (mV),ch2 (mV)\n0,1,100\n1,2,200\n");
        AssertSamples([1e-3, 2e-3], r.Trace);
        Assert.Contains(r.Warnings, w => w.Contains("several signal columns"));
    }

    [Fact]
    public void Crlf_lone_cr_quotes_trailing_delimiters_and_trailing_blank_lines_are_accepted()
    {
        var crlf = ReadText("# vf=0.7\r\n\"time_ns\",\"volts\"\r\n\"0\",\"1\",\r\n\"1\",\"2\",\r\n\r\n\r\n   \r\n");
        var cr = ReadText("# vf=0.7\rtime_ns,volts\r0,1\r1,2\r");
        foreach (var r in new[] { crlf, cr })
        {
            Assert.Empty(r.Warnings);
            AssertSamples([1, 2], r.Trace);
            Assert.Equal("0.7", r.Trace.MetadataOrNull("vf"));
        }
    }

    /// <summary>
    /// A long file whose rows take every way through the reader: plain rows, quoted ones, padded ones, a trailing
    /// delimiter, and CRLF breaks, one of them split across the reader's 16 384-character block (its CR the block's last
    /// character). Each sample must be the number its row states, whichever way the row was read.
    /// </summary>
    [Fact]
    public void Rows_of_every_shape_read_as_the_numbers_they_state_across_block_boundaries()
    {
        var text = new StringBuilder("time_ns,volts\r\n");
        var expected = new List<double>();
        for (int i = 0; text.Length < 40_000; i++)
        {
            double volts = Math.Round(Math.Sin(i * 0.37), 6);
            string row = (i % 5) switch
            {
                0 => $"\"{i}\",\"{volts:R}\"",
                1 => $"  {i} ,\t{volts:R}  ",
                2 => $"{i},{volts:R},",
                _ => $"{i},{volts:R}",
            };
            // Pad one row so that its CR is the last character of the first block.
            if (text.Length < 16_384 && text.Length + row.Length + 40 > 16_384)
                row = row.PadRight(16_383 - text.Length);
            text.Append(row).Append("\r\n");
            expected.Add(volts);
        }
        Assert.Equal('\r', text[16_383]);
        var r = ReadText(text.ToString());
        Assert.Empty(r.Warnings);
        AssertSamples(expected.ToArray(), r.Trace);
        AssertClose(1e-9, r.Trace.SampleIntervalSeconds);
        // A CRLF split across the blocks is one line break: a bad row after it is reported at its own line number
        // (the header, then one line per row; blank lines would hide a doubled break but shift the number).
        var ex = Assert.Throws<InputException>(() => ReadText(text + "x,y\r\n"));
        Assert.Contains($"line {expected.Count + 2}:", ex.Message);
    }

    [Fact]
    public void Truncated_last_line_is_dropped_with_a_warning()
    {
        var r = ReadText("time_ns,volts\n0,1\n1,2\n2,3\n3\n\n");
        AssertSamples([1, 2, 3], r.Trace);
        Assert.Contains(r.Warnings, w => w.Contains("line 5: last line has only 1 of 2 columns") && w.Contains("dropped"));
    }

    [Fact]
    public void Metadata_keys_are_lower_cased_values_trimmed_and_unknown_keys_kept()
    {
        const string text =
            "# VF = 0.66 \n# Z0=75\n# cable=generic coax 75\n# Run= Mast feed B \n# site=Hilltop relay (invented)\n" +
            "# technician=A. Tester\n# date=2031-04-01\n# rise_s=2.5e-10\n# source_ohms=50\n# probe-serial.no=0007\n" +
            "# a plain remark: nothing to store\n# note: ratio a=b is prose, not metadata\n" +
            "time_ns,volts\n0,0\n1,1\n# operator_comment=written after the data\n";
        var r = ReadText(text);
        Assert.Empty(r.Warnings);
        var m = r.Trace.Metadata;
        Assert.Equal("0.66", m["vf"]);
        Assert.Equal("75", m["z0"]);
        Assert.Equal("generic coax 75", m["cable"]);
        Assert.Equal("Mast feed B", m["run"]);
        Assert.Equal("Hilltop relay (invented)", m["site"]);
        Assert.Equal("A. Tester", m["technician"]);
        Assert.Equal("2031-04-01", m["date"]);
        Assert.Equal("2.5e-10", m["rise_s"]);
        Assert.Equal("50", m["source_ohms"]);
        Assert.Equal("0007", m["probe-serial.no"]);
        Assert.Equal("written after the data", m["operator_comment"]);
        Assert.Equal(11, m.Count);
    }

    [Fact]
    public void Repeated_metadata_key_keeps_the_later_value_and_warns()
    {
        var r = ReadText("# vf=0.66\n# VF=0.70\ntime_ns,volts\n0,0\n1,1\n");
        Assert.Equal("0.70", r.Trace.MetadataOrNull("vf"));
        Assert.Contains(r.Warnings, w => w.Contains("line 2: metadata 'vf' already given on line 1"));
    }

    [Fact]
    public void Utf8_bom_is_skipped_on_both_stream_and_text_reader()
    {
        const string text = "time_ns,volts\n0,1\n1,2\n";
        var bytes = Encoding.UTF8.GetPreamble().Concat(Encoding.UTF8.GetBytes(text)).ToArray();
        var fromStream = TraceCsvReader.ReadWithWarnings(new MemoryStream(bytes), "bom.csv");
        var fromReader = TraceCsvReader.ReadWithWarnings(new StringReader("\uFEFF" + text), "bom.csv");
        foreach (var r in new[] { fromStream, fromReader })
        {
            Assert.Empty(r.Warnings);
            AssertSamples([1, 2], r.Trace);
        }
    }

    [Theory]
    [InlineData("utf-16")]      // little-endian with BOM
    [InlineData("utf-16BE")]
    [InlineData("utf-32")]
    public void Utf16_and_utf32_with_bom_are_detected(string encodingName)
    {
        var encoding = Encoding.GetEncoding(encodingName);
        const string text = "# cable=généric ±\ntime_ns;volts\n0;0,25\n1;0,5\n";
        var bytes = encoding.GetPreamble().Concat(encoding.GetBytes(text)).ToArray();
        var r = TraceCsvReader.ReadWithWarnings(new MemoryStream(bytes), "wide.csv");
        Assert.Empty(r.Warnings);
        AssertSamples([0.25, 0.5], r.Trace);
        Assert.Equal("généric ±", r.Trace.MetadataOrNull("cable"));
    }

    [Fact]
    public void Stream_overload_leaves_the_callers_stream_open()
    {
        var stream = new MemoryStream(Encoding.UTF8.GetBytes("time_ns,volts\n0,1\n1,2\n"));
        TraceCsvReader.Read(stream, "open.csv");
        Assert.True(stream.CanRead);
    }

    [Fact]
    public void Comments_between_data_rows_do_not_break_the_grid()
    {
        var r = ReadText("time_ns,volts\n0,1\n# marker\n1,2\n\n2,3\n");
        Assert.Empty(r.Warnings);
        AssertSamples([1, 2, 3], r.Trace);
    }

    [Theory]
    [InlineData("nan")]
    [InlineData("-inf")]
    [InlineData("+Infinity")]
    [InlineData("1.#INF")]
    [InlineData("∞")]
    public void Every_spelling_of_nan_and_infinity_is_refused_as_not_finite(string spelling)
    {
        var ex = Assert.Throws<InputException>(() => ReadText($"time_ns,volts\n0,0\n1,{spelling}\n2,0\n"));
        Assert.StartsWith("test.csv: line 3: ", ex.Message);
        Assert.Contains("not a finite number", ex.Message);
    }

    [Fact]
    public void A_units_row_under_a_names_row_serves_as_the_header()
    {
        // Some exports put names on one row and units on the next; the row next to the data is the one read.
        var r = ReadText("Time,Ampl\nns,mV\n0,100\n1,200\n");
        Assert.Empty(r.Warnings);
        AssertClose(1e-9, r.Trace.SampleIntervalSeconds);
        AssertSamples([0.1, 0.2], r.Trace);
    }
}
