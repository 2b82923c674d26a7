namespace CableFault.Analysis;

/// <summary>
/// A second, sharper look at a long record. <see cref="ModelSelection"/> works on data smoothed to an effective rise of
/// span/<see cref="FitData.MaximumRiseTimesPerWindow"/> so that its many trial fits stay cheap; at that resolution a short
/// section of other cable (one to a few resolution units long) and a lumped capacitance or inductance look alike. This stage
/// refits the chosen model on data smoothed far less (span/<see cref="MaximumRiseTimesPerWindow"/>) and, for each
/// capacitive or inductive spot, tries the short low- or high-impedance section that smoothing would make look the same;
/// the information criterion on the sharper data decides, as in the selection itself.
/// </summary>
internal static class ResolutionRefinement
{
    /// <summary>Most rise times the sharper window may span before it too is smoothed: five times the selection's, so
    /// each model run costs about five times as much (this stage makes few runs). Measured trade-off: 500 took this
    /// stage from 0.8 s to 0.3 s on the speed trace but cost accuracy on the full benchmark (95th percentile 0.787 %
    /// against 0.734 %, kind accuracy 83.0 % against 83.4 %).</summary>
    internal const double MaximumRiseTimesPerWindow = 1000;

    /// <summary>Shortest section round trip, in effective rise times, accepted in place of a lumped spot. A section whose
    /// round trip is shorter than the rise shows as one bump or dip, which a lumped L or C with fewer parameters
    /// describes as well (the usual reading of a connector or splice; common practice): the extra parameters would only
    /// soak up edge-shape misfit and tell the technician of a few-centimetre "section" that is a connector.</summary>
    internal const double MinimumSectionRiseTimes = 1.0;

    /// <summary>Iteration limit of each section trial (warm started from the selected model; the refits have the
    /// fitter's usual limit).</summary>
    private const int Iterations = 20;

