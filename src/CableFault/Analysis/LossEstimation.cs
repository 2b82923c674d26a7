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
    internal static CableLossModel? Estimate(RunModel initial, FitData data, CancellationToken cancellation) =>
        ContextProbe.Decide(initial, initial.Context with { Loss = RunModelContext.EstimateStart, EstimateLoss = true },
            initial.Context with { Loss = null, EstimateLoss = false }, data, found => !AtBound(found.Loss), "loss", cancellation)?.Loss;

    /// <summary>True when either coefficient sits at its bound (<see cref="RunModelContext.MaximumLossScales"/>): the loss
    /// is then standing in for a misfit of another kind, not measuring the cable.</summary>
    private static bool AtBound(CableLossModel? loss) => loss is not null
        && (loss.SkinLossNepersPerMeterPerRootHertz >= 0.99 * RunModelContext.MaximumLossScales * RunModelContext.SkinLossScale
            || loss.DcResistanceOhmsPerMeter >= 0.99 * RunModelContext.MaximumLossScales * RunModelContext.DcResistanceScale);
}
