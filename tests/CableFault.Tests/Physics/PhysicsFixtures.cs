using CableFault.Cables;
using CableFault.Networks;
using CableFault.Simulation;
using CableFault.Traces;

namespace CableFault.Tests.Physics;

/// <summary>Small helpers shared by the closed-form and property tests: building runs and reading traces.</summary>
internal static class PhysicsFixtures
{
    internal const double C0 = PhysicalConstants.SpeedOfLightMetersPerSecond;

    internal static CableMedium Lossless(double z0 = 50, double vf = 0.66) => new(z0, vf);

    internal static CableNetwork Run(params NetworkElement[] elements) => new(new NetworkBranch(elements));

    internal static CableSegment Segment(double lengthMeters, CableMedium medium) => new(lengthMeters, medium);

    /// <summary>Settings with a given rise and a record long enough for <paramref name="recordSeconds"/> after the edge.</summary>
    internal static InstrumentSettings Settings(double riseSeconds, double recordSeconds, int samplesPerRise = 8,
        EdgeShape shape = EdgeShape.Gaussian, double sourceOhms = 50)
    {
        double dt = riseSeconds / samplesPerRise;
        double pre = 5 * riseSeconds;
        int count = (int)Math.Ceiling((pre + recordSeconds) / dt) + 1;
        return new InstrumentSettings
        {
            RiseTimeSeconds = riseSeconds, SampleIntervalSeconds = dt, SampleCount = count, PreTriggerSeconds = pre,
            EdgeShape = shape, SourceImpedanceOhms = sourceOhms,
        };
    }

    /// <summary>Linearly interpolated value at time t (inside the record).</summary>
    internal static double ValueAt(Trace trace, double timeSeconds)
    {
        double x = (timeSeconds - trace.StartTimeSeconds) / trace.SampleIntervalSeconds;
        int i = (int)Math.Floor(x);
        if (i < 0 || i >= trace.Length - 1) throw new ArgumentOutOfRangeException(nameof(timeSeconds), "time outside the record");
        double f = x - i;
        return trace.SamplesVolts[i] * (1 - f) + trace.SamplesVolts[i + 1] * f;
    }

    /// <summary>First time in [from, to] at which the trace crosses <paramref name="level"/> (either direction), linearly interpolated.</summary>
    internal static double CrossingTime(Trace trace, double level, double fromSeconds, double toSeconds)
    {
        int i0 = Math.Max(0, (int)Math.Floor((fromSeconds - trace.StartTimeSeconds) / trace.SampleIntervalSeconds));
        int i1 = Math.Min(trace.Length - 1, (int)Math.Ceiling((toSeconds - trace.StartTimeSeconds) / trace.SampleIntervalSeconds));
        for (int i = i0; i < i1; i++)
        {
            double a = trace.SamplesVolts[i] - level, b = trace.SamplesVolts[i + 1] - level;
            if (a == 0) return trace.TimeAt(i);
            if (Math.Sign(a) != Math.Sign(b))
                return trace.TimeAt(i) + trace.SampleIntervalSeconds * a / (a - b);
        }
        throw new Xunit.Sdk.XunitException($"the trace never crosses {level} V between {fromSeconds:E3} s and {toSeconds:E3} s");
    }

    /// <summary>Largest |V − expected| over samples with time in [from, to].</summary>
    internal static double MaxDeviation(Trace trace, double expectedVolts, double fromSeconds, double toSeconds)
    {
        double worst = 0;
        int count = 0;
        for (int i = 0; i < trace.Length; i++)
        {
            double t = trace.TimeAt(i);
            if (t < fromSeconds || t > toSeconds) continue;
            worst = Math.Max(worst, Math.Abs(trace.SamplesVolts[i] - expectedVolts));
            count++;
        }
        if (count == 0) throw new Xunit.Sdk.XunitException($"no samples between {fromSeconds:E3} s and {toSeconds:E3} s");
        return worst;
    }
}
