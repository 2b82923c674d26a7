namespace CableFault.Analysis;

/// <summary>Robust noise estimates (median absolute deviation).</summary>
public static class NoiseEstimator
{
}
