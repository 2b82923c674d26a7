using CableFault.Analysis;
using CableFault.Networks;
using CableFault.Simulation;
using CableFault.Traces;
using static CableFault.Tests.Analysis.Conditioning.ConditioningFixtures;

namespace CableFault.Tests.Analysis.Conditioning;

/// <summary>Noise estimation against seeded injected noise, and the hard inputs that must warn or refuse.</summary>
public class NoiseAndHardCaseTests
{
    /// <summary>
    /// The MAD-based σ has relative standard error ≈ √(1.36/n) for n Gaussian samples (37 % efficiency; Rousseeuw &amp;
    /// Croux, JASA 88(424), 1993); first differences are correlated, which about doubles the variance. With n ≈ 4000
    /// pre-edge samples that is ≈ 2.6 %, so ±10 % is almost 4 standard errors: a correct estimator fails with
    /// probability below 10⁻⁴, a wrong one (e.g. forgetting the √2, off by 41 %) cannot pass.
    /// </summary>
    private const double NoiseRelativeTolerance = 0.10;

    [Theory]
    [InlineData(0.002, 1)]
    [InlineData(0.002, 2)]
    [InlineData(0.02, 3)]
    public void NoiseEstimateIsWithinTenPercentOfTheInjectedRms(double rms, int seed)
    {
        var network = Run(new CableSegment(30, Line(50)), RunEnd.Open);
        var settings = Settings(network, rms, seed) with { PreTriggerSeconds = 4000 * 0.125e-9, SampleCount = 8192 };
        var c = TraceConditioner.Characterise(ForwardModel.Simulate(network, settings));
        Assert.InRange(c.NoiseRmsVolts / rms, 1 - NoiseRelativeTolerance, 1 + NoiseRelativeTolerance);
    }

    [Fact]
    public void PureNoiseHasNoIncidentEdge()
    {
        var normal = new MathNet.Numerics.Distributions.Normal(0, 0.01, new Random(7));
        var noise = new Trace(0, 1e-10, Enumerable.Range(0, 4096).Select(_ => normal.Sample()));
        var e = Assert.Throws<InputException>(() => TraceConditioner.Characterise(noise));
        Assert.Contains("no incident edge", e.Message);
        Assert.DoesNotContain('\n', e.Message);
    }

    [Fact]
    public void FlatTraceHasNoIncidentEdge()
    {
        var flat = new Trace(0, 1e-10, Enumerable.Repeat(0.3, 1000));
        Assert.Contains("no incident edge", Assert.Throws<InputException>(() => TraceConditioner.Characterise(flat)).Message);
    }

    [Fact]
    public void ClippedEchoIsFlaggedAndClippedIncidentStepRefused()
    {
        // An open end doubles the level to 2 V; a digitiser range ending at 1.6 V cuts the echo off.
        var network = Run(new CableSegment(20, Line(50)), RunEnd.Open);
        var raw = Simulate(network, 0.002);
        var clipped = raw.WithSamples(raw.SamplesVolts.Select(v => Math.Min(v, 1.6)));
        var c = TraceConditioner.Characterise(clipped);
        Assert.True(c.Clipped);
        Assert.Contains(c.Warnings, w => w.Contains("clipped"));
        Assert.False(TraceConditioner.Characterise(raw).Clipped);   // the same trace unclipped is not flagged

        var clippedStep = raw.WithSamples(raw.SamplesVolts.Select(v => Math.Min(v, 0.7)));
        Assert.Contains("clipped", Assert.Throws<InputException>(() => TraceConditioner.Characterise(clippedStep)).Message);
    }

    [Fact]
    public void RecordEndingBeforeTheEchoSettlesWarns()
    {
        // Cut the record one rise time after the open end's echo arrives: the last level is still moving.
        var raw = Simulate(Run(new CableSegment(20, Line(50)), RunEnd.Open), 0.002);
        int echo = (int)Math.Round((RoundTrip(20) - raw.StartTimeSeconds) / raw.SampleIntervalSeconds);
        int keep = echo + (int)Math.Round(1e-9 / raw.SampleIntervalSeconds);
        var cut = new Trace(raw.StartTimeSeconds, raw.SampleIntervalSeconds, raw.SamplesVolts.Take(keep));
        Assert.Contains(TraceConditioner.Characterise(cut).Warnings, w => w.Contains("still changing"));
        Assert.DoesNotContain(TraceConditioner.Characterise(raw).Warnings, w => w.Contains("still changing"));
    }

    [Fact]
    public void HeavyNoiseSuggestsAveraging()
    {
        var raw = Simulate(Run(new CableSegment(20, Line(50)), RunEnd.Open), 0.05);
        var c = TraceConditioner.Characterise(raw);
        Assert.Contains(c.Warnings, w => w.Contains("average"));
    }

    [Fact]
    public void TooLittleBaselineIsRefused()
    {
        var network = Run(new CableSegment(20, Line(50)), RunEnd.Open);
        var raw = ForwardModel.Simulate(network, Settings(network) with { PreTriggerSeconds = 0.6e-9 });
        Assert.Contains("baseline", Assert.Throws<InputException>(() => TraceConditioner.Characterise(raw)).Message);
    }
}
