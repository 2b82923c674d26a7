using CableFault.Analysis;
using CableFault.Traces;
using static CableFault.Tests.Analysis.Locate.LocateFixtures;

namespace CableFault.Tests.Analysis.Locate;

/// <summary>
/// A real step generator does not settle at once: after the fast edge its level creeps on by a per cent or so over some
/// tens of nanoseconds (common practice; the size and time are from memory). A fit whose edge settles at once reads that
/// creep as a row of tiny impedance rises near the connector, which a technician must not be sent to.
/// </summary>
public class SettlingStepTests
{
    /// <summary>Part of the incident step that arrives slowly, and its time constant, s.</summary>
    private const double SettlingFraction = 0.01, SettlingSeconds = 20e-9;

    /// <summary>Length of the test run to its open end, m.</summary>
    private const double OpenMeters = 120;

    [Theory]
    [InlineData(1)]
    [InlineData(2)]
    public void SlowlySettlingStepAddsNoEvents(int seed)
    {
        var clean = Simulate(Run(Segment(OpenMeters), Networks.RunEnd.Open), seed: seed);
        // The creep rides on the incident step, and on its echo from the open end (the open doubles whatever arrives).
        double incident = clean.SamplesVolts.Max() / 2, echo = 2 * OpenMeters / (VelocityFactor * PhysicalConstants.SpeedOfLightMetersPerSecond);
        double Creep(double t) => t <= 0 ? 0 : SettlingFraction * incident * (1 - Math.Exp(-t / SettlingSeconds));
        var samples = clean.SamplesVolts.Select((v, i) => v + Creep(clean.TimeAt(i)) + Creep(clean.TimeAt(i) - echo));
        var trace = new Trace(clean.StartTimeSeconds, clean.SampleIntervalSeconds, samples);

        var result = Locator.Locate(trace, Options());

        Assert.True(result.Events.Count == 1, $"expected the open alone; found: {Describe(result)}");
        var open = result.Events[0];
        Assert.Equal(EventKind.Open, open.Kind);
        Assert.InRange(open.DistanceMeters, OpenMeters - DistanceTolerance(OpenMeters), OpenMeters + DistanceTolerance(OpenMeters));
    }
}
