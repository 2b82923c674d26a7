using CableFault.Analysis;
using static CableFault.Tests.Analysis.Conditioning.ConditioningFixtures;

namespace CableFault.Tests.Analysis.Conditioning;

/// <summary>Layer peeling against networks whose impedances are known because they were built here.</summary>
public class LayerPeelingTests
{
    /// <summary>The brief's accuracy for plateaus of a lossless staircase.</summary>
    private const double PlateauToleranceOhms = 1.0;

    /// <summary>Plateaus are read away from the boundaries: two rise times (≈ 0.2 m at VF 0.66, 1 ns) each side,
    /// taken as 1 m to stay clear of the band-limited transition.</summary>
    private const double GuardMeters = 1.0;

    [Fact]
    public void StaircaseIsRecoveredWithinOneOhmWhereTheNaiveReadingIsNot()
    {
        var raw = Simulate(Staircase(), 0.002);
        var c = TraceConditioner.Characterise(raw);
        var aligned = TraceConditioner.Align(raw, c);
        var profile = LayerPeeling.Profile(aligned, c, 50, VelocityFactor, null);

        // Sections (true impedance, from, to in metres) as built in ConditioningFixtures.Staircase.
        (double Ohms, double From, double To)[] sections = [(50, 0, 20), (75, 20, 30), (35, 30, 40), (50, 40, 60)];
        double lastNaive = double.NaN, lastPeeled = double.NaN;
        foreach (var (ohms, from, to) in sections)
        {
            double peeled = MeanOver(profile.DistancesMeters, profile.ImpedanceOhms, from + GuardMeters, to - GuardMeters);
            Assert.InRange(peeled, ohms - PlateauToleranceOhms, ohms + PlateauToleranceOhms);
            lastPeeled = peeled;
            lastNaive = NaiveImpedance(aligned, c, from + GuardMeters, to - GuardMeters);
        }
        // Naive Z0(1+ρ)/(1−ρ) on the last 50 Ω section: the step level there carries the transmission losses of three
        // boundaries, (1−k₁²)(1−k₂²)(1−k₃²), and reads more than the tolerance off; the peeled value does not.
        Assert.True(Math.Abs(lastNaive - 50) > PlateauToleranceOhms, $"naive reading {lastNaive:F2} Ω was expected to be wrong by more than 1 Ω");
        Assert.True(Math.Abs(lastPeeled - 50) < Math.Abs(lastNaive - 50) / 2);
    }

    [Fact]
    public void SourceMismatchIsRemoved()
    {
        // A 75 Ω source on a 50 Ω run: the port sees the divider, and the source re-reflects every echo.
        var network = Staircase();
        var raw = CableFault.Simulation.ForwardModel.Simulate(network, Settings(network, 0.001) with { SourceImpedanceOhms = 75 });
        var c = TraceConditioner.Characterise(raw);
        var profile = LayerPeeling.Profile(TraceConditioner.Align(raw, c), c, 50, VelocityFactor, null, 75);
        Assert.InRange(MeanOver(profile.DistancesMeters, profile.ImpedanceOhms, 21, 29), 75 - PlateauToleranceOhms, 75 + PlateauToleranceOhms);
        Assert.InRange(MeanOver(profile.DistancesMeters, profile.ImpedanceOhms, 41, 59), 50 - PlateauToleranceOhms, 50 + PlateauToleranceOhms);
    }

    [Fact]
    public void ResistiveEndReadsAsItsResistance()
    {
        // A 100 Ω load on 50 Ω line: beyond the end the peeled line continues at 100 Ω (a semi-infinite line of
        // impedance R is indistinguishable from R; DESIGN.md §2, ρ = (R − Z0)/(R + Z0) = 1/3).
        var raw = Simulate(Run(new CableFault.Networks.CableSegment(20, Line(50)), CableFault.Networks.RunEnd.Resistor(100)), 0.001);
        var c = TraceConditioner.Characterise(raw);
        var profile = LayerPeeling.Profile(TraceConditioner.Align(raw, c), c, 50, VelocityFactor, null);
        Assert.InRange(MeanOver(profile.DistancesMeters, profile.ImpedanceOhms, 22, 40), 99, 101);
    }

    internal static double MeanOver(double[] x, double[] y, double from, double to)
    {
        double s = 0; int n = 0;
        for (int i = 0; i < x.Length; i++) if (x[i] >= from && x[i] <= to) { s += y[i]; n++; }
        Assert.True(n > 0, $"no profile points between {from} and {to} m");
        return s / n;
    }

    private static double NaiveImpedance(CableFault.Traces.Trace aligned, TraceCharacteristics c, double from, double to)
    {
        double s = 0; int n = 0;
        for (int i = 0; i < aligned.Length; i++)
        {
            double d = VelocityFactor * CableFault.PhysicalConstants.SpeedOfLightMetersPerSecond * aligned.TimeAt(i) / 2;
            if (d < from || d > to) continue;
            double rho = aligned.SamplesVolts[i] / c.IncidentAmplitudeVolts - 1;
            s += 50 * (1 + rho) / (1 - rho); n++;
        }
        return s / n;
    }
}
