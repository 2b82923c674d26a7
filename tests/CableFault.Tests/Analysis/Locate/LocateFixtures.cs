using CableFault.Analysis;
using CableFault.Cables;
using CableFault.Networks;
using CableFault.Simulation;
using CableFault.Traces;

namespace CableFault.Tests.Analysis.Locate;

/// <summary>Traces made by the forward model from networks built here: the network is the ground truth.</summary>
internal static class LocateFixtures
{
    /// <summary>VF of the invented test cable (a solid-PE coax value; common practice).</summary>
    internal const double VelocityFactor = 0.66;

    /// <summary>Z₀ of the test cable, Ω.</summary>
    internal const double ImpedanceOhms = 50;

    /// <summary>Instrument rise time, s.</summary>
    internal const double RiseSeconds = 1e-9;

    /// <summary>Noise of the kind checks, V RMS on a 1 V incident step (−60 dB: a well-averaged field trace).</summary>
    internal const double QuietNoiseVolts = 1e-3;

    internal static CableMedium Cable(double impedanceOhms = ImpedanceOhms) => new(impedanceOhms, VelocityFactor);

    internal static CableSegment Segment(double meters, double impedanceOhms = ImpedanceOhms) => new(meters, Cable(impedanceOhms));

    /// <summary>v·t/2 distance accuracy demanded with the VF known: max(0.1 % of the distance, 2 cm).</summary>
    internal static double DistanceTolerance(double meters) => Math.Max(0.001 * meters, 0.02);

    internal static Trace Simulate(CableNetwork network, double noiseVolts = QuietNoiseVolts, int seed = 1, int? sampleCount = null,
        double sampleIntervalSeconds = RiseSeconds / 8)
    {
        var settings = InstrumentSettings.DefaultFor(network, RiseSeconds) with
        {
            NoiseRmsVolts = noiseVolts,
            NoiseSeed = seed,
            SampleIntervalSeconds = sampleIntervalSeconds,
        };
        if (sampleCount is int n) settings = settings with { SampleCount = n };
        else settings = settings with { SampleCount = (int)Math.Ceiling((settings.PreTriggerSeconds + 2.5 * 2 * network.LongestDelaySeconds() + 10 * RiseSeconds) / sampleIntervalSeconds) };
        return ForwardModel.Simulate(network, settings);
    }

    /// <summary>Locates <paramref name="network"/> simulated on a cable of its own rather than the fixture cable: the
    /// source matched to <paramref name="cable"/>, <paramref name="sampleCount"/> samples six per rise, and the cable's VF,
    /// Z₀ and loss (when it has any) given to locate.</summary>
    internal static LocateResult LocateOnCable(CableNetwork network, CableMedium cable, double riseSeconds, int sampleCount,
        double noiseVolts, int seed)
    {
        var settings = InstrumentSettings.DefaultFor(network, riseSeconds) with
        {
            SourceImpedanceOhms = cable.ImpedanceOhms, SampleIntervalSeconds = riseSeconds / 6, SampleCount = sampleCount,
            NoiseRmsVolts = noiseVolts, NoiseSeed = seed,
        };
        return Locator.Locate(ForwardModel.Simulate(network, settings), new LocateOptions
        {
            VelocityFactor = cable.VelocityFactor, ImpedanceOhms = cable.ImpedanceOhms, SourceImpedanceOhms = cable.ImpedanceOhms,
            Loss = cable.Loss.IsLossless ? null : cable.Loss,
        });
    }

    internal static LocateOptions Options(double vfSigma = 0.02) =>
        new() { VelocityFactor = VelocityFactor, VelocityFactorRelativeSigma = vfSigma, ImpedanceOhms = ImpedanceOhms };

    internal static CableNetwork Run(params NetworkElement[] elements) => new(new NetworkBranch(elements));

    /// <summary>The events in one line, for failure messages.</summary>
    internal static string Describe(LocateResult result) =>
        string.Join("; ", result.Events.Select(e => $"{e.Kind} {e.DistanceMeters:0.###} m {e.Value:G3} {e.ImpedanceOhms:G3} Ω"));

    /// <summary>The one event nearest <paramref name="meters"/>; fails when none lies within 1 m.</summary>
    internal static LocatedEvent Near(LocateResult result, double meters)
    {
        var nearest = result.Events.MinBy(e => Math.Abs(e.DistanceMeters - meters));
        Assert.True(nearest is not null && Math.Abs(nearest.DistanceMeters - meters) < 1,
            $"no event near {meters} m; found: {string.Join("; ", result.Events.Select(e => $"{e.Kind} at {e.DistanceMeters:0.###} m"))}");
        return nearest!;
    }
}
