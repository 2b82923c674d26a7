using CableFault.Cables;
using CableFault.Networks;

namespace CableFault.Benchmarks.Accuracy;

/// <summary>One benchmark run: a network, the instrument that measured it, and the truth to score against.</summary>
/// <param name="Index">Case number (also the seed offset), for the CSV.</param>
/// <param name="Family">"random" (the main set), "close-pair", "matched-line", "noise-only" or "matched-end".</param>
/// <param name="Source">Which simulator makes the trace.</param>
/// <param name="Network">The run; its main line is the first branch of every junction's continuation (see RunGenerator).</param>
/// <param name="ImpedanceOhms">Z₀ of the cable (and the instrument's Z_s), Ω.</param>
/// <param name="VelocityFactor">VF of the cable, given to <c>locate</c> (the "VF known" target).</param>
/// <param name="Loss">Loss model of every segment, given to <c>locate</c>; null when lossless.</param>
/// <param name="RiseSeconds">10–90 % rise time of the stimulus, s.</param>
/// <param name="SampleIntervalSeconds">Sample interval, s.</param>
/// <param name="SampleCount">Samples in the record.</param>
/// <param name="NoiseRmsVolts">White Gaussian noise added to the 1 V-step trace, V RMS.</param>
/// <param name="NoiseSeed">Seed of that noise.</param>
/// <param name="Truth">The events, nearest first.</param>
/// <param name="EchoDistancesMeters">Apparent distances of physical echoes (re-reflections between events, a tap's
/// branch end); a located event there is still counted false, but reported as "echo".</param>
/// <param name="Description">The run in words.</param>
/// <param name="BranchEndDistancesMeters">Apparent distances of the open ends of tap branches (tap distance + branch
/// length): real ends, off the main line. An open reported there is neither a main-line event nor false.</param>
public sealed record AccuracyCase(int Index, string Family, TraceSource Source, CableNetwork Network, double ImpedanceOhms,
    double VelocityFactor, CableLossModel? Loss, double RiseSeconds, double SampleIntervalSeconds, int SampleCount,
    double NoiseRmsVolts, int NoiseSeed, IReadOnlyList<TruthEvent> Truth, IReadOnlyList<double> EchoDistancesMeters,
    string Description, IReadOnlyList<double>? BranchEndDistancesMeters = null)
{
    /// <summary>Time before the incident edge's 50 % point in the record, s.</summary>
    public double PreTriggerSeconds => 5 * RiseSeconds + 2e-9;

    /// <summary>The resolution unit v·t_rise/2, m.</summary>
    public double ResolutionMeters => VelocityFactor * PhysicalConstants.SpeedOfLightMetersPerSecond * RiseSeconds / 2;

    /// <summary>True when the loss model is present and not zero.</summary>
    public bool IsLossy => Loss is { IsLossless: false };
}
