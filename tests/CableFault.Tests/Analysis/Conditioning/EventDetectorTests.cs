using CableFault.Analysis;
using CableFault.Networks;
using CableFault.Traces;
using static CableFault.Tests.Analysis.Conditioning.ConditioningFixtures;

namespace CableFault.Tests.Analysis.Conditioning;

/// <summary>Event detection on simulated runs whose events are known because they were built here.</summary>
public class EventDetectorTests
{
    /// <summary>Distance tolerance for a candidate: one layer plus a quarter rise time (≈ 0.05 m at VF 0.66, 1 ns);
    /// candidates are refined later by the model fit, 0.15 m is ample for a detector.</summary>
    private const double DistanceToleranceMeters = 0.15;

    private static IReadOnlyList<EventCandidate> Detect(Trace raw)
    {
        var c = TraceConditioner.Characterise(raw);
        var aligned = TraceConditioner.Align(raw, c);
        return EventDetector.Detect(aligned, c, LayerPeeling.Profile(aligned, c, 50, VelocityFactor, null));
    }

    private static double Meters(EventCandidate e) => e.RoundTripSeconds * VelocityFactor * CableFault.PhysicalConstants.SpeedOfLightMetersPerSecond / 2;

    [Theory]
    [InlineData(1)]
    [InlineData(2)]
    [InlineData(3)]
    public void MatchedLineAtTwoMillivoltsGivesNoCandidates(int seed)
    {
        var raw = Simulate(Run(new CableSegment(60, Line(50)), RunEnd.Matched), 0.002, seed);
        Assert.Empty(Detect(raw));
    }

    [Fact]
    public void StaircaseBoundariesAreFoundWithTheirImpedances()
    {
        var found = Detect(Simulate(Staircase(), 0.002));
        // Built: 50→75 at 20 m, 75→35 at 30 m, 35→50 at 40 m, matched end (no event).
        (double Meters, double Ohms)[] expected = [(20, 75), (30, 35), (40, 50)];
        Assert.Equal(expected.Length, found.Count);
        for (int i = 0; i < expected.Length; i++)
        {
            Assert.InRange(Meters(found[i]), expected[i].Meters - DistanceToleranceMeters, expected[i].Meters + DistanceToleranceMeters);
            Assert.Equal(CandidateShape.Step, found[i].Shape);
            Assert.NotNull(found[i].ImpedanceAfterOhms);
            Assert.InRange(found[i].ImpedanceAfterOhms!.Value, expected[i].Ohms - 1.5, expected[i].Ohms + 1.5);
        }
        // Local reflection of the first boundary: (75 − 50)/(75 + 50) = 0.2 (DESIGN.md §2).
        Assert.InRange(found[0].ReflectionStep, 0.19, 0.21);
    }

