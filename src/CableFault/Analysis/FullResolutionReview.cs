namespace CableFault.Analysis;

/// <summary>
/// A last look, at the instrument's own resolution, at each capacitive or inductive spot of a model that was fitted to
/// smoothed data. On a long record even the sharper data of <see cref="ResolutionRefinement"/> are smoothed to several
/// instrument rise times, and a section of other cable one or two rise times long (a crushed or wet stretch, a short
/// patch of other cable) then looks exactly like a lumped C or L. The unsmoothed samples around the spot still tell them
/// apart: a section's reflection has a flat top and two edges, a lumped part's an exponential decay. Only a short window
/// of samples is fitted, with the rest of the model held, so the look costs a few dozen model runs per spot.
/// </summary>
internal static class FullResolutionReview
{
    /// <summary>Instrument rise times of unsmoothed samples kept on each side of the spot, beyond the smoothed rise: the
    /// spot's (or a section's) whole response and the level on both sides of it.</summary>
    private const double WindowRiseTimes = 10;

    /// <summary>Most internal samples a window's model run may need: the transform runs from the incident edge to the
    /// window's end at the instrument's resolution, so a window far down a long record costs (and holds in the sweep
    /// cache) as much as the whole record would; beyond this the look is skipped.</summary>
    private const double MaximumTransformPoints = 1 << 16;

    /// <summary>Iteration limit of each local fit (warm started; few parameters are free).</summary>
    private const int Iterations = 15;

    /// <summary>Iteration limit of a fit from a start the smoothed data did not place (spots read as a section).</summary>
    private const int LongIterations = 40;

    /// <summary>BIC units by which a reading of as many parameters must beat the selection's to replace it: "very strong"
    /// evidence, 2·ln(Bayes factor) above 10 (Kass &amp; Raftery, <i>J. Am. Stat. Assoc.</i> 90, 1995, §3.2).</summary>
    private const double OverturnMargin = 10;

    /// <summary>Starting separations of two spots read from a section, as shares of its length.</summary>
    private static readonly double[] SpotSeparationShares = [1, 0.5, 0.25];

