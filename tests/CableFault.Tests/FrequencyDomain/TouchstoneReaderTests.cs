using System.Numerics;
using CableFault.FrequencyDomain;

namespace CableFault.Tests.FrequencyDomain;

/// <summary>Parser examples written in the style of the Touchstone specification's own examples, and malformed cases.</summary>
public class TouchstoneReaderTests
{
    /// <summary>
    /// The example files give six decimals of RI and magnitude, four of degrees, five of dB: each value is off by at
    /// most ~1e-6 from the exact one, so 3e-6 covers two files' rounding plus the polar conversion.
    /// </summary>
    private const double FormattingTolerance = 3e-6;

    internal static ReflectionData ReadReference(string name)
    {
        string path = Path.Combine(AppContext.BaseDirectory, "Reference", "Touchstone", name);
        using var reader = new StreamReader(path);
        return TouchstoneReader.Read(reader, name);
    }

    private static ReflectionData ReadText(string text, string name = "test.s1p", long limit = TouchstoneReader.DefaultMaximumCharacters) =>
        TouchstoneReader.Read(new StringReader(text), name, limit);

    /// <summary>Γ of the invented load in the example files: Z_L = 75 Ω + jω·5 nH on 50 Ω (the file header says so).</summary>
    private static Complex ExampleLoad(double frequencyHz)
    {
        var z = new Complex(75, 2 * Math.PI * frequencyHz * 5e-9);
        return (z - 50) / (z + 50);
    }

    [Theory]
    [InlineData("load-ri.s1p", TouchstoneDataFormat.RealImaginary, TouchstoneVersion.V1, 1)]
    [InlineData("load-ma.s1p", TouchstoneDataFormat.MagnitudeAngle, TouchstoneVersion.V1, 1)]
    [InlineData("load-db.s1p", TouchstoneDataFormat.DecibelAngle, TouchstoneVersion.V1, 1)]
    [InlineData("load-v2.s1p", TouchstoneDataFormat.MagnitudeAngle, TouchstoneVersion.V2, 1)]
    [InlineData("pad-v1.s2p", TouchstoneDataFormat.MagnitudeAngle, TouchstoneVersion.V1, 2)]
    [InlineData("pad-v2.s2p", TouchstoneDataFormat.RealImaginary, TouchstoneVersion.V2, 2)]
    public void Example_files_give_the_load_reflection_in_every_format(string file, TouchstoneDataFormat format, TouchstoneVersion version, int ports)
    {
        var data = ReadReference(file);
        Assert.Equal(6, data.Count);
        Assert.Equal(50, data.ReferenceImpedanceOhms);
        Assert.Equal(format, data.FileInfo!.Format);
        Assert.Equal(version, data.FileInfo.Version);
        Assert.Equal(ports, data.FileInfo.PortCount);
        for (int i = 0; i < data.Count; i++)
        {
            double f = (i + 1) * 100e6;
            Assert.Equal(f, data.FrequenciesHz[i], 1e-3);
            Assert.True((data.ReflectionCoefficients[i] - ExampleLoad(f)).Magnitude < FormattingTolerance,
                $"{file} point {i}: {data.ReflectionCoefficients[i]} vs {ExampleLoad(f)}");
        }
        Assert.Empty(data.Warnings);
        Assert.Contains(data.Comments, c => c.StartsWith("Invented example", StringComparison.Ordinal));
    }

    [Fact]
    public void Ri_ma_and_db_files_of_the_same_data_agree()
    {
        var ri = ReadReference("load-ri.s1p");
        var ma = ReadReference("load-ma.s1p");
        var db = ReadReference("load-db.s1p");
        for (int i = 0; i < ri.Count; i++)
        {
            Assert.True((ri.ReflectionCoefficients[i] - ma.ReflectionCoefficients[i]).Magnitude < FormattingTolerance);
            Assert.True((ri.ReflectionCoefficients[i] - db.ReflectionCoefficients[i]).Magnitude < FormattingTolerance);
        }
    }

    [Fact]
    public void Missing_option_fields_take_the_specification_defaults()
    {
        // Defaults GHz, S, MA, R 50 (Touchstone specification, option line; from memory).
        var data = ReadText("#\n1 0.5 90\n2 0.5 180\n");
        Assert.Equal(1e9, data.FrequenciesHz[0]);
        Assert.Equal(50, data.ReferenceImpedanceOhms);
        Assert.True((data.ReflectionCoefficients[0] - new Complex(0, 0.5)).Magnitude < 1e-12);
        Assert.True((data.ReflectionCoefficients[1] - new Complex(-0.5, 0)).Magnitude < 1e-12);
    }

    [Fact]
    public void Option_fields_in_any_order_and_case()
    {
        var data = ReadText("# r 75 ri khz S\n1 0.1 0.2\n2 0.3 0.4\n");
        Assert.Equal(75, data.ReferenceImpedanceOhms);
        Assert.Equal(2e3, data.FrequenciesHz[1]);
        Assert.Equal(new Complex(0.3, 0.4), data.ReflectionCoefficients[1]);
    }

