namespace CableFault.Analysis;

/// <summary>
/// The end of a lossy run that is terminated in (about) its own impedance: a resistor there shows no step, yet it ends
/// the run. Skin effect makes a lossy cable's characteristic impedance Z_c(s) = √((R(s) + sL)/(sC)) climb above Z₀ at
/// low frequencies (R ∝ √f), so the step response of cable that goes on keeps creeping up; a resistor of Z₀ at the end
/// reflects (Z₀ − Z_c)/(Z₀ + Z_c) &lt; 0 at those frequencies and turns the creep back down from its round trip on
/// (on RG-6, 40 m into 75 Ω: the level rises by 3 % of the step up to the end's round trip at 314 ns, falls by 1.3 %
/// in the 150 ns after it and by 2 % by 1 µs). The detector looks for steps and finds none, and the selection's window ends a few rise times
/// after the last event it was given, so the run was read as "uniform and matched".
/// </summary>
/// <remarks>
/// After the selection, on a lossy run whose main line goes on past its last event: the model is laid over the whole
/// record, and where it leaves more misfit than noise explains, a resistive end is scanned along the record (one model
/// run per place: the resistor of the line's impedance, unrefitted), the best place fitted with everything free, and
/// kept when the information criterion takes it over the line going on, by the evidence margin. The end's own position
/// is then as sure as the turn of a slow creep allows; the fit's covariance says how sure, with the loss setting's share
/// added (<see cref="LossSigmaSeconds"/>). A run the selection read as a shunt of the line's impedance with an end behind
/// it is tried once more as a tap whose open branch is that end and whose other branch goes on to such a resistor (the
/// camera behind a two-way tap), against the selection's reading over the whole record.
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
        ModelSelection.DebugTrace?.Invoke($"lossy end: from {ModelSelection.Describe(m)}");
        if (m.Context.Loss is null || m.Context.Loss.IsLossless || m.Context.ResistiveEnd) return null;
        var data = wholeRecord;
        double variance = ModelSelection.SampleVariance(data, m);
        double logN = ModelSelection.LogSampleCount(data);
        // A run that goes on past its events is read as it is. One read as a shunt of the line's impedance and an end
        // behind it may be a tap whose open branch is that "end" and whose matched branch goes on to the resistor
        // (a camera behind a two-way tap): the selection's tap starts from the reading that ends, and its stand-ins for
        // the camera's slow tail stay; here the tap is tried with the end scanned, against the selection's reading.
        var start = Enumerable.Range(0, m.Events.Count).Any(i => Ends(m, i)) ? TapBehindMatchedBranch(m, effectiveRiseSeconds) : m;
        if (start is null) return null;
        // The line going on, over the whole record: only a misfit beyond noise is worth a scan. As it stands first (one
        // model run): a misfit that an end can explain lies after the last event, while one before it is the model's
        // own (stand-ins the selection kept), which an end does not mend and whose refits over the whole record cost
        // seconds for nothing.
        double Excess(double rss, double samples) => ModelSelection.ExcessOverNoise(rss, samples, data, variance);
        double gate = 2 * logN + ModelSelection.EvidenceMargin;
        var (before, after, split) = SplitResidual(start, data, effectiveRiseSeconds);
        double excessBefore = Excess(before, split), excessAfter = Excess(after, data.Samples.Length - split);
        ModelSelection.DebugTrace?.Invoke($"lossy end: misfit as it stands {excessBefore:0.0} before the last event, {excessAfter:0.0} after");
        if (excessAfter < gate || excessBefore > (1 - MinimumExplainedShare) * excessAfter) return null;
        ModelFit? ending = ReferenceEquals(start, m) ? null : ModelFitter.Fit(m, data, variance, cancellation: cancellation);
        var goingOn = ModelFitter.Fit(start, data, variance, cancellation: cancellation);
        double excess = Excess(goingOn.ResidualSumOfSquares, data.Samples.Length);
        ModelSelection.DebugTrace?.Invoke($"lossy end: misfit of the line going on {excess:0.0} beyond noise over {data.Samples.Length} samples: {ModelSelection.Describe(start)} -> {ModelSelection.Describe(goingOn.Model)} it {goingOn.Iterations} conv {goingOn.Converged}");
        if (excess < gate) return null;

        // A run that goes on is scanned from the selection's own fit: refitted over the whole record, the line going on
        // bends its events and level to follow the creep's turn (a blind-zone step of +0.003 grew to +0.25 on 40 m of
        // RG-6). A tap made from the selection's shunt and end is scanned from its refit: its branch was only a guess.
        var fitted = ending is null ? start : goingOn.Model;
        double impedance = RunModelBuilder.ImpedanceBefore(fitted, fitted.Events.Count);
        double from = (fitted.Events.Count > 0 ? fitted.Events[^1].RoundTripSeconds : 0) + ScanClearRiseTimes * effectiveRiseSeconds;
        if (Scan(fitted, impedance, from, data, effectiveRiseSeconds) is not { } scanned) return null;

        var ended = ModelFitter.Fit(scanned, data, variance, cancellation: cancellation);
        double endedBic = ModelSelection.Criterion(ended, data, variance);
        double goingOnBic = ModelSelection.Criterion(goingOn, data, variance);
        ModelSelection.DebugTrace?.Invoke(
            $"lossy end: scan best at {scanned.Events[^1].RoundTripSeconds * 1e9:0.#} ns, fitted at {ended.Model.Events[^1].RoundTripSeconds * 1e9:0.##} ns to {ended.Model.Events[^1].Value:0.#} Ω: bic {endedBic:0.0} against {goingOnBic:0.0}");
        if (!(endedBic < goingOnBic - ModelSelection.EvidenceMargin)) return null;
        if (ending is not null)
        {
            double endingBic = ModelSelection.Criterion(ending, data, variance);
            ModelSelection.DebugTrace?.Invoke($"lossy end: the selection's reading over the whole record: bic {endingBic:0.0}");
            if (!(endedBic < endingBic - ModelSelection.EvidenceMargin)) return null;
        }
        // Only an end of about the line's impedance is this search's to find (one further off shows a step the detector
        // sees), and only one beyond the events: an end fitted back to the port, or one that leaves most of the misfit,
        // is the creep of a loss setting the cable does not have (a lossless cable read with RG-6's loss was read as
        // ending at its connector).
        var end = ended.Model.Events[^1];
        double endReflection = (end.Value - impedance) / (end.Value + impedance);
        double endedExcess = Excess(ended.ResidualSumOfSquares, data.Samples.Length);
        if (Math.Abs(endReflection) > MaximumEndReflection || end.RoundTripSeconds < from
            || endedExcess > (1 - MinimumExplainedShare) * excess)
            return null;
        // A cable with less loss than its setting creeps less, and an early end reads that just as well (a lossless
        // cable read with RG-6's loss ended 2.4 m out): the end must beat the line going on with another loss.
        double otherLossBic = OtherLossCriterion(goingOn.Model, data, variance, cancellation);
        ModelSelection.DebugTrace?.Invoke($"lossy end: the line going on with its loss fitted: bic {otherLossBic:0.0}");
        if (!(endedBic < otherLossBic - ModelSelection.EvidenceMargin)) return null;
        var evidence = ModelSelection.EventEvidence(ended, data, variance, logN, effectiveRiseSeconds);
        return new ModelSelection.Result(ended, variance, endedBic, evidence, selection.Trials + 2,
            LossSigmaSeconds(ended.Model, data, variance, cancellation));
    }

    /// <summary>The residual sum of squares of <paramref name="model"/> as it stands, before and after the sample that
    /// lies <see cref="ScanClearRiseTimes"/> effective rises past its last event, and that sample's index.</summary>
    private static (double Before, double After, int Split) SplitResidual(RunModel model, FitData data, double effectiveRiseSeconds)
    {
        double last = model.TimeOffsetSeconds + (model.Events.Count > 0 ? model.Events[^1].RoundTripSeconds : 0);
        int split = Math.Clamp((int)Math.Ceiling((last + ScanClearRiseTimes * effectiveRiseSeconds - data.StartTimeSeconds) / data.IntervalSeconds),
            0, data.Samples.Length);
        var f = model.Simulate(data);
        double before = 0, after = 0;
        for (int i = 0; i < f.Length; i++)
        {
            double r = data.Samples[i] - f[i];
            if (i < split) before += r * r; else after += r * r;
        }
        return (before, after, split);
    }

    /// <summary>The model with a resistive end of <paramref name="impedance"/> at the best of <see cref="ScanPlaces"/>
    /// places from <paramref name="from"/> to near the record's end (least residual, unrefitted: one model run each), or
    /// null when no place fits better than the line going on.</summary>
    private static RunModel? Scan(RunModel fitted, double impedance, double from, FitData data, double effectiveRiseSeconds)
    {
        double to = data.TimeAt(data.Samples.Length - 1) - fitted.TimeOffsetSeconds - ScanClearRiseTimes * effectiveRiseSeconds;
        if (!(to > from)) return null;
        var context = fitted.Context with { ResistiveEnd = true };
        var candidates = Enumerable.Range(0, ScanPlaces).Select(k => fitted.WithEvents(fitted.Events.Append(
            new RunModelEvent(RunModelElement.Boundary, from + (to - from) * k / (ScanPlaces - 1), impedance))).WithContext(context)).ToArray();
        var rss = new double[candidates.Length];
        Parallel.For(0, candidates.Length, k =>
        {
            using var sideBySide = Simulation.BinSplitting.SideBySide();
            rss[k] = ModelFitter.ResidualSumOfSquares(candidates[k], data);
        });
        int best = Array.IndexOf(rss, rss.Min());
        return rss[best] < ModelFitter.ResidualSumOfSquares(fitted, data) ? candidates[best] : null;
    }

    /// <summary>The best criterion of the line going on with a loss other than the given one: fitted from the given loss,
    /// fitted from the loss probe's small start, and none (from the given loss alone the fitted loss can stall far from a
    /// lossless cable's zero).</summary>
    private static double OtherLossCriterion(RunModel goingOn, FitData data, double variance, CancellationToken cancellation)
    {
        var fits = ModelFitter.FitEach(
            [goingOn.WithContext(goingOn.Context with { EstimateLoss = true }),
             goingOn.WithContext(goingOn.Context with { EstimateLoss = true, Loss = RunModelContext.EstimateStart }),
             goingOn.WithContext(goingOn.Context with { Loss = null })],
            data, variance, cancellation: cancellation);
        return fits.Min(f => ModelSelection.Criterion(f, data, variance));
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

    /// <summary>True when event <paramref name="index"/> ends the main line: an open or a short, or a step to |ρ| ≥ the
    /// classifier's end threshold (which it names an open or a short).</summary>
    private static bool Ends(RunModel m, int index)
    {
        var e = m.Events[index];
        if (e.EndsRun) return true;
        if (e.Element != RunModelElement.Boundary) return false;
        double z = RunModelBuilder.ImpedanceBefore(m, index);
        return Math.Abs((e.Value - z) / (e.Value + z)) >= EventClassifier.EndReflection;
    }

    /// <summary>The events before a shunt resistor of the line's impedance (within the classifier's tap tolerance; a
    /// row of shunts within a rise of each other counts as one, their conductances added) whose next event ends the run
    /// upwards (an open, or a step to ρ ≥ the end threshold), with the shunt as a tap whose open branch reaches that end
    /// and nothing after it; null when the model has no such pair.</summary>
    private static RunModel? TapBehindMatchedBranch(RunModel m, double effectiveRiseSeconds)
    {
        for (int i = 0; i + 1 < m.Events.Count; i++)
        {
            var e = m.Events[i];
            if (e.Element != RunModelElement.ShuntResistor) continue;
            double z = RunModelBuilder.ImpedanceBefore(m, i), conductance = 0;
            int next = i;
            while (next < m.Events.Count && m.Events[next].Element == RunModelElement.ShuntResistor
                   && m.Events[next].RoundTripSeconds - e.RoundTripSeconds <= effectiveRiseSeconds)
                conductance += 1 / m.Events[next++].Value;
            if (next == m.Events.Count || Math.Abs(1 / (conductance * z) - 1) > EventClassifier.MatchedBranchRelativeTolerance) continue;
            var end = m.Events[next];
            if (!Ends(m, next) || end.Element == RunModelElement.Short || (end.Element == RunModelElement.Boundary && end.Value < z)) continue;
            var tap = e with { Element = RunModelElement.Tap, Value = end.RoundTripSeconds - e.RoundTripSeconds };
            return m.WithEvents(m.Events.Take(i).Append(tap));
        }
        return null;
    }
}