    /// <summary>
    /// Replaces spots of <paramref name="fit"/>'s model by sections, and short sections by pairs of spots (see
    /// <see cref="SectionAsSpots"/>), where unsmoothed windows of the trace, cut by <paramref name="window"/> (aligned-time
    /// start and end, s), say so by the information criterion. Returns the model with the replacements and the measured
    /// rise (the caller refits it), or null when nothing changed.
    /// </summary>
    /// <param name="fit">The model fitted to the smoothed data.</param>
    /// <param name="window">Cuts the unsmoothed samples of the aligned trace between two times, s.</param>
    /// <param name="instrumentRiseSeconds">The instrument's 10–90 % rise, s.</param>
    /// <param name="smoothedRiseSeconds">Effective rise of the smoothed data the model was fitted to, s.</param>
    /// <param name="trials">Counts the fits made.</param>
    /// <param name="cancellation">Stops the fits.</param>
    internal static RunModel? Review(ModelFit fit, Func<double, double, FitData> window, double instrumentRiseSeconds,
        double smoothedRiseSeconds, ref int trials, CancellationToken cancellation)
    {
        // The smoothed data hardly see the instrument's own edge, so the model's rise is set to the one measured on the
        // incident edge, and held: freed on a few samples away from that edge, it may drift to a tiny value that costs an
        // enormous transform and buys nothing.
        var fitted = fit.Model;
        var model = new RunModel(fitted.Context, fitted.AmplitudeVolts, fitted.TimeOffsetSeconds, instrumentRiseSeconds, fitted.Events,
            fitted.OffsetVolts);
        bool changed = false;
        double half = smoothedRiseSeconds + WindowRiseTimes * instrumentRiseSeconds;
        for (int i = 0; i < model.Events.Count; i++)
        {
            if (model.Events[i].Element == RunModelElement.Boundary)
            {
                if (SectionAsSpots(ref model, i, window, half, instrumentRiseSeconds, smoothedRiseSeconds, ref trials, cancellation))
                {
                    changed = true;
                    i++;
                }
                continue;
            }
            if (!ReactiveSections.IsReactive(model.Events[i].Element)) continue;
            // A row of like spots within the smoothed rise is looked at as one: together they may be one section's two ends.
            int last = ReactiveSections.ClusterEnd(model, i, smoothedRiseSeconds);
            // A spot at another event (a connector at a change of cable, a splice at a leak) is what it is: the hypothesis
            // here is a stretch of other cable on its own.
            if (!IsAlone(model, i, last, smoothedRiseSeconds)) { i = last; continue; }
            double at = model.TimeOffsetSeconds + model.Events[i].RoundTripSeconds;
            double span = model.Events[last].RoundTripSeconds - model.Events[i].RoundTripSeconds;
            double start = at - half, end = at + span + half;
            if (Cut(model, window, start, end, instrumentRiseSeconds) is not { } local) { i = last; continue; }
            double variance = ModelSelection.SampleVariance(local, model);
            double logN = ModelSelection.LogSampleCount(local);

            // The spots as the smoothed data placed them, refitted with the instrument's sharpness: their places and
            // sizes are free.
            var spotFit = ModelFitter.Fit(model, local, variance, FreeInWindow(model, start, end), Iterations, cancellation);
            trials++;
            double spotBic = ModelSelection.Criterion(spotFit, local, variance);
            double excess = last > i ? double.PositiveInfinity
                : ModelSelection.LocalExcess(spotFit, local, variance, at, instrumentRiseSeconds);
            ModelSelection.DebugTrace?.Invoke($"full-resolution look at {model.Events[i].Element}@{model.Events[i].RoundTripSeconds * 1e9:0.0} ns"
                + $" ({last - i + 1}): {local.Samples.Length} samples, bic {spotBic:0.0}, excess {excess:0.0}");
            // Only where a lone spot leaves more residual than the noise allows is a section worth a trial (the rule of the
            // selection's splits); a row is always tried.
            if (excess < 2 * logN + ModelSelection.EvidenceMargin) { i = last; continue; }

            (ModelFit Fit, double Bic)? winner = null;
            var spotModel = spotFit.Model;
            double spotSpan = spotModel.Events[last].RoundTripSeconds - spotModel.Events[i].RoundTripSeconds;
            double margin = ReactiveSections.SectionMargin(last - i + 1);
            foreach (double tau in new[] { spotSpan + 2 * instrumentRiseSeconds, spotSpan + smoothedRiseSeconds }.Distinct())
            {
                if (ReactiveSections.Replace(spotModel, i, last, tau) is not { } candidate) continue;
                var sectionFit = ModelFitter.Fit(candidate, local, variance, FreeInWindow(candidate, start, end), Iterations, cancellation);
                trials++;
                var events = sectionFit.Model.Events;
                // A section shorter than the instrument's rise is still a lumped spot to any data.
                if (events[i + 1].RoundTripSeconds - events[i].RoundTripSeconds
                    < ResolutionRefinement.MinimumSectionRiseTimes * instrumentRiseSeconds) continue;
                double bic = ModelSelection.Criterion(sectionFit, local, variance);
                ModelSelection.DebugTrace?.Invoke($"  section of {tau * 1e9:0.00} ns start: bic {bic:0.0} against {spotBic:0.0}");
                if (bic < spotBic - margin && (winner is null || bic < winner.Value.Bic)) winner = (sectionFit, bic);
            }
            if (winner is null) { i = last; continue; }
            // Only the section is taken from the local fit: the level was fitted to a few samples, and a neighbour in the
            // window to a cut through its own response.
            var taken = winner.Value.Fit.Model.Events;
            model = ReactiveSections.Replace(model, i, last, taken[i + 1].RoundTripSeconds - taken[i].RoundTripSeconds) is { } replaced
                ? TakeTwo(replaced, taken, i) : model.WithEvents(taken);
            changed = true;
            i++;
        }
        return changed ? model : null;
    }

