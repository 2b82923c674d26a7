using CableFault.Comparison;
using CableFault.Networks;
using static CableFault.Tests.Comparison.CompareFixtures;

namespace CableFault.Tests.Comparison;

/// <summary>
/// The repair check on pairs simulated from networks built here: the networks are the ground truth, so each check
/// knows what changed, where, and by how much.
/// </summary>
public class RepairCheckTests
{
    /// <summary>Noise of a field capture in these checks, V RMS (on a 1 V step).</summary>
    private const double FieldNoiseVolts = 1e-3;

    /// <summary>How close a reported position must be to the network's, m: the distance tolerance itself (an event
    /// found further off than the check's own tolerance would be a wrong answer).</summary>
    private const double PositionToleranceMeters = CompareTolerances.DefaultDistanceMeters;

    [Fact]
    public void RepairThatRestoresTheRunPasses()
    {
        // Damage: a crushed spot (shunt 10 pF) at 15 m; the repair removes it and the run is as installed again.
        var installed = Capture(Installed(), FieldNoiseVolts, 1, name: "installed");
        var damaged = Capture(Run(Segment(8), new SeriesInductor(4e-9), Segment(7), new ShuntCapacitor(10e-12), Segment(15), RunEnd.Open),
            FieldNoiseVolts, 2, name: "damaged");
        var repaired = Capture(Installed(), FieldNoiseVolts, 3, name: "repaired");

        var before = Compare(installed, damaged);
        Assert.False(before.Pass, Describe(before));
        Assert.Contains(before.Events, e => e.ExceedsTolerance && Math.Abs(e.DistanceMeters - 15) < PositionToleranceMeters);

        var after = Compare(installed, repaired);
        Assert.True(after.Pass, Describe(after));
        Assert.All(after.Events, e => Assert.Equal(EventChangeKind.Unchanged, e.Kind));
    }

    [Fact]
    public void RepairThatLeavesASpliceBumpFailsAndLocatesIt()
    {
        // 3 nH at 20 m on lossless line: a peak near 0.06 with a 0.5 ns edge (τ = L/2Z₀ = 30 ps; peak ≈ τ/(σ√2π)
        // for σ = 0.195 ns, DESIGN.md §2 signature), twice the default tolerance.
        var installed = Capture(Installed(), FieldNoiseVolts, 1);
        var repaired = Capture(Run(Segment(8), new SeriesInductor(4e-9), Segment(12), new SeriesInductor(3e-9), Segment(10), RunEnd.Open),
            FieldNoiseVolts, 3);
        var result = Compare(installed, repaired);
        Assert.False(result.Pass, Describe(result));
        var bump = Assert.Single(result.Events, e => e.Kind == EventChangeKind.New);
        Assert.True(Math.Abs(bump.DistanceMeters - 20) < PositionToleranceMeters, Describe(result));
        Assert.True(bump.ExceedsTolerance);
        // Nothing else on the run changed: the connector pair and the end are where they were.
        Assert.All(result.Events.Where(e => e != bump), e => Assert.Equal(EventChangeKind.Unchanged, e.Kind));
    }

    [Fact]
    public void NewTapFails()
    {
        // Someone tapped a 4 m drop into a terminated device at 15 m: ρ = −1/3 at the junction (two equal lines in
        // parallel, DESIGN.md §2), no echo from the matched drop.
        var installed = Capture(Installed(), FieldNoiseVolts, 1);
        var tapped = Capture(Run(Segment(8), new SeriesInductor(4e-9), Segment(7),
            new Junction([new NetworkBranch(Segment(15), RunEnd.Open), new NetworkBranch(Segment(4), RunEnd.Matched)])), FieldNoiseVolts, 4);
        var result = Compare(installed, tapped);
        Assert.False(result.Pass, Describe(result));
        var tap = result.Events.FirstOrDefault(e => e.Kind is EventChangeKind.New or EventChangeKind.Changed && Math.Abs(e.DistanceMeters - 15) < PositionToleranceMeters);
        Assert.True(tap is not null, Describe(result));
        Assert.True(tap.ExceedsTolerance);
        Assert.True(tap.ReflectionChange < -0.2, Describe(result)); // −1/3, less what the fit reads differently
    }