    [Theory]
    [InlineData(TouchstoneDataFormat.RealImaginary, TouchstoneVersion.V1)]
    [InlineData(TouchstoneDataFormat.MagnitudeAngle, TouchstoneVersion.V1)]
    [InlineData(TouchstoneDataFormat.DecibelAngle, TouchstoneVersion.V2)]
    [InlineData(TouchstoneDataFormat.RealImaginary, TouchstoneVersion.V2)]
    public void Write_then_read_round_trips(TouchstoneDataFormat format, TouchstoneVersion version)
    {
        var random = new Random(20240611);
        var freqs = Enumerable.Range(1, 50).Select(k => k * 12.5e6).ToArray();
        var gamma = freqs.Select(_ => Complex.FromPolarCoordinates(random.NextDouble(), (random.NextDouble() - 0.5) * 2 * Math.PI)).ToArray();
        var original = new ReflectionData(freqs, gamma, 75, ["invented round-trip data", "second line"]);
        var text = new StringWriter();
        TouchstoneWriter.Write(original, text, format, version);
        var back = ReadText(text.ToString());
        Assert.Equal(original.FrequenciesHz.ToArray(), back.FrequenciesHz.ToArray());
        Assert.Equal(75, back.ReferenceImpedanceOhms);
        Assert.Equal(original.Comments.ToArray(), back.Comments.ToArray());
        Assert.Empty(back.Warnings);
        // RI is written in round-trip form (exact); polar forms lose only the conversion's last bits.
        double tolerance = format == TouchstoneDataFormat.RealImaginary ? 0 : 1e-14;
        for (int i = 0; i < freqs.Length; i++)
            Assert.True((original.ReflectionCoefficients[i] - back.ReflectionCoefficients[i]).Magnitude <= tolerance);
    }

    [Fact]
    public void One_port_z_data_are_converted_to_reflection()
    {
        // 1.x Z data are normalised to R: z = 1.5 (75 Ω on 50 Ω) gives Γ = 0.5/2.5 = 0.2; z = 0 gives a short.
        var v1 = ReadText("# Hz Z RI R 50\n1 1.5 0\n2 0 0\n");
        Assert.Equal(0.2, v1.ReflectionCoefficients[0].Real, 12);
        Assert.Equal(-1, v1.ReflectionCoefficients[1].Real, 12);
        Assert.Single(v1.Warnings);
        // 2.0 Z data are in ohms: 75 Ω on 50 Ω gives 0.2 again.
        var v2 = ReadText("[Version] 2.0\n# Hz Z RI R 50\n[Number of Ports] 1\n[Number of Frequencies] 1\n[Network Data]\n1 75 0\n[End]\n");
        Assert.Equal(0.2, v2.ReflectionCoefficients[0].Real, 12);
        // 1.x Y normalised: y = 0.5 (100 Ω) gives Γ = 0.5/1.5.
        var y = ReadText("# Hz Y RI R 50\n1 0.5 0\n");
        Assert.Equal(1.0 / 3, y.ReflectionCoefficients[0].Real, 12);
    }

    [Fact]
    public void Port_count_comes_from_the_first_line_when_the_name_has_no_extension()
    {
        var two = ReadText("# Hz S RI\n1 0.1 0 0.9 0 0.9 0 0.2 0\n2 0.3 0 0.9 0 0.9 0 0.2 0\n", "stream");
        Assert.Equal(2, two.FileInfo!.PortCount);
        Assert.Equal(0.3, two.ReflectionCoefficients[1].Real);
    }

    [Fact]
    public void Lower_triangular_two_port_gives_s11()
    {
        string text = "[Version] 2.0\n# Hz S RI R 50\n[Number of Ports] 2\n[Two-Port Data Order] 21_12\n[Number of Frequencies] 2\n" +
                      "[Matrix Format] Lower\n[Network Data]\n1 0.1 0.0 0.9 0 0.2 0\n2 0.15 0.05 0.9 0 0.2 0\n[End]\n";
        var data = ReadText(text, "lower.s2p");
        Assert.Equal(new Complex(0.15, 0.05), data.ReflectionCoefficients[1]);
    }