    /// <summary>
    /// The reverse look: a short excursion of two boundaries that returns to the line's impedance, on its own, as the two
    /// like spots at its ends that smoothing blurs into one (two kinks or connectors a rise or two apart; see
    /// <see cref="ReactiveSections.ClusterAsSpots"/>). As many parameters as the section, but the section is the reading
    /// the selection made: the spots must beat it by <see cref="OverturnMargin"/> on the unsmoothed samples (a short
    /// section of other cable and a close pair of spots can come within a few units of each other there). True, with
    /// <paramref name="model"/> updated, when they do.
    /// </summary>
    private static bool SectionAsSpots(ref RunModel model, int i, Func<double, double, FitData> window, double half,
        double instrumentRiseSeconds, double smoothedRiseSeconds, ref int trials, CancellationToken cancellation)
    {
        var current = model;
        var spots = ReactiveSections.ClusterAsSpots(current, i, smoothedRiseSeconds)
            .FirstOrDefault(c => c.Events.Count == current.Events.Count);
        if (spots is null || !IsAlone(current, i, i + 1, smoothedRiseSeconds)) return false;
        double start = current.TimeOffsetSeconds + current.Events[i].RoundTripSeconds - half;
        double end = current.TimeOffsetSeconds + current.Events[i + 1].RoundTripSeconds + half;
        if (Cut(current, window, start, end, instrumentRiseSeconds) is not { } local) return false;
        double variance = ModelSelection.SampleVariance(local, current);
        var sectionFit = ModelFitter.Fit(current, local, variance, FreeInWindow(current, start, end), LongIterations, cancellation);
        double sectionBic = ModelSelection.Criterion(sectionFit, local, variance);
        trials++;
        // The smoothed fit stretches a pair of spots' decaying tails into a longer section, so the spots are also started
        // closer together than its ends.
        ModelFit? spotsFit = null;
        double spotsBic = double.PositiveInfinity;
        foreach (double share in SpotSeparationShares)
        {
            var events = spots.Events.ToList();
            events[i + 1] = events[i + 1] with
            {
                RoundTripSeconds = events[i].RoundTripSeconds + share * (events[i + 1].RoundTripSeconds - events[i].RoundTripSeconds),
            };
            var start2 = spots.WithEvents(events);
            var f = ModelFitter.Fit(start2, local, variance, FreeInWindow(start2, start, end), LongIterations, cancellation);
            trials++;
            double b = ModelSelection.Criterion(f, local, variance);
            if (b < spotsBic) (spotsFit, spotsBic) = (f, b);
        }
        ModelSelection.DebugTrace?.Invoke($"full-resolution look at the section at {current.Events[i].RoundTripSeconds * 1e9:0.0} ns: "
            + $"{local.Samples.Length} samples, bic {sectionBic:0.0}, as two spots {spotsBic:0.0}");
        if (!(spotsBic < sectionBic - OverturnMargin)) return false;
        model = TakeTwo(spots, spotsFit!.Model.Events, i);
        return true;
    }

    /// <summary>The unsmoothed window [<paramref name="start"/>, <paramref name="end"/>], or null when it holds too few
    /// samples or a model run on it would need more than <see cref="MaximumTransformPoints"/> internal samples.</summary>
    private static FitData? Cut(RunModel model, Func<double, double, FitData> window, double start, double end, double instrumentRiseSeconds)
    {
        FitData local;
        try { local = window(start, end); }
        catch (ArgumentException) { return null; }
        double internalInterval = Math.Min(local.IntervalSeconds,
            Simulation.StimulusSpectrum.MaximumInternalIntervalSeconds(Simulation.EdgeShape.Gaussian, instrumentRiseSeconds));
        return (end - model.TimeOffsetSeconds) / internalInterval > MaximumTransformPoints ? null : local;
    }

    /// <summary><paramref name="model"/> with events <paramref name="i"/> and <paramref name="i"/> + 1 taken from
    /// <paramref name="fitted"/>.</summary>
    private static RunModel TakeTwo(RunModel model, IReadOnlyList<RunModelEvent> fitted, int i)
    {
        var events = model.Events.ToList();
        events[i] = fitted[i];
        events[i + 1] = fitted[i + 1];
        return model.WithEvents(events);
    }

    /// <summary>True when events <paramref name="first"/>..<paramref name="last"/> have no other event within
    /// <paramref name="riseSeconds"/> on either side.</summary>
    private static bool IsAlone(RunModel model, int first, int last, double riseSeconds) =>
        (first == 0 || model.Events[first].RoundTripSeconds - model.Events[first - 1].RoundTripSeconds > riseSeconds)
        && (last + 1 == model.Events.Count || model.Events[last + 1].RoundTripSeconds - model.Events[last].RoundTripSeconds > riseSeconds);

    /// <summary>The level and every event between <paramref name="start"/> and <paramref name="end"/> (aligned time, s)
    /// free; the amplitude, the time offset and the rise are held (a few samples away from the incident edge cannot tell
    /// them from the events' sizes and places).</summary>
    private static bool[] FreeInWindow(RunModel model, double start, double end)
    {
        int first = -1, last = -2;
        for (int k = 0; k < model.Events.Count; k++)
        {
            double t = model.TimeOffsetSeconds + model.Events[k].RoundTripSeconds;
            if (t < start || t > end) continue;
            if (first < 0) first = k;
            last = k;
        }
        var free = model.FreeMask(first, last, withLoss: false);
        free[RunModel.AmplitudeIndex] = false;
        free[RunModel.TimeOffsetIndex] = false;
        free[RunModel.RiseIndex] = false;
        return free;
    }
}