    [Fact]
    public void EndMovedByALongerReplacementSectionFailsWithTheShift()
    {
        // The last 22 m were replaced by 23 m of the same cable: the open end moves out by 1.0 m.
        var installed = Capture(Installed(), FieldNoiseVolts, 1);
        var longer = Capture(Installed(tailMeters: 23), FieldNoiseVolts, 5);
        var result = Compare(installed, longer);
        Assert.False(result.Pass, Describe(result));
        var end = Assert.Single(result.Events, e => e.Kind == EventChangeKind.Moved);
        Assert.Equal(1.0, end.ShiftMeters!.Value, ShiftToleranceMeters);
        Assert.Contains(result.Reasons, r => r.Contains("moved by +1.00 m"));
    }

    /// <summary>How well the shift of a sharp end must be read, m: a tenth of the distance tolerance (both ends are
    /// located to a few picoseconds, 1 ps ≈ 0.1 mm).</summary>
    private const double ShiftToleranceMeters = CompareTolerances.DefaultDistanceMeters / 10;

    [Fact]
    public void SameRunCapturedDifferentlyPasses()
    {
        // Same run, other instrument settings: 100 ps instead of 62.5 ps, 8 ns of pre-trigger instead of 5, a shorter
        // record. Nothing changed, so nothing may be reported.
        var installed = Capture(Installed(), FieldNoiseVolts, 1);
        var other = Capture(Installed(), FieldNoiseVolts, 6, intervalSeconds: 100e-12, preTriggerSeconds: 8e-9, recordSeconds: 380e-9);
        var result = Compare(installed, other);
        Assert.True(result.Pass, Describe(result));
        Assert.All(result.Events, e => Assert.Equal(EventChangeKind.Unchanged, e.Kind));
        Assert.Contains(result.Warnings, w => w.Contains("resampled"));
    }

    [Theory]
    [InlineData(11, 12)]
    [InlineData(21, 22)]
    [InlineData(31, 32)]
    [InlineData(41, 42)]
    public void TwoNoisyCapturesOfTheSameRunShowNoDifference(int seedA, int seedB)
    {
        const double noisyVolts = 2e-3;
        var a = Capture(Installed(), noisyVolts, seedA);
        var b = Capture(Installed(), noisyVolts, seedB);
        var result = Compare(a, b);
        Assert.True(result.Pass, Describe(result));
        Assert.DoesNotContain(result.Events, e => e.ExceedsTolerance);
        // The band is the combined noise: 5σ·√2 of 2 mV on a 1 V step ≈ 0.014; allow the estimator its ±20 %.
        Assert.InRange(result.NoiseBand, 0.8 * 5 * Math.Sqrt(2) * noisyVolts, 1.2 * 5 * Math.Sqrt(2) * noisyVolts);
        Assert.DoesNotContain(result.Regions, r => r.StartMeters > result.BlindZoneMeters && Math.Abs(r.PeakDifference) > result.Tolerances.Reflection);
    }

    [Fact]
    public void DifferentVelocityFactorsAreRefusedUnlessOneIsGiven()
    {
        var a = Capture(Installed(), FieldNoiseVolts, 1, name: "a");
        var b = Capture(Installed(), FieldNoiseVolts, 2, name: "b").WithMetadata("vf", "0.70");
        var e = Assert.Throws<InputException>(() => Compare(a, b));
        Assert.Contains("--vf", e.Message);
        Assert.DoesNotContain('\n', e.Message);
        var c = Capture(Installed(), FieldNoiseVolts, 2).WithMetadata("z0", "75");
        Assert.Contains("--z0", Assert.Throws<InputException>(() => Compare(a, c)).Message);

        var settled = Compare(a, b, new RepairCheckOptions { VelocityFactor = 0.66 });
        Assert.Equal(0.66, settled.Settings.VelocityFactor);
        Assert.Equal("option", settled.Settings.VelocityFactorSource);
    }

    [Fact]
    public void BadTolerancesAreReportedTogether()
    {
        var a = Capture(Installed(), FieldNoiseVolts, 1);
        var e = Assert.Throws<InputException>(() => Compare(a, a,
            new RepairCheckOptions { Tolerances = new CompareTolerances { Reflection = -1, DistanceMeters = 0 } }));
        Assert.Contains("--tolerance-reflection", e.Message);
        Assert.Contains("--tolerance-distance-m", e.Message);
    }
}
