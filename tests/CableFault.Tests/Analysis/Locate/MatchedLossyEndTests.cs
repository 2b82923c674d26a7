using System.Globalization;
using CableFault.Analysis;
using CableFault.Cables;
using CableFault.Networks;
using CableFault.Reporting;
using CableFault.Reporting.Locate;
using CableFault.Simulation;
using CableFault.Tests.Reference.Ngspice;
using CableFault.Traces;

namespace CableFault.Tests.Analysis.Locate;

/// <summary>
/// A lossy run terminated in its own impedance shows no step where it ends, only the turn of the lossy line's slow creep
/// (see <see cref="MatchedLossyEnd"/>). The network, simulated by the forward model, is the ground truth: RG-6
/// (75 Ω, VF 0.85, the built-in data-sheet loss), a 0.5 ns edge, 1 mV of noise and a 1 µs record (16 000 samples).
/// </summary>
public class MatchedLossyEndTests
{
    private const double RiseSeconds = 0.5e-9;

    private static readonly CableType Rg6 = CableLibrary.BuiltIn.Get("RG-6");

    private static Trace Record(CableNetwork network, int seed = 5) =>
        ForwardModel.Simulate(network, InstrumentSettings.DefaultFor(network, RiseSeconds) with
        {
            SourceImpedanceOhms = 75, NoiseRmsVolts = 1e-3, NoiseSeed = seed, SampleIntervalSeconds = RiseSeconds / 8,
            SampleCount = 16_000,
        });

    private static LocateOptions Told(CableLossModel loss) => new()
    {
        VelocityFactor = Rg6.VelocityFactor, ImpedanceOhms = 75, SourceImpedanceOhms = 75, Loss = loss,
    };

    private static CableNetwork Run(CableMedium cable, double meters, RunEnd end) =>
        new(new NetworkBranch(new CableSegment(meters, cable), end));

    private static string Listing(LocateResult r) =>
        string.Join("; ", r.Events.Select(e => $"{e.Kind} at {e.DistanceMeters:0.###} ± {e.DistanceSigmaMeters:0.###} m ({e.Value:G4})"))
        + " | " + string.Join(" | ", r.Warnings);

    /// <summary>The end is found where the resistor is, as a termination of 75 Ω; the table prints its ρ as 0.000.</summary>
    [Theory]
    [InlineData(40.0)]
    [InlineData(60.0)]
    public void A_matched_resistor_at_the_end_of_lossy_coax_is_located(double meters)
    {
        var result = Locator.Locate(Record(Run(Rg6.Medium, meters, RunEnd.Resistor(75))), Told(Rg6.Loss));

        var end = Assert.Single(result.Events, e => e.Kind != EventKind.Unknown);
        Assert.True(end.Kind == EventKind.Termination, Listing(result));
        // The fit's model is the simulator's, so the place is limited by the noise on a slow turn: a few centimetres
        // were measured; 0.25 m is a quarter of what a technician digs for and far inside the reported ±.
        Assert.True(Math.Abs(end.DistanceMeters - meters) < 0.25, Listing(result));
        Assert.InRange(end.Value!.Value, 73.5, 76.5);
        string text = LocateText.Render(result, "terminated.csv", DistanceUnit.Meters);
        Assert.DoesNotContain("-+", text);
        Assert.DoesNotContain("looks uniform and matched", text);
    }

    /// <summary>A run that goes on beyond the record (the simulator's matched end is the line's own Z_c(s)) has no end
    /// to find: nothing is listed.</summary>
    [Fact]
    public void Lossy_coax_that_goes_on_gets_no_termination()
    {
        var result = Locator.Locate(Record(Run(Rg6.Medium, 40, RunEnd.Matched)), Told(Rg6.Loss));
        Assert.True(result.Events.Count == 0, Listing(result));
    }

