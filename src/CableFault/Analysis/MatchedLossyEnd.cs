using CableFault.Traces;

namespace CableFault.Analysis;

/// <summary>
/// The end of a lossy run that is terminated in (about) its own impedance: a resistor there shows no step, yet it ends
/// the run. Skin effect makes a lossy cable's characteristic impedance Z_c(s) = √((R(s) + sL)/(sC)) climb above Z₀ at
/// low frequencies (R ∝ √f), so the step response of cable that goes on keeps creeping up; a resistor of Z₀ at the end
/// reflects (Z₀ − Z_c)/(Z₀ + Z_c) &lt; 0 at those frequencies and turns the creep back down from its round trip on
/// (on RG-6, 40 m into 75 Ω: the level rises by 3 % of the step up to the end's round trip and falls by 2 % in the
/// 150 ns after it). The detector looks for steps and finds none, and the selection's window ends a few rise times
/// after the last event it was given, so the run was read as "uniform and matched".
/// </summary>
/// <remarks>
/// After the selection, on a lossy run whose main line goes on past its last event: the model is laid over the whole
/// record, and where it leaves more misfit than noise explains, a resistive end is scanned along the record (one model
/// run per place: the resistor of the line's impedance, unrefitted), the best place fitted with everything free, and
/// kept when the information criterion takes it over the line going on, by the evidence margin. The end's own position
/// is then as sure as the turn of a slow creep allows; the fit's covariance says how sure.
/// </remarks>
internal static class MatchedLossyEnd
{
    /// <summary>Places the scan tries between the last event and the end of the record.</summary>
    private const int ScanPlaces = 48;

    /// <summary>Largest |ρ| at the instrument's rise of an end this search takes: 5 %. A resistor further from the
    /// line's impedance shows a step of that size, which the detector finds (the noise floor is far below it).</summary>
    private const double MaximumEndReflection = 0.05;

    /// <summary>Share of the line-going-on misfit (beyond noise) an end must explain: a real end leaves the noise,
    /// while an end standing in for a wrong loss setting only bends part of the creep.</summary>
    private const double MinimumExplainedShare = 0.9;

    /// <summary>Relative uncertainty of a cable's loss taken from its type or a data sheet: 10 % (a sample's measured
    /// attenuation against the data sheet's typical figure, and its change with temperature and age; from memory).</summary>
    internal const double LossRelativeSigma = 0.10;

    /// <summary>Rise times kept clear of the last event and of the record's end by the scan.</summary>
    private const double ScanClearRiseTimes = 4;

