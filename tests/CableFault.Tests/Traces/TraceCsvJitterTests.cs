using System.Globalization;
using System.Text;
using CableFault;
using CableFault.Traces;

namespace CableFault.Tests.Traces;

/// <summary>
/// Sample-time jitter: times off the uniform grid by less than <see cref="TraceCsvReader.MaxStepDeviation"/> per step
/// are resampled onto it. The reference is the closed-form edge the samples were taken from, evaluated on the grid.
/// </summary>
public class TraceCsvJitterTests
{
    private const double StepSeconds = 10e-12;
    private const int SampleCount = 10_000; // more than one interpolation chunk (4096), so chunk joins are exercised
    private const double EdgeTimeSeconds = 5_000 * StepSeconds;
    private const double EdgeWidthSeconds = 3 * StepSeconds; // a fast edge: three samples per tanh time constant

    /// <summary>
    /// The resampled trace must be at least this many times closer to the true edge than the jittered samples taken
    /// as on-grid. A fourth-order spline on an edge three samples wide should beat the first-order error (slope ×
    /// offset) by orders of magnitude; measured 800× for random jitter and 16 000× for drift. A second-order
    /// interpolant (Akima: 13× and 650×) fails this floor, as it should.
    /// </summary>
    private const double MinimumImprovement = 100;

    /// <summary>Smooth step of 1 V: 0.5·(1 + tanh((t − t_e)/w)).</summary>
    private static double Edge(double t) => 0.5 * (1 + Math.Tanh((t - EdgeTimeSeconds) / EdgeWidthSeconds));

    [Fact]
    public void Random_jitter_within_one_percent_is_resampled_onto_the_grid()
    {
        var random = new Random(7);
        // Offsets within ±0.4 % of a step keep every step within ±0.8 %; the end samples stay on the grid.
        var times = Enumerable.Range(0, SampleCount)
            .Select(i => i * StepSeconds + (i == 0 || i == SampleCount - 1 ? 0 : (random.NextDouble() - 0.5) * 0.008 * StepSeconds))
            .ToArray();
        CheckResampling(times);
    }

    [Fact]
    public void Slow_time_base_drift_is_resampled_by_actual_time_not_by_index()
    {
        // Steps vary as 1 + 0.004·sin(2πi/n) (within ±0.4 % of the median, so jitter, not gaps), yet the samples
        // drift up to 0.004·n/π ≈ 13 steps off their index in between; whole cycles bring the last one back.
        var times = new double[SampleCount];
        for (int i = 1; i < SampleCount; i++)
            times[i] = times[i - 1] + StepSeconds * (1 + 0.004 * Math.Sin(2 * Math.PI * i / (SampleCount - 1)));
        CheckResampling(times);
    }

    [Fact]
    public void Decimal_rounding_of_printed_times_is_not_resampled()
    {
        // Times printed as k·0.1 ns in decimal are not exact binary multiples of one step, but they are on the grid
        // to far better than OnGridTolerance, so the samples must come back untouched and without a warning.
        var text = new StringBuilder("time_ns,volts\n");
        for (int k = 0; k < 1000; k++)
            text.Append(CultureInfo.InvariantCulture, $"{k * 0.1:0.0},{Edge(k * 1e-10 + EdgeTimeSeconds - 50e-9):R}\n");
        var r = TraceCsvReader.ReadWithWarnings(new StringReader(text.ToString()), "rounded.csv");
        Assert.Empty(r.Warnings);
        for (int k = 0; k < 1000; k++)
            Assert.Equal(Edge(k * 1e-10 + EdgeTimeSeconds - 50e-9), r.Trace.SamplesVolts[k]);
    }

    /// <summary>
    /// A record of 30 000 samples 37.5 ps apart (−5 ns to 1.12 µs) exported with its times in a fixed or shortened
    /// number of digits, as instruments and spreadsheet exports do: near 1 µs, "%.6e" rounds each time to 1 ps (2.7 % of
    /// the step), "G6" to 10 ps (27 %), three decimals of a nanosecond to 1 ps. The printed steps wander by up to twice
    /// that, yet the samples are on the grid: they must be read as they are, without a warning, on the record's own step.
    /// </summary>
    [Theory]
    [InlineData("time_s", 1.0, "0.000000e+00")]
    [InlineData("time_s", 1.0, "G6")]
    [InlineData("time_ns", 1e9, "0.000")]
    public void Times_rounded_by_their_printing_are_read_on_the_grid(string header, double scale, string format)
    {
        const double step = 37.5e-12, start = -5e-9;
        const int count = 30_000;
        var text = new StringBuilder(header + ",volts\n");
        for (int k = 0; k < count; k++)
            text.Append(((start + k * step) * scale).ToString(format, CultureInfo.InvariantCulture)).Append(',')
                .Append(Edge(k * step).ToString("R", CultureInfo.InvariantCulture)).Append('\n');

        var r = TraceCsvReader.ReadWithWarnings(new StringReader(text.ToString()), "rounded.csv");

        Assert.Empty(r.Warnings);
        Assert.Equal(count, r.Trace.Length);
        // The grid is drawn between the printed first and last times: G6 rounds the last by up to 5 ps, 4.4e-6 of a step
        // spread over the 29 999 steps.
        Assert.Equal(step, r.Trace.SampleIntervalSeconds, 1e-5 * step);
        for (int k = 0; k < count; k += 997) Assert.Equal(Edge(k * step), r.Trace.SamplesVolts[k]);
    }

    /// <summary>However coarsely the times are printed, a missing sample (a step of twice the median) is still a gap.</summary>
    [Theory]
    [InlineData("0.000000e+00")]
    [InlineData("G6")]
    public void A_missing_sample_is_a_gap_however_the_times_are_printed(string format)
    {
        const double step = 37.5e-12, start = -5e-9;
        var text = new StringBuilder("time_s,volts\n");
        for (int k = 0; k < 30_000; k++)
            if (k != 20_000)
                text.Append((start + k * step).ToString(format, CultureInfo.InvariantCulture)).Append(",0.5\n");

        var e = Assert.Throws<InputException>(() => TraceCsvReader.ReadWithWarnings(new StringReader(text.ToString()), "gap.csv"));
        Assert.Contains("a gap", e.Message);
    }

    private static void CheckResampling(double[] times)
    {
        var text = new StringBuilder("time_s,volts\n");
        foreach (double t in times) text.Append(CultureInfo.InvariantCulture, $"{t:R},{Edge(t):R}\n");

        var r = TraceCsvReader.ReadWithWarnings(new StringReader(text.ToString()), "jitter.csv");

        Assert.Contains(r.Warnings, w => w.Contains("resampled onto the uniform grid"));
        var trace = r.Trace;
        Assert.Equal(times.Length, trace.Length);
        Assert.Equal(times[0], trace.StartTimeSeconds);
        Assert.Equal(times[^1], trace.EndTimeSeconds, 1e-6 * StepSeconds);

        double resampledError = 0, unresampledError = 0;
        for (int k = 0; k < trace.Length; k++)
        {
            double truth = Edge(trace.TimeAt(k));
            resampledError = Math.Max(resampledError, Math.Abs(trace.SamplesVolts[k] - truth));
            unresampledError = Math.Max(unresampledError, Math.Abs(Edge(times[k]) - truth));
        }
        Assert.True(resampledError * MinimumImprovement < unresampledError,
            $"resampled max error {resampledError:G3} V vs {unresampledError:G3} V if taken as on-grid");
    }
}
