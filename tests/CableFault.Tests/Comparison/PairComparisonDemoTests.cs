using CableFault.Cables;
using CableFault.Comparison;
using CableFault.Networks;
using CableFault.Tests.Cli;
using CableFault.Traces;

namespace CableFault.Tests.Comparison;

/// <summary>
/// The shipped multi-pair demo (traces/quillon-bay/sensor-cable-pair1/3): pair 3 of the telemetry cable checked against
/// pair 1. The network files beside the traces are the ground truth; the figures are read from them, not typed here.
/// </summary>
public class PairComparisonDemoTests
{
    /// <summary>Fitted length difference against the networks' VF ratio, as a fraction: 0.002, as in
    /// <see cref="PairComparisonTests"/> (the ends are read to a few centimetres; 0.002 of 58.6 m is 12 cm).</summary>
    private const double LengthDifferenceTolerance = 0.002;

    private static string Folder => Path.Combine(CliRunner.RepositoryRoot(), "traces", "quillon-bay");

    private static Trace Load(string name)
    {
        using var stream = File.OpenRead(Path.Combine(Folder, name));
        return TraceCsvReader.ReadWithWarnings(stream, name).Trace.WithMetadata("file", name);
    }

    private static CableNetwork Network(string name)
    {
        using var stream = File.OpenRead(Path.Combine(Folder, name));
        return NetworkJson.Read(stream, name, CableLibrary.BuiltIn);
    }

    [Fact]
    public void Pair3DiffersFromPair1AtTheWetJoint()
    {
        var pair3 = Network("sensor-cable-pair3.network.json");
        // Where the leak is: the lengths of the segments before the shunt resistor.
        var elements = pair3.Run.Elements;
        int leak = elements.ToList().FindIndex(e => e is ShuntResistor);
        double leakMeters = elements.Take(leak).OfType<CableSegment>().Sum(s => s.LengthMeters);
        double wetStartMeters = elements.Take(leak).OfType<CableSegment>().SkipLast(1).Sum(s => s.LengthMeters);

        var result = RepairCheck.Compare(Load("sensor-cable-pair1.csv"), Load("sensor-cable-pair3.csv"),
            new RepairCheckOptions { ReferenceKind = ReferenceKind.Pair });
        Assert.False(result.Pass, CompareFixtures.Describe(result));
        // The difference starts at the wet stretch (its lower impedance) or at the leak in its middle.
        Assert.InRange(result.FirstDifferenceMeters!.Value, wetStartMeters - result.Tolerances.DistanceAt(wetStartMeters),
            leakMeters + result.Tolerances.DistanceAt(leakMeters));
    }

    [Fact]
    public void PairSpreadMatchesTheTwoNetworks()
    {
        var pair1 = Network("sensor-cable-pair1.network.json");
        var pair3 = Network("sensor-cable-pair3.network.json");
        double vf1 = pair1.Run.Elements.OfType<CableSegment>().First().Medium.VelocityFactor;
        double vf3 = pair3.Run.Elements.OfType<CableSegment>().First().Medium.VelocityFactor;
        double z1 = pair1.Run.Elements.OfType<CableSegment>().First().Medium.ImpedanceOhms;
        double z3 = pair3.Run.Elements.OfType<CableSegment>().First().Medium.ImpedanceOhms;

        var result = RepairCheck.Compare(Load("sensor-cable-pair1.csv"), Load("sensor-cable-pair3.csv"),
            new RepairCheckOptions { ReferenceKind = ReferenceKind.Pair });
        var spread = result.Spread!;
        Assert.True(spread.LengthFitted, CompareFixtures.Describe(result));
        // Same cable length, round trip ∝ 1/VF (DESIGN.md §2).
        Assert.Equal(vf1 / vf3 - 1, spread.LengthDifferenceFraction!.Value, LengthDifferenceTolerance);
        // The estimate takes pair 1 as nominal (100 Ω); the truth is pair 3's first piece scaled by 100/z1.
        // 0.5 Ω: the step heights are read to about 0.1 %, which the divider doubles (see PairComparisonTests).
        Assert.Equal(z3 * 100 / z1, spread.CurrentImpedanceOhms!.Value, 0.5);
    }
}