    [Theory]
    [InlineData("1 0.1 0.2\n", "test.s1p", "line 1", "option line")]
    [InlineData("# Hz S RI R 50\n1 0.1\n2 0.1 0.2\n", "test.s1p", "line 3", "5 values")]
    [InlineData("# Hz S RI R 50\n1 0.1 0.2 0.3\n", "test.s1p", "line 2", "4 values")]
    [InlineData("# Hz S RI R 50\n1 0.1 0.2\n2 abc 0.2\n", "test.s1p", "line 3", "'abc' is not a number")]
    [InlineData("# Hz S RI R 50\n1 0.1 0.2\n1 0.1 0.2\n", "test.s1p", "line 3", "must increase")]
    [InlineData("# Hz S RI R 50\n2 0.1 0.2\n1 0.1 0.2\n", "test.s1p", "line 3", "must increase")]
    [InlineData("# Hz S RI R 50\n1 0.1 0.2\n2 0.1\n", "test.s1p", "line 3", "incomplete")]
    [InlineData("# Hz H RI R 50\n1 0.1 0.2\n", "test.s1p", "test.s1p", "H parameters")]
    [InlineData("# Hz Z RI R 50\n1 0.1 0 0.9 0 0.9 0 0.2 0\n", "test.s2p", "test.s2p", "export S parameters")]
    [InlineData("# Hz S XX R 50\n1 0.1 0.2\n", "test.s1p", "line 1", "'XX'")]
    [InlineData("# Hz S RI R -5\n1 0.1 0.2\n", "test.s1p", "line 1", "positive reference")]
    [InlineData("# Hz S RI R 50\n1 0.1 0.2\n# Hz S RI R 50\n", "test.s1p", "line 3", "after network data")]
    [InlineData("# Hz S RI R 50\n", "test.s1p", "test.s1p", "no network data")]
    [InlineData("# Hz S RI R 50\n1 0.1 0.2 0.3\n", "test.s3p", "line 2", "only one- and two-port")]
    [InlineData("# Hz S RI R 50\n[Number of Ports] 1\n", "test.s1p", "line 2", "belongs to Touchstone 2.0")]
    [InlineData("# Hz S RI R 50\n[Version] 2.0\n", "test.s1p", "line 2", "must be the first")]
    [InlineData("[Version] 3.0\n", "test.s1p", "line 1", "not supported")]
    [InlineData("[Version] 2.0\n[Number of Ports] 1\n[Number of Frequencies] 1\n[Network Data]\n1 0 0\n", "test.s1p", "line 4", "before the option line")]
    [InlineData("[Version] 2.0\n# Hz S RI R 50\n[Number of Frequencies] 1\n[Network Data]\n1 0 0\n", "test.s1p", "line 4", "[Number of Ports]")]
    [InlineData("[Version] 2.0\n# Hz S RI R 50\n[Number of Ports] 1\n[Network Data]\n1 0 0\n", "test.s1p", "line 4", "[Number of Frequencies]")]
    [InlineData("[Version] 2.0\n# Hz S RI R 50\n[Number of Ports] 2\n[Number of Frequencies] 1\n[Network Data]\n", "test.s2p", "line 5", "[Two-Port Data Order]")]
    [InlineData("[Version] 2.0\n# Hz S RI R 50\n[Number of Ports] 1\n[Number of Frequencies] 2\n[Network Data]\n1 0 0\n[End]\n", "test.s1p", "test.s1p", "says 2 but 1")]
    [InlineData("[Version] 2.0\n# Hz S RI R 50\n# Hz S RI R 50\n", "test.s1p", "line 3", "second option line")]
    [InlineData("[Version] 2.0\n# Hz S RI R 50\n[Number of Ports] 1\n[Number of Frequencies] 1\n1 0 0\n", "test.s1p", "line 5", "before [Network Data]")]
    [InlineData("[Version] 2.0\n# Hz S RI R 50\n[Number of Ports] 1\n[Number of Frequencies] 1\n[Mixed-Mode Order] D2,1\n", "test.s1p", "line 5", "mixed-mode")]
    [InlineData("# Hz S RI R 50\n1 0.1 0.2 0.3 0.4 0.5\n", "stream", "line 2", "cannot tell the number of ports")]
    public void Malformed_input_gives_one_line_naming_the_place_and_the_problem(string text, string name, string where, string problem)
    {
        var ex = Assert.Throws<InputException>(() => ReadText(text, name));
        Assert.DoesNotContain('\n', ex.Message);
        Assert.StartsWith(name, ex.Message);
        Assert.Contains(where, ex.Message);
        Assert.Contains(problem, ex.Message);
    }

    [Fact]
    public void Files_over_the_size_limit_are_refused()
    {
        string text = "# Hz S RI R 50\n" + string.Concat(Enumerable.Range(1, 1000).Select(i => $"{i} 0.1 0.2\n"));
        var ex = Assert.Throws<InputException>(() => ReadText(text, "big.s1p", limit: 4000));
        Assert.Contains("limit", ex.Message);
        Assert.Equal(1000, ReadText(text, "big.s1p", limit: 100_000).Count);
    }

    [Fact]
    public void A_second_option_line_in_a_1x_file_is_ignored_with_a_warning()
    {
        var data = ReadText("# Hz S RI R 50\n# GHz S RI R 75\n1 0.1 0.2\n");
        Assert.Equal(1, data.FrequenciesHz[0]);
        Assert.Equal(50, data.ReferenceImpedanceOhms);
        Assert.Single(data.Warnings);
    }

    [Fact]
    public void Carriage_return_line_ends_and_no_final_line_end_are_accepted()
    {
        var data = ReadText("! dos file\r\n# Hz S RI R 50\r\n1 0.1 0.2\r\n2 0.3 0.4");
        Assert.Equal(2, data.Count);
        Assert.Equal(new Complex(0.3, 0.4), data.ReflectionCoefficients[1]);
    }
}