    /// <summary>The selection with the run ended in a resistor, on data over the whole record, or null when the trace
    /// shows no such end.</summary>
    /// <param name="selection">The selected model and its fit.</param>
    /// <param name="wholeRecord">The fit data from the usual lead before the edge to the end of the record.</param>
    /// <param name="effectiveRiseSeconds">The effective rise of those data, s.</param>
    /// <param name="cancellation">Cancels the fits.</param>
    internal static ModelSelection.Result? Search(ModelSelection.Result selection, FitData wholeRecord, double effectiveRiseSeconds,
        CancellationToken cancellation)
    {
        var m = selection.Fit.Model;
        if (m.Context.Loss is null || m.Context.Loss.IsLossless || m.Context.ResistiveEnd || m.Events.Any(e => e.EndsRun)) return null;
        var data = wholeRecord;
        double variance = ModelSelection.SampleVariance(data, m);
        double logN = ModelSelection.LogSampleCount(data);

        // The line going on, over the whole record: only a misfit beyond noise is worth a scan.
        var goingOn = ModelFitter.Fit(m, data, variance, cancellation: cancellation);
        double nu = data.IndependentFraction, dof = nu * data.Samples.Length;
        double excess = nu * goingOn.ResidualSumOfSquares / variance - dof - 3 * Math.Sqrt(2 * dof);
        ModelSelection.DebugTrace?.Invoke($"lossy end: misfit of the line going on {excess:0.0} beyond noise over {data.Samples.Length} samples");
        if (excess < 2 * logN + ModelSelection.EvidenceMargin) return null;

        // The scan starts from the selection's own fit: the line going on, refitted over the whole record, bends its
        // events and level to follow the creep's turn (a blind-zone step of +0.003 grew to +0.25 on 40 m of RG-6).
        var fitted = m;
        double impedance = LineImpedanceAtEnd(fitted);
        double from = (fitted.Events.Count > 0 ? fitted.Events[^1].RoundTripSeconds : 0) + ScanClearRiseTimes * effectiveRiseSeconds;
        double to = data.TimeAt(data.Samples.Length - 1) - fitted.TimeOffsetSeconds - ScanClearRiseTimes * effectiveRiseSeconds;
        if (!(to > from)) return null;
        var context = fitted.Context with { ResistiveEnd = true };
        RunModel Ended(double roundTripSeconds) =>
            fitted.WithEvents(fitted.Events.Append(new RunModelEvent(RunModelElement.Boundary, roundTripSeconds, impedance))).WithContext(context);
        var places = Enumerable.Range(0, ScanPlaces).Select(k => from + (to - from) * k / (ScanPlaces - 1)).ToArray();
        var rss = new double[places.Length];
        Parallel.For(0, places.Length, new ParallelOptions { CancellationToken = cancellation }, k =>
        {
            using var sideBySide = Simulation.BinSplitting.SideBySide();
            rss[k] = ModelFitter.ResidualSumOfSquares(Ended(places[k]), data);
        });
        int best = Array.IndexOf(rss, rss.Min());
        if (!(rss[best] < goingOn.ResidualSumOfSquares)) return null;

        var ended = ModelFitter.Fit(Ended(places[best]), data, variance, cancellation: cancellation);
        double endedBic = ModelSelection.Criterion(ended, data, variance);
        double goingOnBic = ModelSelection.Criterion(goingOn, data, variance);
        ModelSelection.DebugTrace?.Invoke(
            $"lossy end: scan best at {places[best] * 1e9:0.#} ns, fitted at {ended.Model.Events[^1].RoundTripSeconds * 1e9:0.##} ns to {ended.Model.Events[^1].Value:0.#} Ω: bic {endedBic:0.0} against {goingOnBic:0.0}");
        if (!(endedBic < goingOnBic - ModelSelection.EvidenceMargin)) return null;
        // Only an end of about the line's impedance is this search's to find (one further off shows a step the detector
        // sees), and only one beyond the events: an end fitted back to the port, or one that leaves most of the misfit,
        // is the creep of a loss setting the cable does not have (a lossless cable read with RG-6's loss was read as
        // ending at its connector).
        var end = ended.Model.Events[^1];
        double endReflection = (end.Value - impedance) / (end.Value + impedance);
        double endedExcess = nu * ended.ResidualSumOfSquares / variance - dof - 3 * Math.Sqrt(2 * dof);
        if (Math.Abs(endReflection) > MaximumEndReflection || end.RoundTripSeconds < from
            || endedExcess > (1 - MinimumExplainedShare) * excess)
            return null;
        // A cable with less loss than its setting creeps less, and an early end reads that just as well (a lossless
        // cable read with RG-6's loss ended 2.4 m out): the end must beat the line going on with its loss fitted.
        // Three readings: the loss fitted from the given one and from the loss probe's small start, and no loss at all
        // (the fitted loss stalled far from a lossless cable's zero, at a criterion four times the end's).
        var otherLossFits = ModelFitter.FitEach(
            [goingOn.Model.WithContext(goingOn.Model.Context with { EstimateLoss = true }),
             goingOn.Model.WithContext(goingOn.Model.Context with { EstimateLoss = true, Loss = RunModelContext.EstimateStart }),
             goingOn.Model.WithContext(goingOn.Model.Context with { Loss = null })],
            data, variance, cancellation: cancellation);
        double otherLossBic = otherLossFits.Min(f => ModelSelection.Criterion(f, data, variance));
        ModelSelection.DebugTrace?.Invoke($"lossy end: the line going on with its loss fitted: bic {otherLossBic:0.0}");
        if (!(endedBic < otherLossBic - ModelSelection.EvidenceMargin)) return null;
        var evidence = ModelSelection.EventEvidence(ended, data, variance, logN, effectiveRiseSeconds);
        return new ModelSelection.Result(ended, variance, endedBic, evidence, selection.Trials + 2,
            LossSigmaSeconds(ended.Model, data, variance, cancellation));
    }

    /// <summary>
    /// The end's round-trip σ from the loss setting, s: where the creep turns depends on how fast the cable is taken to
    /// creep, and the fit takes a given loss as exact (a cable with 20 % more loss than RG-6's data sheet, read with the
    /// data sheet's, put its end at 41.35 m instead of 40). The end is refitted with the loss
    /// <see cref="LossRelativeSigma"/> lower and higher; half the spread of the two places is the σ. Zero for a loss the
    /// fit estimated: its covariance already holds it.
    /// </summary>
    private static double LossSigmaSeconds(RunModel ended, FitData data, double variance, CancellationToken cancellation)
    {
        if (ended.Context.EstimateLoss || ended.Context.Loss is not { } loss) return 0;
        var free = ended.FreeMask(ended.Events.Count - 1, ended.Events.Count - 1, withLoss: false);
        var places = new double[2];
        Parallel.For(0, 2, new ParallelOptions { CancellationToken = cancellation }, k =>
        {
            using var sideBySide = Simulation.BinSplitting.SideBySide();
            double scale = k == 0 ? 1 - LossRelativeSigma : 1 + LossRelativeSigma;
            var scaled = new CableFault.Cables.CableLossModel(scale * loss.SkinLossNepersPerMeterPerRootHertz,
                scale * loss.DielectricLossNepersPerMeterPerHertz, scale * loss.DcResistanceOhmsPerMeter);
            places[k] = ModelFitter.Fit(ended.WithContext(ended.Context with { Loss = scaled }), data, variance, free,
                cancellation: cancellation).Model.Events[^1].RoundTripSeconds;
        });
        return Math.Abs(places[1] - places[0]) / 2;
    }

    /// <summary>Impedance of the main line after its last event, Ω: a tap's branch leaves the main line as it was.</summary>
    private static double LineImpedanceAtEnd(RunModel m)
    {
        double z = m.Context.ImpedanceOhms;
        foreach (var e in m.Events)
            if (e.Element == RunModelElement.Boundary) z = e.Value;
        return z;
    }
}