    /// <summary>
    /// Refits <paramref name="coarse"/> on <paramref name="fine"/> and replaces lumped C/L spots by sections (or a C by a
    /// tap) where the sharper data say so. <paramref name="fineRiseSeconds"/> and <paramref name="coarseRiseSeconds"/> are the effective
    /// rise times of the two data sets, s.
    /// </summary>
    /// <param name="coarse">The selection's result on the strongly smoothed data.</param>
    /// <param name="fine">The less smoothed data.</param>
    /// <param name="fineRiseSeconds">Effective rise of <paramref name="fine"/>, s.</param>
    /// <param name="coarseRiseSeconds">Effective rise of the selection's data, s.</param>
    /// <param name="cancellation">Stops the fits.</param>
    /// <param name="fullResolution">Cuts unsmoothed samples of the aligned trace between two times, s, for
    /// <see cref="FullResolutionReview"/>; null skips that look.</param>
    /// <param name="instrumentRiseSeconds">The instrument's own rise, s.</param>
    internal static ModelSelection.Result Refine(ModelSelection.Result coarse, FitData fine, double fineRiseSeconds,
        double coarseRiseSeconds, CancellationToken cancellation, Func<double, double, FitData>? fullResolution = null,
        double instrumentRiseSeconds = 0)
    {
        var start = coarse.Fit.Model;
        double variance = ModelSelection.SampleVariance(fine, start);
        double logN = ModelSelection.LogSampleCount(fine);
        double Bic(ModelFit f) => ModelSelection.Criterion(f, fine, variance);

        var best = ModelFitter.Fit(start, fine, variance, cancellation: cancellation);
        double bestBic = Bic(best);
        ModelSelection.DebugTrace?.Invoke($"refinement: first fit {best.Iterations} iterations, bic {bestBic:0.0}");
        int trials = coarse.Trials + 1;
        bool changed = false;
        int i = 0;
        while (i < best.Model.Events.Count)
        {
            var m = best.Model;
            if (!ReactiveSections.IsReactive(m.Events[i].Element)) { i++; continue; }
            int last = ReactiveSections.ClusterEnd(m, i, fineRiseSeconds);
            // Only where the lumped spot leaves more residual than the noise allows is a section worth a trial (the rule
            // the selection's splits follow): a real connector or splice fits the sharper data as it is. A row of spots is
            // always tried (see ReactiveSections).
            double excess = last > i ? double.PositiveInfinity
                : ModelSelection.LocalExcess(best, fine, variance, m.TimeOffsetSeconds + m.Events[i].RoundTripSeconds, fineRiseSeconds);
            if (excess < 2 * logN + ModelSelection.EvidenceMargin) { i = last + 1; continue; }
            double span = m.Events[last].RoundTripSeconds - m.Events[i].RoundTripSeconds;
            double margin = ReactiveSections.SectionMargin(last - i + 1);
            RunModelFit? winner = null;
            // Two starting lengths beyond the row's span: one sharp rise time (a section the sharper data resolve) and
            // half the coarse rise (the longest a section could be and still have looked lumped).
            var sections = new[] { span + fineRiseSeconds, span + coarseRiseSeconds / 2 }.Distinct()
                .Select(tau => ReactiveSections.Replace(m, i, last, tau)).OfType<RunModel>().ToList();
            // A capacitive spot may also be a tap whose branch the coarse look could not resolve; a change of kind with
            // as many parameters must win by the margin.
            var tap = last == i ? ReactiveSections.AsTap(m, i, fineRiseSeconds) : null;
            var fits = FitSideBySide(sections.Select(c => (c, FreeAround(c, i - 1, i + 2)))
                .Concat(tap is null ? [] : [(tap, FreeAround(tap, i - 1, i + 1))]).ToList(), fine, variance, cancellation);
            for (int c = 0; c < sections.Count; c++)
            {
                var fit = fits[c];
                trials++;
                ModelSelection.DebugTrace?.Invoke($"refinement: section at event {i}: bic {Bic(fit):0.0} against {bestBic:0.0}");
                // A section shorter than the sharper rise is still a lumped spot to these data (see MinimumSectionRiseTimes).
                double length = fit.Model.Events[i + 1].RoundTripSeconds - fit.Model.Events[i].RoundTripSeconds;
                if (length < MinimumSectionRiseTimes * fineRiseSeconds) continue;
                double bic = Bic(fit);
                if (bic < bestBic - margin && (winner is null || bic < winner.Bic)) winner = new RunModelFit(fit, bic);
            }
            bool tapWon = false;
            if (tap is not null)
            {
                var fit = fits[^1];
                trials++;
                ModelSelection.DebugTrace?.Invoke($"refinement: tap at event {i}: bic {Bic(fit):0.0} against {bestBic:0.0}");
                double bic = Bic(fit);
                if (bic < bestBic - ModelSelection.EvidenceMargin && (winner is null || bic < winner.Bic))
                {
                    winner = new RunModelFit(fit, bic);
                    tapWon = true;
                }
            }
            if (winner is null) { i = last + 1; continue; }
            (best, bestBic) = (winner.Fit, winner.Bic);
            changed = true;
            i += tapWon ? 1 : 2;
        }
        // A narrow pair of boundaries to |ρ| beyond the end threshold and back (an open and a short in mid-run) is tried as
        // the spot it stands for (see ReactiveSections.ToSpot); fewer parameters, so it need only not lose.
        for (int k = 0; k + 1 < best.Model.Events.Count; k++)
        {
            var m = best.Model;
            if (m.Events[k].Element != RunModelElement.Boundary
                || Math.Abs(ModelSelection.LocalReflection(m, k)) < EventClassifier.EndReflection) continue;
            // All fitted side by side; the first in order that does not lose is taken, as if they had been tried in turn
            // (the later ones are fitted on the idle core regardless, and counted as trials only if reached in turn).
            var spots = ReactiveSections.SpotCandidates(m, k, fineRiseSeconds).ToList();
            var fits = FitSideBySide(spots.Select(c => (c, FreeAround(c, k - 1, k + 1))).ToList(), fine, variance, cancellation);
            foreach (var fit in fits)
            {
                trials++;
                ModelSelection.DebugTrace?.Invoke($"refinement: spot for a boundary pair at event {k}: bic {Bic(fit):0.0} against {bestBic:0.0}");
                double bic = Bic(fit);
                if (bic >= bestBic + ModelSelection.EvidenceMargin) continue;
                (best, bestBic) = (fit, bic);
                changed = true;
                break;
            }
        }
        // A connector where two cables meet is a small L or C right at the change of impedance; the coarse look sees only
        // the step (slightly moved), and the sharper data leave a residual there that no single boundary removes.
        for (int k = 0; k < best.Model.Events.Count; k++)
        {
            var m = best.Model;
            // Not the last event: a boundary there is the run's resistive end, modelled as a matched line of that
            // impedance, whose small difference from a resistor on a lossy cable a spot would only soak up.
            // Nor while the loss is estimated with the events: its misfit leaves residual at every step, which a spot
            // would soak up.
            if (m.Events[k].Element != RunModelElement.Boundary || k == m.Events.Count - 1 || m.Context.EstimateLoss) continue;
            double excess = ModelSelection.LocalExcess(best, fine, variance, m.TimeOffsetSeconds + m.Events[k].RoundTripSeconds, fineRiseSeconds);
            if (excess < 2 * logN + ModelSelection.EvidenceMargin) continue;
            RunModelFit? winner = null;
            var spots = SpotsAtBoundary(m, k, fineRiseSeconds).ToList();
            foreach (var fit in FitSideBySide(spots.Select(c => (c, FreeAround(c, k - 1, k + 1))).ToList(), fine, variance, cancellation))
            {
                trials++;
                ModelSelection.DebugTrace?.Invoke($"refinement: spot at boundary {k}: bic {Bic(fit):0.0} against {bestBic:0.0}");
                // The hypothesis is a spot at the step, to within the resolution: one the fit moved further away is
                // soaking up misfit elsewhere (a lossy stretch's slope).
                var after = fit.Model.Events;
                if (Math.Abs(after[k + 1].RoundTripSeconds - after[k].RoundTripSeconds) > fineRiseSeconds) continue;
                double bic = Bic(fit);
                // Two parameters more: the spot must win by the margin.
                if (bic < bestBic - ModelSelection.EvidenceMargin && (winner is null || bic < winner.Bic)) winner = new RunModelFit(fit, bic);
            }
            if (winner is null) continue;
            (best, bestBic) = (winner.Fit, winner.Bic);
            changed = true;
            k++;
        }
        var refit = best.Model;
        if (fullResolution is not null
            && FullResolutionReview.Review(best, fullResolution, instrumentRiseSeconds, fineRiseSeconds, ref trials, cancellation) is { } reviewed)
        {
            refit = reviewed;
            changed = true;
        }
        ModelSelection.DebugTrace?.Invoke($"refinement: trials done, changed {changed}");
        if (changed)
        {
            best = ModelFitter.Fit(refit, fine, variance, cancellation: cancellation);
            bestBic = Bic(best);
            trials++;
            ModelSelection.DebugTrace?.Invoke($"refinement: refit {best.Iterations} iterations, converged {best.Converged}, bic {bestBic:0.0}");
        }
        best = CoincidentEvents.Resolve(best, fine, variance, fineRiseSeconds, ref trials, cancellation);
        best = ModelSelection.WithoutEventsPastEnd(best, fine, variance, ref trials, cancellation);
        best = ModelSelection.WithoutFaintEvents(best, fine, variance, logN, fineRiseSeconds, ref trials, cancellation);
        bestBic = Bic(best);
        var evidence = ModelSelection.EventEvidence(best, fine, variance, logN, fineRiseSeconds);
        return new ModelSelection.Result(best, variance, bestBic, evidence, trials);
    }

