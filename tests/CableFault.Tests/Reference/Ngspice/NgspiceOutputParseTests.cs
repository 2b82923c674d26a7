namespace CableFault.Tests.Reference.Ngspice;

/// <summary>The reader of ngspice's <c>wrdata</c> output (runs without ngspice).</summary>
public sealed class NgspiceOutputParseTests
{
    [Fact]
    public void SkipsTheHeaderAndRepeatedTimes()
    {
        // Shape of ngspice 39 output with wr_singlescale and wr_vecnames: a name row, then "time value" rows.
        string[] lines =
        [
            " time                v(port)            ",
            " 0.000000000000e+00  0.000000000000e+00 ",
            " 1.000000000000e-10  2.500000000000e-01 ",
            " 1.000000000000e-10  2.500000000000e-01 ",
            "",
            " 2.000000000000e-10  1.000000000000e+00 ",
        ];
        var (t, v) = NgspiceRunner.Parse(lines);
        Assert.Equal(new[] { 0.0, 1e-10, 2e-10 }, t);
        Assert.Equal(new[] { 0.0, 0.25, 1.0 }, v);
    }

    [Fact]
    public void RejectsAnEmptyResult() =>
        Assert.Throws<InvalidDataException>(() => NgspiceRunner.Parse([" time v(port)"]));
}