    /// <summary>A lossless cable read with RG-6's loss does not creep as the model expects; the search must not explain
    /// that with an end at the connector.</summary>
    [Fact]
    public void A_wrong_loss_setting_is_not_read_as_an_end()
    {
        var lossless = new CableMedium(75, Rg6.VelocityFactor);
        var result = Locator.Locate(Record(Run(lossless, 40, RunEnd.Resistor(75))), Told(Rg6.Loss));
        Assert.False(result.Events.Any(e => e.Kind == EventKind.Termination), Listing(result));
    }

    /// <summary>
    /// Where the creep turns depends on how lossy the cable is taken to be. A cable with 20 % more or less loss than the
    /// data sheet's, read with the data sheet's, puts its end a metre or two off; the ± must say so (within two σ).
    /// </summary>
    [Theory]
    [InlineData(0.8)]
    [InlineData(1.2)]
    public void The_plus_minus_covers_a_loss_setting_that_is_off(double lossScale)
    {
        var loss = Rg6.Loss;
        var actual = new CableMedium(75, Rg6.VelocityFactor, new CableLossModel(lossScale * loss.SkinLossNepersPerMeterPerRootHertz,
            lossScale * loss.DielectricLossNepersPerMeterPerHertz, lossScale * loss.DcResistanceOhmsPerMeter));
        var result = Locator.Locate(Record(Run(actual, 40, RunEnd.Resistor(75))), Told(loss));

        var end = Assert.Single(result.Events, e => e.Kind == EventKind.Termination);
        Assert.True(Math.Abs(end.DistanceMeters - 40) < 2 * end.DistanceSigmaMeters, Listing(result));
    }

    /// <summary>
    /// The same end on a trace from ngspice (Debian package ngspice, an independent circuit simulator; its LTRA element
    /// solves the RLC telegrapher's equations): 30 m of 100 Ω line (VF 0.66) with 0.2 Ω/m of series resistance and no
    /// other loss, into 100 Ω, fed from 100 Ω with a 2 ns error-function edge (the edge and the LTRA line of
    /// Reference/Ngspice/lossy.cir). Here the series resistance alone makes Z_c(s) = √((R + sL)/(sC)) climb, and the
    /// resistor at 30 m holds the level at 2·100/(100 + 100 + 6) of the source where the line going on would climb on.
    /// </summary>
    [NgspiceTheory]
    [InlineData(30.0)]
    public void A_matched_resistor_on_an_ngspice_rlc_line_is_located(double meters)
    {
        const double vf = 0.66, z0 = 100, ohmsPerMeter = 0.2, rise = 2e-9, pre = 10e-9, dt = rise / 8, tstop = 700e-9;
        string I(double value) => value.ToString("R", CultureInfo.InvariantCulture);
        string circuit = $$"""
            * matched lossy end: {{I(meters)}} m of RLC line into {{I(z0)}} ohm
            .param z0={{I(z0)}} vf={{I(vf)}} len={{I(meters)}} r={{I(ohmsPerMeter)}} rise={{I(rise)}} pre={{I(pre)}} c0=299792458
            .param sig={rise/2.5631031310892007} tmax={sig/10}
            {{GeneratedNetlist.ErfEdge}}
            Rs src port {z0}
            O1 port 0 far 0 lmod
            .model lmod ltra r={r} l={z0/(vf*c0)} g=0 c={1/(z0*vf*c0)} len={len}
            Rfar far 0 {z0}
            .tran {tmax} {{I(tstop + pre)}} 0 {tmax}
            """;
        var trace = GeneratedNetlist.Run(circuit, "matched-end", pre, dt, (int)Math.Floor(tstop / dt));
        var result = Locator.Locate(trace, new LocateOptions
        {
            VelocityFactor = vf, ImpedanceOhms = z0, SourceImpedanceOhms = z0, Loss = new CableLossModel(0, 0, ohmsPerMeter),
        });

        var end = Assert.Single(result.Events, e => e.Kind != EventKind.Unknown);
        Assert.True(end.Kind == EventKind.Termination, Listing(result));
        Assert.True(Math.Abs(end.DistanceMeters - meters) < 0.25, Listing(result));
        Assert.InRange(end.Value!.Value, 98, 102);
    }
}