    private sealed record RunModelFit(ModelFit Fit, double Bic);

    /// <summary>The trial fits of <paramref name="trials"/> (each with its free parameters), side by side: they are
    /// independent, and one alone leaves a core idle for much of its time.</summary>
    private static ModelFit[] FitSideBySide(IReadOnlyList<(RunModel Model, bool[] Free)> trials, FitData fine, double variance,
        CancellationToken cancellation)
    {
        var fits = new ModelFit[trials.Count];
        ModelSelection.ForEachInParallel(trials.Count, k => fits[k] = ModelFitter.Fit(trials[k].Model, fine, variance, trials[k].Free,
            Iterations, cancellation), cancellation);
        return fits;
    }

    /// <summary>Starting size of a spot added at a boundary: a time constant of this many sharper rise times (small, so the
    /// start is the model without it, and the fit grows it).</summary>
    private const double SpotStartRiseTimes = 0.1;

    /// <summary>Boundary <paramref name="index"/> with a series L, and with a shunt C, at its place in the line before it
    /// (τ = L/2Z or ZC/2 of <see cref="SpotStartRiseTimes"/>; DESIGN.md §2).</summary>
    private static IEnumerable<RunModel> SpotsAtBoundary(RunModel m, int index, double riseSeconds)
    {
        var e = m.Events[index];
        double z = RunModelBuilder.ImpedanceBefore(m, index), tau = SpotStartRiseTimes * riseSeconds;
        foreach (var spot in new[]
                 {
                     e with { Element = RunModelElement.SeriesInductor, Value = 2 * z * tau },
                     e with { Element = RunModelElement.ShuntCapacitor, Value = 2 * tau / z },
                 })
        {
            var list = m.Events.ToList();
            list.Insert(index, spot);
            yield return m.WithEvents(list);
        }
    }

    /// <summary>The edge parameters and events <paramref name="from"/>..<paramref name="to"/> (clamped) free, the rest fixed.</summary>
    private static bool[] FreeAround(RunModel model, int from, int to) => model.FreeMask(from, to, withLoss: false);
}
