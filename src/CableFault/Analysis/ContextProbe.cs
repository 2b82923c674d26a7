namespace CableFault.Analysis;

/// <summary>
/// Whether the trace supports a setting of the run that no option gave (the cable's loss, the step's settling): the
/// detector's events are fitted side by side with the setting free and without it, and the Bayesian information
/// criterion decides, the free reading paying for its extra parameters. A reading that wins is checked once more: its own
/// events are fitted again without the setting, and only a setting that still wins is taken (the two probe fits may have
/// ended in different places for reasons that have nothing to do with it).
/// </summary>
internal static class ContextProbe
{
    /// <summary>Share of the plain criterion the setting must explain on top of the evidence margin: the probe fits start
    /// from the detector's events, and where those are far from the data (a criterion in the millions) a fit that merely
    /// settled elsewhere differs by a fraction of a per cent either way (benchmark, loss not told: lossless runs read as
    /// lossy by 0.6 % and 3 %, lossy ones winning by 7 % and more).</summary>
    private const double RelativeMargin = 0.05;

    /// <summary>The context the free fit ended with, or null when the criterion does not take it.</summary>
    /// <param name="initial">The detector's events; its context gives the sample variance.</param>
    /// <param name="free">The context with the setting at its start and its parameters free.</param>
    /// <param name="plain">The context without the setting.</param>
    /// <param name="data">The data the selection fits.</param>
    /// <param name="plausible">Whether the fitted setting is a reading of the run rather than a stand-in for another misfit.</param>
    /// <param name="name">The setting's name in the debug trace.</param>
    /// <param name="cancellation">Cancels the probe fits.</param>
    internal static RunModelContext? Decide(RunModel initial, RunModelContext free, RunModelContext plain, FitData data,
        Func<RunModelContext, bool> plausible, string name, CancellationToken cancellation)
    {
        double variance = ModelSelection.SampleVariance(data, initial);
        var fits = ModelFitter.FitEach([initial.WithContext(free), initial.WithContext(plain)], data, variance, cancellation: cancellation);
        double freeBic = ModelSelection.Criterion(fits[0], data, variance);
        double plainBic = ModelSelection.Criterion(fits[1], data, variance);
        var found = fits[0].Model.Context;
        ModelSelection.DebugTrace?.Invoke($"{name} probe: bic {freeBic:0.0} with it, {plainBic:0.0} without");
        if (!(freeBic < plainBic - Margin(plainBic)) || !plausible(found)) return null;
        var again = ModelFitter.Fit(fits[0].Model.WithContext(plain), data, variance, cancellation: cancellation);
        double againBic = ModelSelection.Criterion(again, data, variance);
        ModelSelection.DebugTrace?.Invoke($"{name} probe: without it from the same events {againBic:0.0}");
        return freeBic < againBic - Margin(againBic) ? found : null;
    }

    private static double Margin(double plainBic) => Math.Max(ModelSelection.EvidenceMargin, RelativeMargin * Math.Abs(plainBic));
}
