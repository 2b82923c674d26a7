using CableFault.Analysis;

namespace CableFault.Tests.Analysis.Locate;

/// <summary>
/// A resistor with nothing after it but matched line loads the port exactly as a resistive end does: a shunt R across a
/// line of Z that runs on matched is Z‖R at the junction, a series R is Z + R. With the record running well past it, the
/// run is named as ending there, in that many ohms; with more events after it, it is a fault on the line.
/// </summary>
public class ResistiveEndTests
{
    /// <summary>A resistor of <paramref name="ohms"/> on a 50 Ω line, well supported, with 1 µs of record after it.</summary>
    private static (EventKind Kind, double Reflection, double? Value) Classify(RunModelElement element, double ohms, bool last)
    {
        var r = EventClassifier.Classify(new EventClassifier.Input(element, Value: ohms, ImpedanceBeforeOhms: 50,
            LogSizeSigma: 0.01, PeakSignatureVolts: 0.2, IncidentLevelVolts: 1, NoiseRmsVolts: 1e-3, DeltaBic: 500,
            IsLastOnMainLine: last, RecordAfterSeconds: 1e-6, RiseSeconds: 1e-9));
        return (r.Kind, r.Reflection, r.Value);
    }

    [Fact]
    public void ALastShuntResistorIsATerminationOfZParallelR()
    {
        var (kind, rho, value) = Classify(RunModelElement.ShuntResistor, 100, last: true);
        Assert.Equal(EventKind.Termination, kind);
        // 50 Ω ‖ 100 Ω = 33.33 Ω; ρ = (33.33 − 50)/(33.33 + 50) = −0.2 (Pozar, Microwave Engineering, 4th ed., eq. 2.35).
        Assert.Equal(100.0 / 3, value!.Value, 6);
        Assert.Equal(-0.2, rho, 9);
    }

    [Fact]
    public void ALastSeriesResistorIsATerminationOfZPlusR()
    {
        var (kind, rho, value) = Classify(RunModelElement.SeriesResistor, 25, last: true);
        Assert.Equal(EventKind.Termination, kind);
        // 50 + 25 = 75 Ω; ρ = 25/125 = 0.2.
        Assert.Equal(75, value!.Value, 9);
        Assert.Equal(0.2, rho, 9);
    }

    [Fact]
    public void AResistorWithEventsAfterItIsAFault()
    {
        Assert.Equal(EventKind.PartialShort, Classify(RunModelElement.ShuntResistor, 100, last: false).Kind);
        Assert.Equal(EventKind.SeriesResistance, Classify(RunModelElement.SeriesResistor, 25, last: false).Kind);
    }
}
