using CableFault.Comparison;
using CableFault.Simulation;
using static CableFault.Tests.Comparison.CompareFixtures;

namespace CableFault.Tests.Comparison;

/// <summary>Rise-time mismatch: warned, and with --match-rise removed by Gaussian band-limiting.</summary>
public class RiseMatchingTests
{
    [Fact]
    public void GaussiansComposeInQuadrature()
    {
        // σ_extra = √(σ_slow² − σ_fast²): a 0.5 ns edge smoothed by σ_extra has a 0.7 ns rise (normal densities
        // convolve to a normal density whose variance is the sum; any probability text).
        double extra = GaussianBandLimit.ExtraSigmaSeconds(0.5e-9, 0.7e-9);
        double expected = Math.Sqrt(0.7e-9 * 0.7e-9 - 0.5e-9 * 0.5e-9) / GaussianBandLimit.RiseOverSigma;
        Assert.Equal(expected, extra, 1e-15);
        Assert.Equal(0, GaussianBandLimit.ExtraSigmaSeconds(0.7e-9, 0.5e-9));
    }

    [Fact]
    public void SmoothedFastEdgeMatchesASlowCaptureOfTheSameRun()
    {
        var fast = Capture(Installed(), 0, 1);
        var slowSettings = Settings(0, 1) with { RiseTimeSeconds = 0.7e-9 };
        var slow = ForwardModel.Simulate(Installed(), slowSettings).WithMetadata("vf", "0.66").WithMetadata("z0", "50");

        var unmatched = Compare(fast, slow);
        Assert.Contains(unmatched.Warnings, w => w.Contains("--match-rise"));
        var matched = Compare(fast, slow, new RepairCheckOptions { MatchRise = true });
        Assert.True(matched.RiseMatched);
        Assert.True(matched.Pass, Describe(matched));
        // Matching removes most of the false difference at the open end (a rise mismatch of 40 % leaves ~10 % of ρ there).
        double worstUnmatched = unmatched.Difference.Select(Math.Abs).Max();
        double worstMatched = matched.Difference.Select(Math.Abs).Max();
        Assert.True(worstMatched < worstUnmatched / 5, $"{worstMatched} vs {worstUnmatched}");
    }
}