    [Fact]
    public void CandidatesStayWhereTheProfileChangesBesideAnInductiveSpotAtASectionStart()
    {
        // 8 pF at 20 m; 25 nH in series at 35 m, where 3 m of 75 Ω begin; 500 Ω across the line at 38 m; open at 198 m.
        // A long record (32 768 samples, 4 µs) is peeled in blocks, and the spot's bump and the section's rise fall in
        // neighbouring layers, where the box difference changes sign next to its peak. Every candidate must lie at one of
        // the built places (20, 35, 38 or 198 m), not between them.
        var line = Line(50);
        var network = Run(new CableSegment(20, line), new ShuntCapacitor(8e-12), new CableSegment(15, line),
            new SeriesInductor(25e-9), new CableSegment(3, Line(75)), new ShuntResistor(500), new CableSegment(160, line), RunEnd.Open);
        var raw = CableFault.Simulation.ForwardModel.Simulate(network, Settings(network, 1e-3, 7) with
        {
            SampleIntervalSeconds = 125e-12, SampleCount = 32768, PreTriggerSeconds = 5e-9,
        });
        var found = Detect(raw);
        double[] built = [20, 35, 38, 198];
        Assert.NotEmpty(found);
        Assert.All(found, e => Assert.True(built.Any(b => Math.Abs(Meters(e) - b) < 0.5),
            $"candidate at {Meters(e):0.###} m; all: {string.Join(", ", found.Select(f => $"{Meters(f):0.###} m"))}"));
    }

    [Fact]
    public void GhostBetweenTwoStrongBoundariesIsNotReported()
    {
        // 50 Ω, then 5 m of 100 Ω (k = ±1/3 at 10 m and 15 m), then 50 Ω into a matched end. The first re-reflection
        // arrives as if from 20 m with size (1 − k²)·k³ ≈ 0.033 — far above the noise (2 mV on 1 V).
        var raw = Simulate(Run(new CableSegment(10, Line(50)), new CableSegment(5, Line(100)), new CableSegment(30, Line(50)), RunEnd.Matched), 0.002);
        var c = TraceConditioner.Characterise(raw);
        var aligned = TraceConditioner.Align(raw, c);

        // The ghost is really in the trace: the level changes around 20 m by many noise σ.
        double ghostStep = LevelAt(aligned, 21) - LevelAt(aligned, 19);
        Assert.True(Math.Abs(ghostStep) > 10 * c.NoiseRmsVolts, $"ghost step {ghostStep} V should be visible in the raw trace");

        var found = EventDetector.Detect(aligned, c, LayerPeeling.Profile(aligned, c, 50, VelocityFactor, null));
        Assert.Equal(2, found.Count);
        Assert.InRange(Meters(found[0]), 10 - DistanceToleranceMeters, 10 + DistanceToleranceMeters);
        Assert.InRange(Meters(found[1]), 15 - DistanceToleranceMeters, 15 + DistanceToleranceMeters);
        Assert.DoesNotContain(found, e => Math.Abs(Meters(e) - 20) < 2);
    }

    [Fact]
    public void OpenEndIsALastStepTowardsPlusOne()
    {
        var found = Detect(Simulate(Run(new CableSegment(35, Line(50)), RunEnd.Open), 0.002));
        var end = Assert.Single(found);
        Assert.InRange(Meters(end), 35 - DistanceToleranceMeters, 35 + DistanceToleranceMeters);
        Assert.True(end.ReflectionStep > EventDetector.EndReflectionMagnitude);
        Assert.Null(end.ImpedanceAfterOhms);
    }

    [Fact]
    public void ShortEndIsALastStepTowardsMinusOne()
    {
        var found = Detect(Simulate(Run(new CableSegment(35, Line(50)), RunEnd.Short), 0.002));
        var end = Assert.Single(found);
        Assert.InRange(Meters(end), 35 - DistanceToleranceMeters, 35 + DistanceToleranceMeters);
        Assert.True(end.ReflectionStep < -EventDetector.EndReflectionMagnitude);
    }

    [Fact]
    public void ShuntCapacitanceIsADipAndSeriesInductanceABump()
    {
        // τ = Z0·C/2 = 1.25 ns for 50 pF; τ = L/(2·Z0) = 1.25 ns for 125 nH (DESIGN.md §2).
        var dip = Detect(Simulate(Run(new CableSegment(20, Line(50)), new ShuntCapacitor(50e-12), new CableSegment(20, Line(50)), RunEnd.Matched), 0.002));
        var c = Assert.Single(dip);
        Assert.Equal(CandidateShape.Dip, c.Shape);
        Assert.InRange(Meters(c), 19.5, 20.5);

        var bump = Detect(Simulate(Run(new CableSegment(20, Line(50)), new SeriesInductor(125e-9), new CableSegment(20, Line(50)), RunEnd.Matched), 0.002));
        var l = Assert.Single(bump);
        Assert.Equal(CandidateShape.Bump, l.Shape);
        Assert.InRange(Meters(l), 19.5, 20.5);
    }

    private static double LevelAt(Trace aligned, double meters)
    {
        double t = 2 * meters / (VelocityFactor * CableFault.PhysicalConstants.SpeedOfLightMetersPerSecond);
        int i = (int)Math.Round((t - aligned.StartTimeSeconds) / aligned.SampleIntervalSeconds);
        double s = 0;
        for (int k = -5; k <= 5; k++) s += aligned.SamplesVolts[i + k];
        return s / 11;
    }
}
