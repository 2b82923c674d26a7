using CableFault.Analysis;
using CableFault.Networks;
using static CableFault.Tests.Analysis.Locate.LocateFixtures;

namespace CableFault.Tests.Analysis.Locate;

/// <summary>
/// A section of other cable only a few resolution units long first reads as a lumped L (higher impedance) or C (lower)
/// or a row of them. Named so, it is the wrong fault, and every later event lands too early by the delay the lumped
/// spots add (Z·C/2 or L/(2Z) each way). The network is the truth.
/// </summary>
public class ShortSectionTests
{
    [Theory]
    // 0.30 m is three resolution units v·t_r/2 (0.099 m at 1 ns, VF 0.66).
    [InlineData(75.0, 0.30, 5)]
    [InlineData(35.0, 0.30, 5)]
    [InlineData(75.0, 0.22, 5)]
    // On this noise the drop first fits as a spot that a tap reads better still; the section was never tried against the
    // tap, and the run was read as a tap, an open and a tap before a short.
    [InlineData(35.0, 0.30, 6)]
    public void ShortSectionIsARiseAndADropAndLeavesTheFarEndInPlace(double sectionOhms, double sectionMeters, int seed)
    {
        const double start = 6, end = 12, terminationOhms = 30;
        var network = Run(Segment(start), Segment(sectionMeters, sectionOhms), Segment(end - start - sectionMeters), RunEnd.Resistor(terminationOhms));
        var result = Locator.Locate(Simulate(network, seed: seed), Options());
        string all = string.Join("; ", result.Events.Select(e => $"{e.Kind} at {e.DistanceMeters:0.###} m"));

        // ρ = (Z₁ − Z)/(Z₁ + Z) (Pozar, Microwave Engineering, 4th ed., eq. 2.35); ±0.03 allows for the edge only partly
        // reaching its plateau inside a section two or three rise times long.
        double rho = (sectionOhms - ImpedanceOhms) / (sectionOhms + ImpedanceOhms);
        var first = Near(result, start);
        Assert.True(first.Kind == (rho > 0 ? EventKind.ImpedanceRise : EventKind.ImpedanceDrop), $"expected a step at {start} m; found: {all}");
        Assert.InRange(first.DistanceMeters, start - DistanceTolerance(start), start + DistanceTolerance(start));
        Assert.InRange(first.Reflection, rho - 0.03, rho + 0.03);
        double back = start + sectionMeters;
        var second = Near(result, back);
        Assert.True(second.Kind == (rho > 0 ? EventKind.ImpedanceDrop : EventKind.ImpedanceRise), $"expected a step back at {back} m; found: {all}");
        Assert.InRange(second.DistanceMeters, back - DistanceTolerance(back), back + DistanceTolerance(back));

        var termination = Near(result, end);
        Assert.True(termination.Kind == EventKind.Termination, $"expected a termination at {end} m; found: {all}");
        Assert.InRange(termination.DistanceMeters, end - DistanceTolerance(end), end + DistanceTolerance(end));
        Assert.True(result.Events.Count == 3, $"expected exactly three events; found: {all}");
    }
}
