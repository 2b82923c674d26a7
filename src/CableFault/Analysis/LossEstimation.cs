using CableFault.Cables;

namespace CableFault.Analysis;

/// <summary>
/// The cable's loss, when no setting gives it, from the trace itself: the detector's events are fitted once with the loss
/// free (skin effect k_c·√f and loop DC resistance, see <see cref="RunModelContext"/>) and once lossless, and the
/// Bayesian information criterion decides (the lossy reading has two parameters more, so it must earn them). A lossless
/// run is then read exactly as when told it is lossless; a lossy one starts the selection from this estimate.
/// </summary>
/// <remarks>
/// A lossy cable fitted as lossless leaves rounded edges and the slope of its DC resistance unexplained, and the selection
/// explains them with invented events (accuracy benchmark, every run told VF and Z₀ only: 326 false events on the lossy
/// runs' 295 true ones). A lossless run must stay lossless: a small loss estimated from noise would change every later
/// reading.
/// </remarks>
internal static class LossEstimation
{
    /// <summary>The estimated loss, or null when the trace does not show one the criterion accepts.</summary>
    /// <param name="initial">The starting model (the detector's events); its own context's loss is not used.</param>
    /// <param name="data">The data the selection fits.</param>
    /// <param name="cancellation">Cancels the probe fits.</param>
    internal static CableLossModel? Estimate(RunModel initial, FitData data, CancellationToken cancellation)
    {
        var lossyStart = initial.WithContext(initial.Context with { Loss = RunModelContext.EstimateStart, EstimateLoss = true });
        var losslessStart = initial.WithContext(initial.Context with { Loss = null, EstimateLoss = false });
        double variance = ModelSelection.SampleVariance(data, initial);
        var fits = ModelFitter.FitEach([lossyStart, losslessStart], data, variance, cancellation: cancellation);
        var (lossy, lossless) = (fits[0], fits[1]);
        double lossyBic = ModelSelection.Criterion(lossy, data, variance);
        double losslessBic = ModelSelection.Criterion(lossless, data, variance);
        if (!(lossyBic < losslessBic - Margin(losslessBic)) || AtBound(lossy.Model.Context.Loss)) return null;
        // The two fits may have ended in different places for reasons that have nothing to do with loss (the lossy fit
        // moved an event the lossless one did not): the lossy fit's events are fitted again without loss, and only a
        // loss that still wins is taken.
        var againLossless = ModelFitter.Fit(lossy.Model.WithContext(losslessStart.Context), data, variance, cancellation: cancellation);
        double againBic = ModelSelection.Criterion(againLossless, data, variance);
        ModelSelection.DebugTrace?.Invoke($"loss probe: lossy {lossyBic:0.0} ({lossy.Model.Context.Loss?.AttenuationDbPer100m(100e6):0.##} dB/100 m, {lossy.Model.Context.Loss?.DcResistanceOhmsPerMeter:0.###} Ω/m), lossless {losslessBic:0.0}, lossless from the lossy events {againBic:0.0}");
        return lossyBic < againBic - Margin(againBic) ? lossy.Model.Context.Loss : null;
    }

    /// <summary>Share of the lossless criterion a loss must explain on top of the evidence margin: the probe fits start
    /// from the detector's events, and where those are far from the data (a criterion in the millions) a fit that merely
    /// settled elsewhere differs by a fraction of a per cent either way (benchmark, loss not told: lossless runs read as
    /// lossy by 0.6 % and 3 %, lossy ones winning by 7 % and more).</summary>
    private const double RelativeMargin = 0.05;

    private static double Margin(double losslessBic) => Math.Max(ModelSelection.EvidenceMargin, RelativeMargin * Math.Abs(losslessBic));

    /// <summary>True when either coefficient sits at its bound (<see cref="RunModelContext.MaximumLossScales"/>): the loss
    /// is then standing in for a misfit of another kind, not measuring the cable.</summary>
    private static bool AtBound(CableLossModel? loss) => loss is not null
        && (loss.SkinLossNepersPerMeterPerRootHertz >= 0.99 * RunModelContext.MaximumLossScales * RunModelContext.SkinLossScale
            || loss.DcResistanceOhmsPerMeter >= 0.99 * RunModelContext.MaximumLossScales * RunModelContext.DcResistanceScale);
}
