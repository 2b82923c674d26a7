using CableFault.Analysis;
using CableFault.Networks;
using CableFault.Simulation;
using CableFault.Traces;

namespace CableFault.Tests.Analysis.Locate;

/// <summary>
/// A 50 Ω reflectometer on 75 Ω cable, with locate not told the instrument's impedance (it then takes the cable's):
/// the 75/50 step at the port, ρ = (75 − 50)/(75 + 50) = +0.2 (Pozar, <i>Microwave Engineering</i>, 4th ed., eq. 2.35),
/// falls in the blind zone and is said in a warning. That warning must name the likely cause and the setting that
/// fixes it; told the source, the step is gone and so is the hint. The network, simulated here, is the truth.
/// </summary>
public class SourceMismatchTests
{
    /// <summary>75 Ω cable, VF 0.85, lossless: 30 m to a 150 Ω resistive end.</summary>
    private static Trace FiftyOhmInstrumentOnSeventyFiveOhmCable()
    {
        var network = new CableNetwork(new NetworkBranch(new CableSegment(30, new Cables.CableMedium(75, 0.85)), RunEnd.Resistor(150)));
        return ForwardModel.Simulate(network, InstrumentSettings.DefaultFor(network, 1e-9) with
        {
            SourceImpedanceOhms = 50, NoiseRmsVolts = 1e-3, NoiseSeed = 3, SampleIntervalSeconds = 1e-9 / 8,
        });
    }

    private static LocateOptions Told(double sourceOhms) =>
        new() { VelocityFactor = 0.85, ImpedanceOhms = 75, SourceImpedanceOhms = sourceOhms };

    [Fact]
    public void A_fifty_ohm_instrument_taken_for_seventy_five_is_named()
    {
        var result = Locator.Locate(FiftyOhmInstrumentOnSeventyFiveOhmCable(), Told(75));
        Assert.True(result.Warnings.Any(w => w.Contains("--source-ohms 50", StringComparison.Ordinal)), string.Join(" | ", result.Warnings) + " | " + result.Fit.Message + string.Join(";", result.Events.Select(e => $" {e.Kind} {e.DistanceMeters:0.##} {e.Value:G3}")));
    }

    [Fact]
    public void Told_the_instruments_impedance_there_is_nothing_to_name()
    {
        var result = Locator.Locate(FiftyOhmInstrumentOnSeventyFiveOhmCable(), Told(50));
        Assert.DoesNotContain(result.Warnings, w => w.Contains("--source-ohms", StringComparison.Ordinal));
        // And the end reads as what it is: 150 Ω (within 2 %, what 1 mV of noise leaves on a step of ρ = 1/3).
        var end = Assert.Single(result.Events);
        Assert.Equal(EventKind.Termination, end.Kind);
        Assert.InRange(end.Value!.Value, 147, 153);
    }

    /// <summary>
    /// On lossy cable the fit puts the 75/50 step at the port as an event (the lossy line's own slow rise after the edge
    /// keeps the plateau from absorbing it), which falls in the blind zone: its warning names the likely cause too,
    /// since ρ = +0.2 is exactly 75 Ω against 50 Ω.
    /// </summary>
    [Fact]
    public void A_step_at_the_port_that_a_fifty_ohm_instrument_makes_is_named()
    {
        var rg6 = Cables.CableLibrary.BuiltIn.Get("RG-6");
        var network = new CableNetwork(new NetworkBranch(new CableSegment(15, rg6.Medium), new ShuntCapacitor(10e-12),
            new CableSegment(45, rg6.Medium), RunEnd.Resistor(75)));
        var trace = ForwardModel.Simulate(network, InstrumentSettings.DefaultFor(network, 0.5e-9) with
        {
            SourceImpedanceOhms = 50, NoiseRmsVolts = 1e-3, NoiseSeed = 3, SampleIntervalSeconds = 0.5e-9 / 8, SampleCount = 24_000,
        });
        var result = Locator.Locate(trace, Told(75) with { Loss = rg6.Loss });
        Assert.True(result.Warnings.Any(w => w.Contains("at the instrument's connector", StringComparison.Ordinal)
            && w.Contains("--source-ohms 50", StringComparison.Ordinal)), string.Join(" | ", result.Warnings));
    }
}
