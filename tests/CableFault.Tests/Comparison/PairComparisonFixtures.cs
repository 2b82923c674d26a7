using CableFault.Cables;
using CableFault.Networks;
using CableFault.Simulation;
using CableFault.Traces;

namespace CableFault.Tests.Comparison;

/// <summary>
/// Pairs of one multi-pair 100 Ω cable, built from parts and simulated with the forward model: the networks are the
/// ground truth. Each pair has its own Z₀, VF and a seeded ripple of its impedance along the run, as pairs of one cable do.
/// </summary>
internal static class PairComparisonFixtures
{
    /// <summary>Nominal Z₀ of the reference pair, Ω (a 100 Ω data/telemetry pair).</summary>
    internal const double NominalOhms = 100;

    /// <summary>VF of the reference pair (typical of a PE-insulated data pair; common practice).</summary>
    internal const double NominalVelocityFactor = 0.68;

    /// <summary>Length of the run, m.</summary>
    internal const double RunMeters = 80;

    /// <summary>Pieces the run is built from; each piece's Z₀ is drawn independently, so the impedance ripples.</summary>
    internal const int RipplePieces = 16;

    /// <summary>Ripple of Z₀ along a pair, as a fraction: ±1 % uniform (from memory; see
    /// <see cref="CableFault.Comparison.CompareTolerances.PairMinimumBand"/>).</summary>
    internal const double RippleFraction = 0.01;

    internal const double RiseSeconds = 0.5e-9;

    /// <summary>Loss of a category 5e pair (the built-in CAT5E type's data-sheet figures).</summary>
    internal static CableLossModel Loss { get; } = CableLossModel.FromDatasheet(6.5, 10e6, 22.0, 100e6);

    /// <summary>
    /// A pair of the cable: <paramref name="ohms"/> and <paramref name="velocityFactor"/>, rippled ±1 % piece by piece
    /// (seed <paramref name="rippleSeed"/>), with <paramref name="fault"/> inserted at <paramref name="faultMeters"/>
    /// (null: none), ending in <paramref name="end"/>. The fault cuts the run when it is a <see cref="RunEnd"/>.
    /// </summary>
    internal static CableNetwork Pair(double ohms, double velocityFactor, int rippleSeed,
        NetworkElement? fault = null, double faultMeters = 0, RunEnd? end = null)
    {
        var random = new Random(rippleSeed);
        var elements = new List<NetworkElement>();
        double piece = RunMeters / RipplePieces;
        for (int k = 0; k < RipplePieces; k++)
        {
            double start = k * piece, stop = start + piece;
            var medium = new CableMedium(ohms * (1 + RippleFraction * (2 * random.NextDouble() - 1)), velocityFactor, Loss);
            if (fault is not null && faultMeters > start && faultMeters <= stop)
            {
                elements.Add(new CableSegment(faultMeters - start, medium));
                elements.Add(fault);
                if (fault is RunEnd) return new CableNetwork(new NetworkBranch(elements));
                if (stop > faultMeters) elements.Add(new CableSegment(stop - faultMeters, medium));
            }
            else
            {
                elements.Add(new CableSegment(piece, medium));
            }
        }
        elements.Add(end ?? RunEnd.Open);
        return new CableNetwork(new NetworkBranch(elements));
    }

    /// <summary>One instrument for every pair: 100 Ω source, 0.5 ns rise, Δt = rise/4, 1 V step, a record of 1050 ns
    /// after the edge (1.3 round trips of the 80 m run at VF 0.68).</summary>
    internal static InstrumentSettings Settings(double noiseVolts, int seed) => new()
    {
        SourceImpedanceOhms = NominalOhms,
        RiseTimeSeconds = RiseSeconds,
        SampleIntervalSeconds = RiseSeconds / 4,
        PreTriggerSeconds = 5e-9,
        SampleCount = (int)Math.Ceiling((5e-9 + 1050e-9) / (RiseSeconds / 4)) + 1,
        NoiseRmsVolts = noiseVolts,
        NoiseSeed = seed,
    };

    /// <summary>A capture, carrying the cable type (for its loss) and its nominal VF and Z₀, as the instrument was set up for the cable.</summary>
    internal static Trace Capture(CableNetwork network, double noiseVolts, int seed, string name) =>
        ForwardModel.Simulate(network, Settings(noiseVolts, seed))
            .WithMetadata("cable", "CAT5E").WithMetadata("vf", "0.68").WithMetadata("z0", "100").WithMetadata("source_ohms", "100").WithMetadata("run", name);
}
