using CableFault.Networks;
using CableFault.Simulation;
using static CableFault.Tests.Physics.PhysicsFixtures;

namespace CableFault.Tests.Physics;

/// <summary>
/// Step levels and arrival times on a single lossless line fed from a matched source (Z_s = Z₀).
/// With Z_s = Z₀ the incident step is V_i = V_s/2 and nothing re-reflects at the port, so after one round trip the
/// port settles at V_i (1 + ρ), ρ = (Z_L − Z₀)/(Z_L + Z₀) (Pozar, <i>Microwave Engineering</i>, 4th ed., §2.3 eq. 2.35;
/// the bounce-diagram picture is in §2.3 as well), and the reflected edge's midpoint arrives at t = 2l/v, v = VF·c.
/// </summary>
public sealed class StepResponseLevelTests
{
    private const double RiseSeconds = 1e-9;

    /// <summary>The damped-contour inverse transform is exact up to wrap-around (1e-12 by design) and FFT round-off
    /// amplified by at most e^(σt) ≈ 1e8 at the end of the record, i.e. ≈ 1e-8 V; 1 µV is a safe bound.</summary>
    private const double LevelToleranceVolts = 1e-6;

    /// <summary>Linear interpolation of an error-function edge sampled every rise/8 misplaces its 50 % point by under
    /// 0.3 % of the rise (the cubic term of erf between two samples); 1 % of the rise leaves margin.</summary>
    private const double ArrivalToleranceSeconds = 0.01 * RiseSeconds;

    /// <summary>An error-function edge is within 1e-9 of its final value 5 rise times (≈ 12.8 σ) after its midpoint.</summary>
    private const double SettleSeconds = 5 * RiseSeconds;

    [Theory]
    [InlineData("open", double.PositiveInfinity, 1.0)]
    [InlineData("short", 0.0, -1.0)]
    [InlineData("matched", double.NaN, 0.0)]
    [InlineData("25 ohm", 25.0, -1.0 / 3.0)]
    [InlineData("100 ohm", 100.0, 1.0 / 3.0)]
    [InlineData("150 ohm", 150.0, 0.5)]
    [InlineData("10 ohm", 10.0, -2.0 / 3.0)]
    public void LevelAfterOneRoundTripIsIncidentTimesOnePlusRho(string name, double loadOhms, double rho)
    {
        _ = name;
        const double length = 30, vf = 0.66, vi = 1.0;
        RunEnd end = double.IsPositiveInfinity(loadOhms) ? RunEnd.Open
            : loadOhms == 0 ? RunEnd.Short
            : double.IsNaN(loadOhms) ? RunEnd.Matched
            : RunEnd.Resistor(loadOhms);
        var network = Run(Segment(length, Lossless(50, vf)), end);
        double roundTrip = 2 * length / (vf * C0);
        var trace = ForwardModel.Simulate(network, Settings(RiseSeconds, 3 * roundTrip));

        // Before the echo: the incident level; after it: V_i (1 + ρ), flat to the end of the record.
        Assert.True(MaxDeviation(trace, vi, SettleSeconds, roundTrip - SettleSeconds) < LevelToleranceVolts, "incident level");
        double after = MaxDeviation(trace, vi * (1 + rho), roundTrip + SettleSeconds, trace.EndTimeSeconds);
        Assert.True(after < LevelToleranceVolts, $"level after the echo deviates by {after} V from {vi * (1 + rho)} V");
        // Before the incident edge the port is at rest.
        Assert.True(MaxDeviation(trace, 0, trace.StartTimeSeconds, -SettleSeconds) < LevelToleranceVolts, "pre-trigger level");
    }

    [Theory]
    [InlineData(10.0, 0.66, true)]
    [InlineData(37.5, 0.80, false)]
    [InlineData(123.4, 0.59, true)]
    [InlineData(2.2, 0.95, false)]
    public void ReflectedEdgeMidpointArrivesAtTwiceTheLengthOverTheSpeed(double length, double vf, bool open)
    {
        var network = Run(Segment(length, Lossless(75, vf)), open ? RunEnd.Open : RunEnd.Short);
        double expected = 2 * length / (vf * C0);
        var trace = ForwardModel.Simulate(network, Settings(RiseSeconds, expected + 10 * RiseSeconds, sourceOhms: 75));
        // Open: the port goes from V_i to 2 V_i, midpoint 1.5 V_i; short: from V_i to 0, midpoint 0.5 V_i.
        double crossing = CrossingTime(trace, open ? 1.5 : 0.5, expected - 3 * RiseSeconds, expected + 3 * RiseSeconds);
        Assert.True(Math.Abs(crossing - expected) < ArrivalToleranceSeconds,
            $"reflected edge midpoint at {crossing:E6} s, expected 2l/v = {expected:E6} s");
        // The incident edge's midpoint is the time origin by definition of the trace.
        Assert.True(Math.Abs(CrossingTime(trace, 0.5, -3 * RiseSeconds, 3 * RiseSeconds)) < ArrivalToleranceSeconds, "incident midpoint");
    }

    [Fact]
    public void MismatchedSourceGivesTheDividerAndTheBounceSeries()
    {
        // Z_s ≠ Z₀: incident step V_s·Z₀/(Z_s + Z₀); an open far end re-reflects at the source with
        // ρ_s = (Z_s − Z₀)/(Z_s + Z₀), so the port level after k round trips is the partial sum of the bounce diagram
        // (Pozar §2.3, lattice/bounce picture; worked by hand here): for ρ_L = +1 each returning wave V_inc·ρ_s^(k−1)
        // raises the port by itself plus its own reflection, V_inc·ρ_s^(k−1)·(1 + ρ_s); the sum tends to V_s (open at DC).
        const double length = 20, vf = 0.7, z0 = 50, zs = 100;
        var settings = Settings(RiseSeconds, 8 * 2 * length / (vf * C0), sourceOhms: zs);
        double vs = 2 * settings.IncidentAmplitudeVolts; // the source EMF: A is defined into a load equal to Z_s
        var trace = ForwardModel.Simulate(Run(Segment(length, Lossless(z0, vf)), RunEnd.Open), settings);
        double roundTrip = 2 * length / (vf * C0);
        double vInc = vs * z0 / (zs + z0), rhoS = (zs - z0) / (zs + z0);
        double level = vInc, term = vInc * (1 + rhoS);
        Assert.True(MaxDeviation(trace, level, SettleSeconds, roundTrip - SettleSeconds) < LevelToleranceVolts, "incident level");
        for (int k = 1; k <= 6; k++)
        {
            level += term;
            term *= rhoS;
            double dev = MaxDeviation(trace, level, k * roundTrip + SettleSeconds, (k + 1) * roundTrip - SettleSeconds);
            Assert.True(dev < LevelToleranceVolts, $"after {k} round trips the level deviates by {dev} V from {level} V");
        }
    }
}
