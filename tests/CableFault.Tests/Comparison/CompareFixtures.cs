using CableFault.Cables;
using CableFault.Comparison;
using CableFault.Networks;
using CableFault.Simulation;
using CableFault.Traces;

namespace CableFault.Tests.Comparison;

/// <summary>Runs built from parts and simulated with the forward model: the networks are the ground truth.</summary>
internal static class CompareFixtures
{
    internal const double VelocityFactor = 0.66;
    internal const double RiseSeconds = 0.5e-9;

    internal static CableMedium Coax { get; } = new(50, VelocityFactor);

    internal static CableNetwork Run(params NetworkElement[] elements) => new(new NetworkBranch(elements));

    internal static CableSegment Segment(double meters) => new(meters, Coax);

    /// <summary>The reference run: a connector pair (4 nH) at 8 m, then 22 m to an open end (30 m in all).</summary>
    internal static CableNetwork Installed(double tailMeters = 22) =>
        Run(Segment(8), new SeriesInductor(4e-9), Segment(tailMeters), RunEnd.Open);

    /// <summary>Settings: 0.5 ns rise, Δt = rise/8, 5 ns pre-trigger, 1 V step, a record of 2.2 round trips of 40 m.</summary>
    internal static InstrumentSettings Settings(double noiseVolts, int seed, double? intervalSeconds = null,
        double preTriggerSeconds = 5e-9, double recordSeconds = 450e-9) => new()
    {
        RiseTimeSeconds = RiseSeconds,
        SampleIntervalSeconds = intervalSeconds ?? RiseSeconds / 8,
        PreTriggerSeconds = preTriggerSeconds,
        SampleCount = (int)Math.Ceiling((preTriggerSeconds + recordSeconds) / (intervalSeconds ?? RiseSeconds / 8)) + 1,
        NoiseRmsVolts = noiseVolts,
        NoiseSeed = seed,
    };

    /// <summary>A simulated capture with the VF and Z0 written into its metadata, as a field instrument would.</summary>
    internal static Trace Capture(CableNetwork network, double noiseVolts, int seed, double? intervalSeconds = null,
        double preTriggerSeconds = 5e-9, double recordSeconds = 450e-9, string name = "capture") =>
        ForwardModel.Simulate(network, Settings(noiseVolts, seed, intervalSeconds, preTriggerSeconds, recordSeconds))
            .WithMetadata("vf", "0.66").WithMetadata("z0", "50").WithMetadata("run", name);

    internal static CompareResult Compare(Trace baseline, Trace current, RepairCheckOptions? options = null) =>
        RepairCheck.Compare(baseline, current, options ?? new RepairCheckOptions());

    internal static string Describe(CompareResult result) =>
        $"pass={result.Pass}; band={result.NoiseBand:G3}; " + string.Join(" | ", result.Events.Select(e => e.Description))
        + " || reasons: " + string.Join(" | ", result.Reasons)
        + " || regions: " + string.Join(" | ", result.Regions.Select(r => $"{r.StartMeters:0.00}-{r.EndMeters:0.00} peak {r.PeakDifference:0.0000}@{r.PeakDistanceMeters:0.00} {(r.Explained ? "explained" : "unexplained")}"));
}
