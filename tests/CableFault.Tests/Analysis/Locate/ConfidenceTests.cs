using CableFault.Analysis;

namespace CableFault.Tests.Analysis.Locate;

/// <summary>
/// Confidence counts what the model leaves unexplained around an event as noise: a small event inside a poorly fitted
/// stretch may be the fit soaking up that misfit, while an event far above the misfit stays certain.
/// </summary>
public class ConfidenceTests
{
    /// <summary>A boundary of given peak signature, with strong criterion support, on 1 mV noise.</summary>
    private static double Confidence(double peakVolts, double localMisfitRatio) =>
        EventClassifier.Classify(new EventClassifier.Input(RunModelElement.Boundary, Value: 60, ImpedanceBeforeOhms: 50,
            LogSizeSigma: 0.01, PeakSignatureVolts: peakVolts, IncidentLevelVolts: 1, NoiseRmsVolts: 1e-3, DeltaBic: 500,
            IsLastOnMainLine: false, RecordAfterSeconds: 1e-6, RiseSeconds: 1e-9, LocalMisfitRatio: localMisfitRatio)).Confidence;

    [Fact]
    public void ASmallEventInAPoorlyFittedStretchIsLessCertain()
    {
        // 20 mV = 20σ: certain where the model fits (1 − e^(−4) ≈ 0.98), doubtful where the residual is 10σ (1 − e^(−0.4)).
        Assert.True(Confidence(0.02, 1) > 0.95);
        Assert.True(Confidence(0.02, 10) < 0.5);
    }

    [Fact]
    public void AnEventFarAboveTheMisfitStaysCertain()
    {
        // An open end's 1 V beside a 20σ misfit is still 50σ over it.
        Assert.True(Confidence(1.0, 20) > 0.99);
    }

    [Fact]
    public void AMisfitBelowTheNoiseChangesNothing() => Assert.Equal(Confidence(0.01, 1), Confidence(0.01, 0.5));
}
