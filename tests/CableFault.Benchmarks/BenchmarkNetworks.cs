using CableFault.Cables;
using CableFault.Networks;

namespace CableFault.Benchmarks;

/// <summary>Networks used by the benchmarks.</summary>
public static class BenchmarkNetworks
{
    /// <summary>
    /// Ten elements: four lossy coax segments, a lumped C, a series L, a shunt R, a Y split with two branches
    /// (counted as one element) and the ends.
    /// </summary>
    public static CableNetwork TenElements()
    {
        var coax = BuiltInCableTypes.All.First(t => t.Designation == "RG-58").Medium;
        return TenElements(coax, new CableMedium(75, 0.66, coax.Loss), "benchmark ten-element run");
    }

    /// <summary><see cref="TenElements()"/> on lossless cable (a fit with the loss not given, or a short run).</summary>
    public static CableNetwork TenElementsLossless() =>
        TenElements(new CableMedium(50, 0.66), new CableMedium(75, 0.66), "benchmark ten-element lossless run");

    /// <summary>The ten elements on <paramref name="coax"/>, with a 3 m piece of <paramref name="other"/>.</summary>
    private static CableNetwork TenElements(CableMedium coax, CableMedium other, string name) =>
        new(new NetworkBranch(
            new CableSegment(20, coax),
            new ShuntCapacitor(8e-12),
            new CableSegment(15, coax),
            new SeriesInductor(25e-9),
            new CableSegment(3, other),
            new ShuntResistor(500),
            new CableSegment(10, coax),
            new Junction([
                new NetworkBranch(new CableSegment(12, coax), RunEnd.Open),
                new NetworkBranch(new CableSegment(7, coax), RunEnd.Resistor(100)),
            ])), name);
}
