using CableFault.Simulation;
namespace CableFault.Analysis;

/// <summary>
/// Chooses how many events the run model has, and of which kind, by the Bayesian information criterion with the
/// noise variance known from conditioning: BIC = χ² + k·ln n, χ² = ν·RSS/σ², n = ν·N
/// (Schwarz, <i>Ann. Statist.</i> 6, 1978; with known σ² the −2 ln L term is χ² up to a constant), where ν is the
/// fraction of independent samples (1 for raw samples, less after the Gaussian low-pass).
/// </summary>
/// <remarks>
/// <para>Why BIC: its penalty ln n per parameter grows with the record, so a long noisy record does not sprout
/// events from noise peaks (AIC's fixed 2 per parameter would), and with σ² known it needs no estimate of the misfit.
/// A more complex model must win by <see cref="EvidenceMargin"/> (Kass &amp; Raftery, <i>J. Am. Stat. Assoc.</i> 90, 1995:
/// ΔBIC &gt; 2 is "positive" evidence).</para>
/// <para>σ² is floored at (<see cref="ModellingFloorRelative"/>·A)²: a measured trace never matches the model to the
/// last microvolt (edge shape, loss model, sampler linearity), and that misfit must not pass for evidence.</para>
/// <para>Moves: an end (open/short) for a boundary near ρ = ±1; removal of each event whose evidence is negative;
/// alternative kinds where the later trace can tell them apart (a shunt resistor or a tap instead of an impedance drop,
/// a series resistor instead of a rise); merging of neighbours closer than an effective rise; and splitting an event
/// into two where the residual around it is larger than the noise allows.</para>
/// </remarks>
internal static class ModelSelection
{
    /// <summary>BIC units by which a more complex model must win (Kass &amp; Raftery 1995: "positive evidence").</summary>
    internal const double EvidenceMargin = 2;

    /// <summary>Floor of the noise RMS relative to the incident amplitude (−74 dB): the model's accuracy on a real
    /// trace (common practice for a sampler's linearity, from memory).</summary>
    internal const double ModellingFloorRelative = 2e-4;

    /// <summary>Boundaries beyond this |ρ| are tried as an exact open or short: what lies before an end can make it look
    /// much smaller than 1 until the rest of the model is right.</summary>
    private const double EndTrialReflection = 0.3;

    /// <summary>Peak signature over the noise RMS below which an event is dropped: a 3σ excursion is the least a
    /// detection can rest on (common practice).</summary>
    internal const double MinimumSignatureSignalToNoise = 3;

    /// <summary>Echoes of a tap's open branch end (after 1, 2, … branch round trips) whose fitted stand-ins the tap
    /// hypothesis removes: each returns weaker by the junction's transmission, so by the fourth it is mostly lost.</summary>
    private const int TapEchoesRemoved = 4;

    /// <summary>BIC units a cut at a total reflection may add beyond doubling the criterion before it is refused (see
    /// TruncateAtTotalReflection in <see cref="Select"/>).</summary>
    private const double TruncationSlack = 100;

    /// <summary>Most rounds that add a missed event (each may add one).</summary>
    private const int MaximumInsertionRounds = 3;

    /// <summary>Most split rounds (each may split one event).</summary>
    private const int MaximumSplitRounds = 4;

    /// <summary>Iteration limit of a trial fit (warm started from a fitted model).</summary>
    private const int TrialIterations = 25;

    /// <summary>Iterations after which a trial that is still far from the current criterion is given up.</summary>
    private const int TrialFirstIterations = 8;

    /// <summary>Iterations of the first fit before the ends are tried against it (see <see cref="Select"/>).</summary>
    private const int FirstFitProbeIterations = 12;

    /// <summary>Share of the detector start's criterion a ringing-tap start must remove to be taken instead.</summary>
    private const double RingingStartShare = 0.5;

    /// <summary>BIC units within which a trial after its first iterations counts as promising.</summary>
    private const double PromisingMargin = 100;

    /// <summary>The selected model, the variance used, its criterion and each event's evidence; and the last event's
    /// round-trip σ from a given loss setting that the fit took as exact, s (see <see cref="MatchedLossyEnd"/>; 0 when
    /// none applies).</summary>
    internal sealed record Result(ModelFit Fit, double VarianceVolts2, double Bic, IReadOnlyList<Evidence> Events, int Trials,
        double LastEventLossSigmaSeconds = 0);

    /// <summary>What the data say about one event: ΔBIC when it is removed (others fixed) and its peak signature.</summary>
    /// <param name="DeltaBic">BIC without the event minus BIC with it; positive means the event is supported.</param>
    /// <param name="PeakSignatureVolts">Largest |model with − model without| over the window, V (signed).</param>
    internal sealed record Evidence(double DeltaBic, double PeakSignatureVolts);

    /// <summary>Diagnosis hook: when set, every trial hypothesis and its criterion is written to it (the accuracy
    /// benchmark's <c>--only</c> sets it with CF_TRACE=1). Null in normal use.</summary>
    internal static Action<string>? DebugTrace;

    internal static Result Select(RunModel initial, FitData data, double effectiveRiseSeconds, CancellationToken cancellation = default)
    {
        // Two strong reflectors a few rises apart ring between them, and the detector reports the ladder of echoes as a
        // row of events that the fit then bends to compensate for readings of the wrong kind (a leak read as a drop
        // makes echoes of the wrong sign); from there no single move reaches the right model. A second selection from
        // the detector's events without that ladder (see WithoutEchoLadder) reaches it in a few moves, and the better
        // of the two, by the criterion, is the reading.
        if (WithoutEchoLadder(initial, effectiveRiseSeconds) is not { } cleaned) return SelectFrom(initial, data, effectiveRiseSeconds, cancellation);
        // The two selections are independent: side by side (each leaves a core idle much of the time).
        var results = new Result[2];
        ForEachInParallel(2, k => results[k] = k == 0
            ? SelectFrom(initial, data, effectiveRiseSeconds, cancellation)
            : SelectFromLadder(initial, cleaned, data, effectiveRiseSeconds, cancellation), cancellation);
        var (fromDetector, fromCleaned) = (results[0], results[1]);
        DebugTrace?.Invoke($"echo-ladder selection: bic {fromCleaned.Bic:0.0} against {fromDetector.Bic:0.0}");
        var better = fromCleaned.Bic < fromDetector.Bic - EvidenceMargin ? fromCleaned : fromDetector;
        return better with { Trials = fromDetector.Trials + fromCleaned.Trials };
    }

    /// <summary>The selection from <paramref name="cleaned"/>, the detector's events without their echo ladder: what the
    /// ladder's reflectors are is the question the ladder answers, so the few events left are read every way (each
    /// boundary itself or its resistor; the last also an end) and the best first fit starts the selection.</summary>
    private static Result SelectFromLadder(RunModel initial, RunModel cleaned, FitData data, double effectiveRiseSeconds, CancellationToken cancellation)
    {
        var readings = KindReadings(cleaned);
        double variance = SampleVariance(data, initial);
        var probes = ModelFitter.FitEach(readings, data, variance, FirstFitProbeIterations, cancellation);
        var start = probes.MinBy(f => Criterion(f, data, variance))!.Model;
        DebugTrace?.Invoke($"echo-ladder start {Describe(cleaned)}; best of {readings.Count} readings {Describe(start)}");
        return SelectFrom(start, data, effectiveRiseSeconds, cancellation);
    }

    /// <summary>Fewest events an echo ladder must hold for a second selection from the events without it.</summary>
    private const int MinimumLadderEchoes = 3;

    /// <summary>Least |ρ| of an event that the ladder's echoes bounce off.</summary>
    private const double LadderReflectorReflection = 0.2;

    /// <summary>
    /// <paramref name="initial"/> without the events at the echo times of its stronger events, or null when fewer than
    /// <see cref="MinimumLadderEchoes"/> are: in time order, an event k is an echo when t_k = t_a + t_b − t_c within
    /// half an effective rise, with c a kept event of |ρ| ≥ <see cref="LadderReflectorReflection"/> earlier than a and
    /// b, and a and b kept events or echoes themselves (a higher-order bounce). The wave goes out to a, back to c, out
    /// again to b.
    /// </summary>
    private static RunModel? WithoutEchoLadder(RunModel initial, double effectiveRiseSeconds)
    {
        double tolerance = 0.5 * effectiveRiseSeconds;
        var events = initial.Events;
        var kept = new List<int>();
        var seen = new List<int>();
        int echoes = 0;
        for (int k = 0; k < events.Count; k++)
        {
            double tk = events[k].RoundTripSeconds;
            bool echo = !events[k].EndsRun && kept.Any(c => Math.Abs(LocalReflection(initial, c)) >= LadderReflectorReflection
                && seen.Any(a => events[a].RoundTripSeconds > events[c].RoundTripSeconds
                    && seen.Any(b => b >= a && Math.Abs(tk - (events[a].RoundTripSeconds + events[b].RoundTripSeconds - events[c].RoundTripSeconds)) < tolerance)));
            if (echo) echoes++;
            else kept.Add(k);
            seen.Add(k);
        }
        return echoes >= MinimumLadderEchoes ? initial.WithEvents(kept.Select(k => events[k])) : null;
    }

    /// <summary>Most boundaries of a ladder's remaining events read every way (2ⁿ⁻¹·3 readings).</summary>
    private const int MaximumReadingBoundaries = 4;

    /// <summary>Every reading of <paramref name="m"/>'s first <see cref="MaximumReadingBoundaries"/> boundaries: each as
    /// itself or as its resistor (see <see cref="WithResistor"/>), and a last event that is a boundary also as an open or
    /// a short by its sign.</summary>
    private static List<RunModel> KindReadings(RunModel m)
    {
        var boundaries = Enumerable.Range(0, m.Events.Count).Where(i => m.Events[i].Element == RunModelElement.Boundary)
            .Take(MaximumReadingBoundaries).ToList();
        var readings = new List<RunModel>();
        for (int mask = 0; mask < 1 << boundaries.Count; mask++)
        {
            var reading = m;
            for (int b = 0; b < boundaries.Count; b++)
                if ((mask & (1 << b)) != 0) reading = reading.WithEvents(WithResistor(reading.Events, reading, boundaries[b]));
            readings.Add(reading);
            int last = m.Events.Count - 1;
            if (boundaries.Count > 0 && boundaries[^1] == last && (mask & (1 << (boundaries.Count - 1))) == 0)
            {
                var end = reading.Events[last] with
                {
                    Element = LocalReflection(reading, last) > 0 ? RunModelElement.Open : RunModelElement.Short, Value = double.NaN,
                };
                readings.Add(reading.WithEvents(reading.Events.Take(last).Append(end)));
            }
        }
        return readings;
    }

    private static Result SelectFrom(RunModel initial, FitData data, double effectiveRiseSeconds, CancellationToken cancellation)
    {
        double variance = SampleVariance(data, initial);
        double logN = LogSampleCount(data);
        double Bic(ModelFit f) => Criterion(f, data, variance);
        int trials = 0;
        string Key(RunModel m) => string.Join(",", m.Events.Select(e => $"{e.Element}@{Math.Round(e.RoundTripSeconds / effectiveRiseSeconds)}"))
            + (m.Context.ResistiveEnd ? ",R" : "");
        var tried = new HashSet<string> { Key(initial) };
        // A further condition on a trial's fitted model (set by a move for its own trials only).
        Func<RunModel, bool>? acceptIf = null;
        // The last trial given up after its first iterations: its fit, criterion and free parameters (see TryBest).
        (ModelFit Fit, double Bic, bool[] Free)? lastProbe = null;

        // A row of candidates that rings like an open branch is also started as a tap (see RunModelBuilder.RingingTapStart);
        // the two first fits run side by side. The tap start goes on only if it halves the criterion: the ringing it
        // makes itself explains most of what the detector's row stood for, where a mere change of path (two poor starts
        // from a trace that only resembles ringing) differs by far less (the 75 Ω drop speed trace: 48×; a 0.3 m
        // branch: 4 000×; benchmark run 13, a section and its echoes taken for ringing: 1.1×).
        var ringingTap = RunModelBuilder.RingingTapStart(initial, effectiveRiseSeconds);
        var firstFits = ModelFitter.FitEach(ringingTap is null ? [initial] : [initial, ringingTap], data, variance, FirstFitProbeIterations,
            cancellation);
        var best = firstFits[0];
        double bestBic = Bic(best);
        if (ringingTap is not null)
        {
            double tapBic = Bic(firstFits[1]);
            DebugTrace?.Invoke($"ringing start {Describe(ringingTap)}: bic {tapBic:0.0} against {bestBic:0.0}");
            tried.Add(Key(ringingTap));
            if (tapBic < bestBic - Math.Max(EvidenceMargin, RingingStartShare * Math.Abs(bestBic))) (best, bestBic) = (firstFits[1], tapBic);
        }
        DebugTrace?.Invoke($"start {Describe(initial)}");
        DebugTrace?.Invoke($"first fit: bic {bestBic:0.0} {Describe(best.Model)}");

        // A trial frees the events it changed, the one before, and every event after: a change alters what reaches the
        // later events and the levels and echoes they set, while the earlier part of the run is already fitted and
        // barely moves. The incident edge (amplitude, offset, rise) is free too: a wrong model bends it.
        bool TryAccept(RunModel candidate, bool simpler, params int[] focus)
        {
            if (Admit(candidate, focus) is not { } trial) return false;
            var (fit, bic) = RunTrial(trial, bestBic);
            return Conclude(trial, fit, bic, simpler);
        }

        // A new hypothesis and the parameters its trial frees, or null when it was tried before: the same kinds at the
        // same places (to within an effective rise) are one hypothesis, and fitting it twice from nearby starts gains
        // nothing.
        Trial? Admit(RunModel candidate, int[] focus)
        {
            string key = Key(candidate);
            if (!tried.Add(key)) { DebugTrace?.Invoke($"skip (tried) {key}"); return null; }
            trials++;
            // An estimated loss is free too: what the later trace says about it changes with the events (a resistor and a
            // step that reflect alike pass the end's echo back differently, and a loss fixed for one reading would stand
            // against the other).
            return new Trial(candidate, key, candidate.FreeMask(focus.Min() - 1, int.MaxValue, withLoss: true));
        }

        // The trial's fit and criterion, judged against criterion `against`; touches no state of the selection, so the
        // candidates of one move can be fitted side by side.
        (ModelFit Fit, double Bic) RunTrial(Trial trial, double against)
        {
            var fit = ModelFitter.Fit(trial.Candidate, data, variance, trial.Free, TrialFirstIterations, cancellation);
            double bic = Bic(fit);
            // A right hypothesis falls close to the current criterion within a few iterations; a wrong one stays far
            // above it. Only the promising get the rest of the iterations.
            if (!fit.Converged && bic < against + Math.Max(PromisingMargin, 0.1 * Math.Abs(against)))
            {
                fit = ModelFitter.Fit(fit.Model, data, variance, trial.Free, TrialIterations - TrialFirstIterations, cancellation);
                bic = Bic(fit);
            }
            // A near miss may have stopped on a parameter the start's scaling made look flat (the rise, on smoothed data,
            // where it barely changes the trace yet still sets every edge): one fresh fit from where it stopped, with new
            // derivatives and scales, settles whether it really loses.
            if (bic >= against - EvidenceMargin && bic < against + PromisingMargin)
            {
                var again = ModelFitter.Fit(fit.Model, data, variance, trial.Free, TrialIterations - TrialFirstIterations, cancellation);
                double againBic = Bic(again);
                if (againBic < bic) (fit, bic) = (again, againBic);
            }
            return (fit, bic);
        }

        // Accepts the trial's fit as the current model when it beats it; keeps it as the last probe when it was given up
        // after its first iterations.
        bool Conclude(Trial trial, ModelFit fit, double bic, bool simpler)
        {
            bool accept = Accepts(fit, bic, simpler);
            DebugTrace?.Invoke($"trial {trial.Key}: bic {bic:0.0} vs best {bestBic:0.0} conv {fit.Converged} it {fit.Iterations} -> {accept}");
            if (accept) { best = fit; bestBic = bic; }
            else if (!fit.Converged && fit.Iterations <= TrialFirstIterations) lastProbe = (fit, bic, trial.Free);
            return accept;
        }

        // A simpler model may lose by the margin, a more complex one must win by it; a move may add its own condition.
        bool Accepts(ModelFit fit, double bic, bool simpler) =>
            (simpler ? bic < bestBic + EvidenceMargin : bic < bestBic - EvidenceMargin) && (acceptIf?.Invoke(fit.Model) ?? true);

        // A detector's many candidates are often one end and its echoes: the first fit of them all is the costliest of
        // the selection, and an end trial then removes most of them. So the first fit stops early; if an end already
        // wins against it, the full fit is skipped, and otherwise the fit is finished and the ends are tried afresh.
        if (!best.Converged)
        {
            var probe = best;
            var triedBefore = new HashSet<string>(tried);
            TryEnds();
            if (ReferenceEquals(best, probe))
            {
                tried = triedBefore;
                best = ModelFitter.Fit(probe.Model, data, variance, maximumIterations: ModelFitter.DefaultMaximumIterations - FirstFitProbeIterations,
                    cancellation: cancellation);
                bestBic = Bic(best);
            }
        }
        TryEnds();
        Prune();
        TryResistiveEnd();

        // Fits several candidates (side by side: each is judged against the current model alone) and accepts the best
        // if it beats the current model.
        // simpler: whether the candidates need only not lose by the margin (true) or must win by it (false); null decides
        // per candidate by its parameter count against the current model's.
        bool TryBest(IReadOnlyList<RunModel> candidates, bool? simpler, params int[] focus)
        {
            var current = best.Model;
            return TryBestJudged(candidates, c => simpler ?? c.ParameterCount < current.ParameterCount, focus);
        }

        // As TryBest, with isSimpler telling per candidate whether it need only not lose.
        bool TryBestJudged(IReadOnlyList<RunModel> candidates, Func<RunModel, bool> isSimpler, params int[] focus)
        {
            var saved = (best, bestBic);
            var admitted = candidates.Select(c => Admit(c, focus)).OfType<Trial>().ToList();
            var results = new (ModelFit Fit, double Bic)[admitted.Count];
            ForEachInParallel(admitted.Count, k => results[k] = RunTrial(admitted[k], saved.bestBic), cancellation);
            ModelFit? winner = null;
            double winnerBic = double.PositiveInfinity;
            (ModelFit Fit, double Bic, bool[] Free)? leading = null;
            for (int k = 0; k < admitted.Count; k++)
            {
                (best, bestBic) = saved;
                lastProbe = null;
                if (Conclude(admitted[k], results[k].Fit, results[k].Bic, isSimpler(admitted[k].Candidate)) && bestBic < winnerBic) { winner = best; winnerBic = bestBic; }
                if (lastProbe is { } p && (leading is null || p.Bic < leading.Value.Bic)) leading = p;
            }
            (best, bestBic) = winner is null ? saved : (winner, winnerBic);
            // When the current model is itself far from the data, every alternative can look hopeless after a few
            // iterations: the most promising of them gets the rest of its iterations before the move is given up.
            if (winner is null && leading is { } lead)
            {
                var fit = ModelFitter.Fit(lead.Fit.Model, data, variance, lead.Free, TrialIterations - TrialFirstIterations, cancellation);
                double bic = Bic(fit);
                bool accept = Accepts(fit, bic, isSimpler(fit.Model));
                DebugTrace?.Invoke($"resumed: bic {bic:0.0} vs best {bestBic:0.0} conv {fit.Converged} -> {accept}");
                if (accept) { (best, bestBic) = (fit, bic); return true; }
            }
            return winner is not null;
        }

        Alternatives();

        TryEnds();

        // Merge neighbours closer than an effective rise (one event may have been detected twice).
        for (int i = 0; i + 1 < best.Model.Events.Count; i++)
        {
            var m = best.Model;
            if (m.Events[i + 1].RoundTripSeconds - m.Events[i].RoundTripSeconds > effectiveRiseSeconds) continue;
            var ev = EventEvidence(best, data, variance, logN, effectiveRiseSeconds);
            int weaker = ev[i].DeltaBic < ev[i + 1].DeltaBic ? i : i + 1;
            var list = m.Events.ToList();
            var kept = list[weaker == i ? i + 1 : i];
            list.RemoveAt(weaker);
            if (kept.Element == RunModelElement.Boundary && weaker == i + 1)
                list[i] = kept with { Value = m.Events[i + 1].Value };
            if (TryAccept(m.WithEvents(list), simpler: true, i)) i--;
        }

        TrySections();

        // Add an event where a stretch of residual away from every event is larger than the noise allows (see MissingEvents).
        int splits = 0;
        for (int round = 0; round < MaximumInsertionRounds; round++)
        {
            var (proposals, at) = MissingEvents.Propose(best, data, variance, effectiveRiseSeconds, 2 * logN + EvidenceMargin);
            DebugTrace?.Invoke($"insertion round {round}: {proposals.Count} proposal(s) at index {at}");
            if (proposals.Count == 0 || !TryBest(proposals, simpler: false, at)) break;
            splits++;
        }

        // Split where the residual around an event is larger than the noise allows.
        for (int round = 0; round < MaximumSplitRounds; round++)
        {
            var m = best.Model;
            int worst = -1;
            double worstExcess = 0;
            // Events at or past a total reflection are not split: TruncateAtTotalReflection below turns such a boundary
            // into an exact end and removes everything after it, so a split there only costs fits that are thrown away.
            int total = TotalReflectionIndex(m);
            for (int i = 0; i < (total < 0 ? m.Events.Count : total); i++)
            {
                if (m.Events[i].Element is RunModelElement.Tap or RunModelElement.Open or RunModelElement.Short) continue;
                double excess = LocalExcess(best, data, variance, m.TimeOffsetSeconds + m.Events[i].RoundTripSeconds, effectiveRiseSeconds);
                if (excess > worstExcess) { worstExcess = excess; worst = i; }
            }
            if (worst < 0 || worstExcess < 2 * logN + EvidenceMargin) break;
            if (!TryAccept(m.WithEvents(Split(m, worst, effectiveRiseSeconds / 4)), simpler: false, worst, worst + 1)) break;
            splits++;
        }
        if (splits > 0)
        {
            // A split can make the earlier part of the run right for the first time; what follows is then worth reading
            // again (a short behind a leak looks like a step until the leak is modelled as one).
            Prune();
            TryContinuingLine();
            TrySections();
            Alternatives();
            TryEnds();
        }

        TryContinuingLine();
        TryResistiveEnd();
        Prune();
        NarrowPairsToSpots();
        TruncateAtTotalReflection();
        var resolved = CoincidentEvents.Resolve(best, data, variance, effectiveRiseSeconds, ref trials, cancellation);
        if (!ReferenceEquals(resolved, best)) (best, bestBic) = (resolved, Bic(resolved));
        if (trials > 0)
        {
            // Polish: every parameter free, warm started from the selected model.
            best = ModelFitter.Fit(best.Model, data, variance, cancellation: cancellation);
            best = WithoutFaintEvents(best, data, variance, logN, effectiveRiseSeconds, ref trials, cancellation);
            bestBic = Bic(best);
        }
        var evidence = EventEvidence(best, data, variance, logN, effectiveRiseSeconds);
        return new Result(best, variance, bestBic, evidence, trials);

        // Ends: a boundary clearly up or down may be an exact open or short, with what the detector saw beyond it being
        // echoes; nothing on the main line lies beyond an end. What an end looks like depends on how the earlier events
        // pass the wave back (a shunt resistor and an impedance drop reflect alike but transmit differently), so each
        // end is tried as is and with each earlier boundary as its resistive alternative.
        void TryEnds()
        {
            for (int i = 0; i < best.Model.Events.Count; i++)
            {
                var m = best.Model;
                // A resistor can stand in for an end too: a short behind a lossy stretch fits first as a small shunt R.
                if (m.Events[i].Element is not (RunModelElement.Boundary or RunModelElement.ShuntResistor or RunModelElement.SeriesResistor)) continue;
                double rho = LocalReflection(m, i);
                if (Math.Abs(rho) < EndTrialReflection) continue;
                var end = m.Events[i] with { Element = rho > 0 ? RunModelElement.Open : RunModelElement.Short, Value = double.NaN };
                var truncated = m.Events.Take(i).Append(end).ToList();
                var variants = new List<List<RunModelEvent>> { truncated };
                for (int j = 0; j < i; j++)
                {
                    if (m.Events[j].Element != RunModelElement.Boundary) continue;
                    variants.Add(WithResistor(truncated, m, j));
                    if (WithCompound(truncated, m, j) is { } compound) variants.Add(compound);
                }
                if (TryBest(variants.Select(v => m.WithEvents(v)).ToList(), simpler: true, 0)) return;
            }
        }

        // On a lossy cable a run that ends in a resistor (a termination, a camera, an antenna) and one that goes on beyond
        // the record in a line of that impedance leave different slow tails (see RunModelContext.ResistiveEnd), and a
        // model of the wrong one soaks the difference up in extra events near and beyond the end. So the resistor is
        // tried on the first fit (before those events are added) and again on the selected model; each time as the model
        // stands (as many parameters: it must win by the margin) and, as for an open or a short, at each clear boundary
        // with what lies beyond it taken for its echoes (fewer parameters: it need only not lose).
        void TryResistiveEnd()
        {
            var m = best.Model;
            if (m.Context.Loss is null || m.Context.ResistiveEnd || m.Events.Count == 0 || m.Events[^1].EndsRun) return;
            var context = m.Context with { ResistiveEnd = true };
            var candidates = new List<RunModel> { m.WithContext(context) };
            for (int i = 0; i + 1 < m.Events.Count; i++)
                if (m.Events[i].Element == RunModelElement.Boundary && Math.Abs(LocalReflection(m, i)) >= EndTrialReflection)
                    candidates.Add(m.WithEvents(m.Events.Take(i + 1)).WithContext(context));
            TryBest(candidates, simpler: null, 0);
        }

        // The reverse of TryResistiveEnd: a resistor taken on the first fit, when the model was still poor, may have won
        // by what the events added since explain, and then holds in stand-ins for the slow tail it does not match (a
        // tap's drop read as a drop, with three stand-ins, behind a matched end on a lossy line). The line going on is
        // tried again: as many parameters, so it must win by the margin.
        void TryContinuingLine()
        {
            var m = best.Model;
            if (!m.Context.ResistiveEnd || m.Events.Count == 0 || m.Events[^1].EndsRun) return;
            TryAccept(m.WithContext(m.Context with { ResistiveEnd = false }), simpler: false, 0);
        }

        // A lumped C or L, or a row of them, may be a short section of other cable (see ReactiveSections). Every one is
        // tried: a gate on the local residual, as for a split, missed sections whose misfit the spot spreads thinly over
        // the later trace through the delay it adds (benchmark subset: same accuracy with the gate, +5 % model runs
        // without it, and sections of about 3 resolution units found only without it). Two starting lengths (see
        // SectionReadings); a section shorter than MinimumSectionRiseTimes stays a spot.
        void TrySections()
        {
            int i = 0;
            while (i < best.Model.Events.Count)
            {
                var m = best.Model;
                // A narrow pair of boundaries that returns may be a spot (or, if capacitive, a tap) the fit bent into an
                // extreme section; fewer parameters, so it need only not lose. One far narrower than the rise that does
                // not return is a spot and a step at one place (a connector where two cables meet): as many parameters,
                // but a "section" the data cannot resolve is no reading (see MinimumSectionRiseTimes), so it too need
                // only not lose.
                // Or a cluster may be two spots, one at each end (as many parameters as two boundaries, so those must
                // win by the margin; fewer than a cluster of three).
                var spots = ReactiveSections.SpotCandidates(m, i, effectiveRiseSeconds);
                var narrowPair = new HashSet<RunModel>(spots);
                spots.AddRange(ReactiveSections.ClusterAsSpots(m, i, effectiveRiseSeconds));
                if (spots.Count > 0 && TryBestJudged(spots, c => narrowPair.Contains(c) || c.ParameterCount < m.ParameterCount, i)) continue;
                if (!ReactiveSections.IsReactive(m.Events[i].Element)) { i++; continue; }
                int last = ReactiveSections.ClusterEnd(m, i, effectiveRiseSeconds);
                var candidates = SectionReadings(m, i, last);
                int at = i;
                acceptIf = f => IsResolvedSection(f, at);
                bool accepted = candidates.Count > 0 && TryBest(candidates, simpler: last - i + 1 > 2, i);
                acceptIf = null;
                i = accepted ? i + 2 : last + 1;
            }
        }

        // The spots first..last as one section (see ReactiveSections.Replace), from two starting lengths: half a rise and
        // one and a half rises beyond the row's span.
        List<RunModel> SectionReadings(RunModel m, int first, int last)
        {
            double span = m.Events[last].RoundTripSeconds - m.Events[first].RoundTripSeconds;
            return new[] { span + effectiveRiseSeconds / 2, span + 1.5 * effectiveRiseSeconds }
                .Select(tau => ReactiveSections.Replace(m, first, last, tau)).OfType<RunModel>().ToList();
        }

        // A fitted section starting at event `at` must be at least MinimumSectionRiseTimes long (a connector is not a
        // 3 cm section).
        bool IsResolvedSection(RunModel f, int at) => f.Events.Count > at + 1
            && f.Events[at + 1].RoundTripSeconds - f.Events[at].RoundTripSeconds >= ResolutionRefinement.MinimumSectionRiseTimes * effectiveRiseSeconds;

        // A narrow pair of boundaries on the selected model is tried once more as the spot it may stand for (see
        // TrySections): a section accepted while the rest of the model was still wrong can outlive the reason it won (a
        // shunt C bent into a 2 Ω stretch a fifth of a rise long while a series R before it was read as two steps), and one
        // to |ρ| beyond the end threshold and back would be reported as an open and a short in the middle of the run.
        // Pairs already tried in this form are skipped by the hypothesis memory.
        void NarrowPairsToSpots()
        {
            for (int i = 0; i + 1 < best.Model.Events.Count; i++)
            {
                var m = best.Model;
                if (m.Events[i].Element != RunModelElement.Boundary) continue;
                var spots = ReactiveSections.SpotCandidates(m, i, effectiveRiseSeconds);
                if (spots.Count > 0) TryBest(spots, simpler: true, i);
            }
        }

        // Alternative kinds, where what follows can tell them apart.
        void Alternatives()
        {
            for (int i = 0; i < best.Model.Events.Count; i++)
            {
                var m = best.Model;
                var e = m.Events[i];
                // A capacitive spot may be a tap with an open branch longer than a rise (see ReactiveSections.AsTap);
                // same parameter count, so the tap must win by the margin. A drop a few rises long (a crushed stretch)
                // also fits first as a spot, and a tap reads a drop and its return far better than the spot does; once
                // the tap is taken no later move reaches the section, so a tap that wins is tried at once as the
                // section readings of TrySections (each must beat the tap by the margin). Only then: a spot the tap
                // does not beat is left to TrySections, and two close spots read as one must not be made a section
                // before the moves that split them.
                if (ReactiveSections.AsTap(m, i, effectiveRiseSeconds) is RunModel tapped)
                {
                    if (TryAccept(tapped, simpler: false, i))
                    {
                        int at = i;
                        acceptIf = f => IsResolvedSection(f, at);
                        TryBest(SectionReadings(m, i, i), simpler: false, i);
                        acceptIf = null;
                    }
                    continue;
                }
                if (e.Element is not (RunModelElement.Boundary or RunModelElement.ShuntResistor) || i == m.Events.Count - 1) continue;
                double rho = LocalReflection(m, i);
                if (rho < 0)
                {
                    var variants = new List<RunModel>();
                    if (e.Element == RunModelElement.Boundary)
                    {
                        var resistive = WithResistor(m.Events, m, i);
                        variants.Add(m.WithEvents(resistive));
                        if (WithoutEchoes(resistive, i, effectiveRiseSeconds) is { } cleared) variants.Add(m.WithEvents(cleared));
                        if (WithCompound(m.Events, m, i) is { } compound) variants.Add(m.WithEvents(compound));
                    }
                    if (rho > -0.6 && rho < -0.1)
                    {
                        // A tap: the drop and a later upward echo (the open branch end seen through the junction, which the
                        // first fit may have read as a rise, an open, a series L or a series R) become one junction with an
                        // open branch. A shunt resistor of Z followed by an open reflects exactly like a tap whose other
                        // branch is matched, with one parameter fewer: the criterion prefers the tap, the usual way such a
                        // trace arises. The branch end also rings (its echo returns after each further branch round trip)
                        // and the first fit will have put events there: they go with the hypothesis, and in a second
                        // variant so does whatever lies between the junction and the branch end's first echo.
                        foreach (int j in Enumerable.Range(i + 1, m.Events.Count - i - 1).Where(j => IsUpward(m, j)).Take(3))
                        {
                            double branch = m.Events[j].RoundTripSeconds - e.RoundTripSeconds;
                            bool IsRinging(RunModelEvent x) => Enumerable.Range(1, TapEchoesRemoved)
                                .Any(k => Math.Abs(x.RoundTripSeconds - e.RoundTripSeconds - k * branch) < 0.75 * effectiveRiseSeconds);
                            var tap = e with { Element = RunModelElement.Tap, Value = branch };
                            var tapList = m.Events.Select((x, k) => k == i ? tap : x).Where((x, k) => k <= i || !IsRinging(x)).ToList();
                            variants.Add(m.WithEvents(tapList));
                            var cleared = tapList.Where(x => x.RoundTripSeconds <= e.RoundTripSeconds || x.RoundTripSeconds > m.Events[j].RoundTripSeconds).ToList();
                            if (cleared.Count < tapList.Count) variants.Add(m.WithEvents(cleared));
                        }
                        // The first fit may have put no upward event at the branch end's echo (a short branch merges
                        // into the junction's drop and the rest is spread over small spots): a scan of branch lengths
                        // picks a start from the data.
                        if (TapScan(m, i, data, effectiveRiseSeconds) is RunModel scanned) variants.Add(scanned);
                    }
                    if (variants.Count > 0 && TryBest(variants, simpler: null, i)) continue;
                }
                else if (e.Element == RunModelElement.Boundary)
                {
                    var resistive = WithResistor(m.Events, m, i);
                    var variants = new List<RunModel> { m.WithEvents(resistive) };
                    if (WithoutEchoes(resistive, i, effectiveRiseSeconds) is { } cleared) variants.Add(m.WithEvents(cleared));
                    if (WithCompound(m.Events, m, i) is { } compound) variants.Add(m.WithEvents(compound));
                    TryBest(variants, simpler: null, i);
                }
            }
        }

        // Nothing on the main line lies beyond a total reflection: what the model put there is re-reflection and loss
        // tail. A boundary to |ρ| ≥ the classifier's end threshold becomes an exact open or short and everything after
        // it goes, whatever the criterion says (a wrong loss model can make later junk pay for itself).
        void TruncateAtTotalReflection()
        {
            var m = best.Model;
            int at = TotalReflectionIndex(m);
            double recordEnd = data.TimeAt(data.Samples.Length - 1) - m.TimeOffsetSeconds;
            int beyondRecord = Enumerable.Range(0, m.Events.Count).Where(i => m.Events[i].RoundTripSeconds > recordEnd).DefaultIfEmpty(-1).First();
            if (at < 0 && beyondRecord < 0) return;
            var list = m.Events.ToList();
            if (at >= 0)
            {
                var e = m.Events[at];
                if (!e.EndsRun) list[at] = e with { Element = LocalReflection(m, at) > 0 ? RunModelElement.Open : RunModelElement.Short, Value = double.NaN };
                list.RemoveRange(at + 1, list.Count - at - 1);
            }
            list.RemoveAll(e => e.RoundTripSeconds > recordEnd);
            if (list.Count == m.Events.Count && list.Zip(m.Events).All(p => p.First == p.Second)) return;
            var truncated = ModelFitter.Fit(m.WithEvents(list), data, variance, cancellation: cancellation);
            trials++;
            // Unless the run beyond plainly goes on: a narrow, extreme pair of boundaries (a tap or a short section the
            // fit bent out of shape) is no end, and cutting there leaves most of the trace unexplained. Later junk from a
            // slightly wrong loss model costs far less than doubling the criterion.
            double truncatedBic = Bic(truncated);
            if (at >= 0 && !m.Events[at].EndsRun && truncatedBic > 2 * bestBic + TruncationSlack)
            {
                DebugTrace?.Invoke($"truncation at {at} refused: bic {truncatedBic:0.0} vs {bestBic:0.0}");
                return;
            }
            (best, bestBic) = (truncated, truncatedBic);
        }

        void Prune()
        {
            while (best.Model.Events.Count > 0)
            {
                var ev = EventEvidence(best, data, variance, logN, effectiveRiseSeconds);
                // An event whose own signature is lost in the noise is no detection, whatever it does to the criterion
                // (it is soaking up misfit elsewhere): it goes first, unconditionally.
                double sigma = Math.Sqrt(variance);
                int faint = Enumerable.Range(0, ev.Count).Where(k => IsFaint(ev[k], sigma))
                    .DefaultIfEmpty(-1).MinBy(k => k < 0 ? 0 : Math.Abs(ev[k].PeakSignatureVolts));
                if (faint >= 0)
                {
                    DebugTrace?.Invoke($"faint: {Describe(best.Model)} loses event {faint} (peak signature {ev[faint].PeakSignatureVolts:G3} V)");
                    var reduced = best.Model.Events.Where((_, k) => k != faint);
                    var refit = ModelFitter.Fit(best.Model.WithEvents(reduced), data, variance, cancellation: cancellation);
                    trials++;
                    best = refit;
                    bestBic = Bic(refit);
                    continue;
                }
                int weakest = Enumerable.Range(0, ev.Count).MinBy(k => ev[k].DeltaBic);
                if (ev[weakest].DeltaBic >= EvidenceMargin) break;
                var list = best.Model.Events.ToList();
                list.RemoveAt(weakest);
                if (!TryAccept(best.Model.WithEvents(list), simpler: true, weakest - 1, weakest)) break;
            }
        }
    }

    /// <summary>Each event as kind@round trip (ns)=value, for <see cref="DebugTrace"/>.</summary>
    internal static string Describe(RunModel m) => string.Join(", ", m.Events.Select(e =>
        string.Create(System.Globalization.CultureInfo.InvariantCulture, $"{e.Element}@{e.RoundTripSeconds * 1e9:0.0}={e.Value:G3}")));

    /// <summary>A hypothesis admitted for a trial fit: the model, its key and the parameters the trial frees.</summary>
    private sealed record Trial(RunModel Candidate, string Key, bool[] Free);

    /// <summary>Runs <paramref name="body"/> for 0 … count − 1 on the thread pool; the first failure is rethrown as it was
    /// thrown (a cancellation stays an <see cref="OperationCanceledException"/>).</summary>
    internal static void ForEachInParallel(int count, Action<int> body, CancellationToken cancellation)
    {
        if (count <= 1)
        {
            if (count == 1) body(0);
            return;
        }
        // The last item still running, once the others are done, splits its serial runs over the cores they have left.
        var items = BinSplitting.GroupFor(count);
        try
        {
            Parallel.For(0, count, new ParallelOptions { CancellationToken = cancellation }, k =>
            {
                try
                {
                    using var sideBySide = BinSplitting.SideBySideIn(items);
                    body(k);
                }
                finally
                {
                    items?.Leave();
                }
            });
        }
        catch (AggregateException e)
        {
            System.Runtime.ExceptionServices.ExceptionDispatchInfo.Capture(e.InnerExceptions[0]).Throw();
        }
    }

    /// <summary>True when an event's own signature is lost in noise of RMS <paramref name="sigmaVolts"/> (peak below
    /// <see cref="MinimumSignatureSignalToNoise"/>·σ): no detection, whatever it does to the criterion.</summary>
    private static bool IsFaint(Evidence evidence, double sigmaVolts) =>
        Math.Abs(evidence.PeakSignatureVolts) < MinimumSignatureSignalToNoise * sigmaVolts;

    /// <summary>Most refits <see cref="WithoutFaintEvents"/> makes.</summary>
    private const int MaximumFaintRemovals = 3;

    /// <summary>
    /// <paramref name="fit"/> without the events whose own signature is lost in the noise (peak below
    /// <see cref="MinimumSignatureSignalToNoise"/>·σ), refitted: a last refit with every parameter free can shrink an
    /// event to nothing or move it where it acts on nothing, and such an event is no detection (the rule Prune applies
    /// during the selection).
    /// </summary>
    internal static ModelFit WithoutFaintEvents(ModelFit fit, FitData data, double variance, double logN, double riseSeconds,
        ref int trials, CancellationToken cancellation)
    {
        double sigma = Math.Sqrt(variance);
        for (int round = 0; round < MaximumFaintRemovals; round++)
        {
            var evidence = EventEvidence(fit, data, variance, logN, riseSeconds);
            var kept = fit.Model.Events.Where((_, k) => !IsFaint(evidence[k], sigma)).ToList();
            if (kept.Count == fit.Model.Events.Count) break;
            DebugTrace?.Invoke($"faint after the polish: {Describe(fit.Model)} keeps {kept.Count}");
            fit = ModelFitter.Fit(fit.Model.WithEvents(kept), data, variance, cancellation: cancellation);
            trials++;
        }
        return fit;
    }

    /// <summary>
    /// <paramref name="fit"/> without the events that lie past its first open or short: the run model ends there (see
    /// <see cref="RunModel"/>), so they act on nothing, and an end with such a shadow looks as if it could be removed at
    /// no cost. The refit starts at the same samples and stops at once.
    /// </summary>
    internal static ModelFit WithoutEventsPastEnd(ModelFit fit, FitData data, double variance, ref int trials, CancellationToken cancellation)
    {
        var m = fit.Model;
        int end = Enumerable.Range(0, m.Events.Count).Where(i => m.Events[i].EndsRun).DefaultIfEmpty(-1).First();
        if (end < 0 || end == m.Events.Count - 1) return fit;
        trials++;
        return ModelFitter.Fit(m.WithEvents(m.Events.Take(end + 1)), data, variance, cancellation: cancellation);
    }

    /// <summary>Branch round trips the tap scan tries, in effective rise times (geometric, 1 to 40).</summary>
    private static readonly double[] TapScanRiseTimes = Enumerable.Range(0, 14).Select(k => Math.Pow(40, k / 13.0)).ToArray();

    /// <summary>
    /// Event <paramref name="index"/> as a tap, with the branch round trip (of <see cref="TapScanRiseTimes"/>) whose model
    /// leaves the least residual unrefitted; the events up to the branch end's first echo and at its later echoes go with
    /// it (they are what the first fit made of the branch). One model run per length tried; null when none fits.
    /// </summary>
    private static RunModel? TapScan(RunModel m, int index, FitData data, double effectiveRiseSeconds)
    {
        var e = m.Events[index];
        RunModel? best = null;
        double bestRss = double.PositiveInfinity;
        foreach (double units in TapScanRiseTimes)
        {
            double branch = units * effectiveRiseSeconds;
            bool Covered(RunModelEvent x) =>
                x.RoundTripSeconds - e.RoundTripSeconds <= branch + 0.75 * effectiveRiseSeconds
                || Enumerable.Range(2, TapEchoesRemoved - 1).Any(k => Math.Abs(x.RoundTripSeconds - e.RoundTripSeconds - k * branch) < 0.75 * effectiveRiseSeconds);
            var list = m.Events.Select((x, k) => k == index ? e with { Element = RunModelElement.Tap, Value = branch } : x)
                .Where((x, k) => k <= index || !Covered(x)).ToList();
            var candidate = m.WithEvents(list);
            double rss = ModelFitter.ResidualSumOfSquares(candidate, data);
            if (rss < bestRss) { bestRss = rss; best = candidate; }
        }
        return best;
    }

    /// <summary>True when event <paramref name="j"/> reflects upwards (an open, a rise, a series L or R).</summary>
    private static bool IsUpward(RunModel m, int j) => m.Events[j].Element switch
    {
        RunModelElement.Open or RunModelElement.SeriesInductor or RunModelElement.SeriesResistor => true,
        RunModelElement.Boundary => LocalReflection(m, j) > 0,
        _ => false,
    };

    /// <summary>σ² of one analysed sample for the criterion: the noise, floored at the modelling accuracy (see remarks).</summary>
    internal static double SampleVariance(FitData data, RunModel model) => Math.Max(data.NoiseRmsVolts * data.NoiseRmsVolts,
        Math.Pow(ModellingFloorRelative * model.Context.ReferenceAmplitudeVolts, 2));

    /// <summary>BIC = ν·RSS/σ² + k·ln(ν·N) of a fit to <paramref name="data"/> (see the class remarks).</summary>
    internal static double Criterion(ModelFit fit, FitData data, double variance) =>
        data.IndependentFraction * fit.ResidualSumOfSquares / variance + fit.Model.ParameterCount * LogSampleCount(data);

    /// <summary>ln n of the criterion's penalty, n = ν·N independent samples.</summary>
    internal static double LogSampleCount(FitData data) => Math.Log(Math.Max(2, data.IndependentFraction * data.Samples.Length));

    /// <summary>Index of the first end, or boundary or resistor to |ρ| ≥ the classifier's end threshold, −1 when there is none.</summary>
    private static int TotalReflectionIndex(RunModel m)
    {
        for (int i = 0; i < m.Events.Count; i++)
        {
            var e = m.Events[i];
            if (e.EndsRun || (e.Element is RunModelElement.Boundary or RunModelElement.ShuntResistor or RunModelElement.SeriesResistor
                              && Math.Abs(LocalReflection(m, i)) >= EventClassifier.EndReflection))
                return i;
        }
        return -1;
    }

    /// <summary>ρ = (Z − Z_prev)/(Z + Z_prev) at a boundary (Pozar, <i>Microwave Engineering</i>, 4th ed., eq. 2.35).</summary>
    internal static double LocalReflection(RunModel model, int index)
    {
        var e = model.Events[index];
        double zPrev = RunModelBuilder.ImpedanceBefore(model, index);
        return e.Element switch
        {
            RunModelElement.Boundary => (e.Value - zPrev) / (e.Value + zPrev),
            RunModelElement.Open => 1,
            RunModelElement.Short => -1,
            // Shunt R across Z: load Z‖R, ρ = −Z/(2R + Z). Series R: load Z + R, ρ = R/(R + 2Z) (DESIGN.md §2).
            RunModelElement.ShuntResistor => -zPrev / (2 * e.Value + zPrev),
            RunModelElement.SeriesResistor => e.Value / (e.Value + 2 * zPrev),
            // Two equal lines in parallel: Z/2, ρ = −1/3.
            RunModelElement.Tap => -1.0 / 3,
            _ => double.NaN,
        };
    }

    /// <summary>For each event: the model without it (others fixed), and the BIC it earns.</summary>
    internal static IReadOnlyList<Evidence> EventEvidence(ModelFit fit, FitData data, double variance, double logN, double riseSeconds)
    {
        var m = fit.Model;
        var result = new Evidence[m.Events.Count];
        Parallel.For(0, m.Events.Count, i =>
        {
            using var sideBySide = BinSplitting.SideBySide();
            var without = m.WithEvents(m.Events.Where((_, k) => k != i));
            var f = without.Simulate(data);
            // The signature's peak is looked for near the event only: removing an event also changes every later echo.
            double at = m.TimeOffsetSeconds + m.Events[i].RoundTripSeconds;
            double until = i + 1 < m.Events.Count ? m.TimeOffsetSeconds + m.Events[i + 1].RoundTripSeconds - riseSeconds : double.PositiveInfinity;
            until = Math.Min(until, at + 10 * riseSeconds);
            double rss = 0, peak = 0;
            for (int s = 0; s < f.Length; s++)
            {
                double r = data.Samples[s] - f[s];
                rss += r * r;
                double t = data.TimeAt(s);
                if (t < at - 3 * riseSeconds || t > Math.Max(until, at + riseSeconds)) continue;
                double d = fit.ModelSamples[s] - f[s];
                if (Math.Abs(d) > Math.Abs(peak)) peak = d;
            }
            int k = m.Events[i].HasValue ? 2 : 1;
            result[i] = new Evidence(data.IndependentFraction * (rss - fit.ResidualSumOfSquares) / variance - k * logN, peak);
        });
        return result;
    }

    /// <summary>
    /// χ² of the residual in [t − 2t_r, t + 4t_r] beyond what noise explains (its mean plus three standard deviations
    /// of a χ² with that many degrees of freedom): what a better local model could at most gain.
    /// </summary>
    internal static double LocalExcess(ModelFit fit, FitData data, double variance, double timeSeconds, double riseSeconds)
    {
        var (sumSquares, count) = LocalResidual(fit, data, timeSeconds, riseSeconds);
        return count < 2 ? 0 : ExcessOverNoise(sumSquares, count, data, variance);
    }

    /// <summary>χ² of a residual sum of squares over <paramref name="count"/> of the data's samples beyond what noise
    /// explains: ν·RSS/σ² less its mean ν·n and three standard deviations √(2ν·n) of a χ² with ν·n degrees of freedom.</summary>
    internal static double ExcessOverNoise(double sumSquares, double count, FitData data, double variance)
    {
        double nu = data.IndependentFraction;
        double dof = nu * count;
        return nu * sumSquares / variance - dof - 3 * Math.Sqrt(2 * dof);
    }

    /// <summary>
    /// √(χ²/ν) of the residual in [t − 2t_r, t + 4t_r]: the local misfit over what noise explains, about 1 where the model
    /// is right there and larger where it is not.
    /// </summary>
    internal static double LocalResidualRatio(ModelFit fit, FitData data, double variance, double timeSeconds, double riseSeconds)
    {
        var (sumSquares, count) = LocalResidual(fit, data, timeSeconds, riseSeconds);
        return count < 2 ? 1 : Math.Sqrt(sumSquares / variance / count);
    }

    /// <summary>Σ(y − model)², V², and the number of samples in [t − 2t_r, t + 4t_r].</summary>
    private static (double SumSquares, int Count) LocalResidual(ModelFit fit, FitData data, double timeSeconds, double riseSeconds)
    {
        int from = Math.Max(0, (int)Math.Floor((timeSeconds - 2 * riseSeconds - data.StartTimeSeconds) / data.IntervalSeconds));
        int to = Math.Min(data.Samples.Length - 1, (int)Math.Ceiling((timeSeconds + 4 * riseSeconds - data.StartTimeSeconds) / data.IntervalSeconds));
        double sum = 0;
        for (int s = from; s <= to; s++)
        {
            double r = data.Samples[s] - fit.ModelSamples[s];
            sum += r * r;
        }
        return (sum, Math.Max(0, to - from + 1));
    }

    /// <summary>A boundary as the resistor that reflects alike (the line then continues at Z_prev; see
    /// <see cref="ResistorReading"/>).</summary>
    private static RunModelEvent Resistive(RunModel m, int index) =>
        ResistorReading(m.Events[index], RunModelBuilder.ImpedanceBefore(m, index), m.Events[index].Value);

    /// <summary>Event <paramref name="e"/> as the resistor on a line of <paramref name="lineOhms"/> that a step to
    /// <paramref name="stepOhms"/> looks like: below the line a shunt R = Z_line·Z/(Z_line − Z), above it a series
    /// R = Z − Z_line.</summary>
    private static RunModelEvent ResistorReading(RunModelEvent e, double lineOhms, double stepOhms) => stepOhms < lineOhms
        ? e with { Element = RunModelElement.ShuntResistor, Value = lineOhms * stepOhms / Math.Max(lineOhms - stepOhms, 1e-9) }
        : e with { Element = RunModelElement.SeriesResistor, Value = Math.Max(stepOhms - lineOhms, 1e-6) };

    /// <summary>
    /// <paramref name="events"/> with boundary <paramref name="index"/> of <paramref name="m"/> as its resistor (see
    /// <see cref="Resistive"/>). Behind a resistor the line is Z_prev again rather than the boundary's Z, so every later
    /// impedance-like value is scaled by Z_prev/Z: each later event keeps its reflection coefficient, and the trial starts
    /// from the same later trace instead of from a run whose every later step has changed.
    /// </summary>
    private static List<RunModelEvent> WithResistor(IReadOnlyList<RunModelEvent> events, RunModel m, int index)
    {
        var list = ScaledAfter(events, index, RunModelBuilder.ImpedanceBefore(m, index) / m.Events[index].Value);
        list[index] = Resistive(m, index);
        return list;
    }

    /// <summary><paramref name="events"/> with every event after <paramref name="index"/> scaled to a line of
    /// <paramref name="scale"/> times the impedance: a series or shunt R, a series L and a boundary scale with Z, a shunt
    /// C against it (ρ of each depends on its value over the line's Z alone).</summary>
    private static List<RunModelEvent> ScaledAfter(IReadOnlyList<RunModelEvent> events, int index, double scale) =>
        events.Select((e, k) => k <= index ? e : e.Element switch
        {
            RunModelElement.Boundary or RunModelElement.SeriesResistor or RunModelElement.ShuntResistor or RunModelElement.SeriesInductor
                => e with { Value = e.Value * scale },
            RunModelElement.ShuntCapacitor => e with { Value = e.Value / scale },
            _ => e,
        }).ToList();

    /// <summary>Least relative distance of the line before a boundary from the run's own impedance for the boundary to be
    /// read as a return to it with a resistor (see <see cref="WithCompound"/>).</summary>
    private const double CompoundLineDeviation = 0.05;

    /// <summary>|ρ| of a boundary that barely changes the line (about 2 % in impedance).</summary>
    private const double NegligibleReflection = 0.01;

    /// <summary>
    /// Boundary <paramref name="index"/> of <paramref name="m"/> as a return to the run's own impedance Z₀ with a resistor
    /// at the same place, or null when that reading does not apply: a leak or a bad joint right where a section of other
    /// cable ends (water in the splice that joins them) reflects at first like a single step to Z‖R or Z₀ + R, and only
    /// the levels later in the trace (an end's echo returning through it) tell the two apart. Applies where a section
    /// ends: the event before is a boundary from a line within <see cref="CompoundLineDeviation"/> of Z₀, the line before
    /// this one differs from Z₀ by more than that (otherwise it is <see cref="WithResistor"/>), and the step lands on the
    /// resistor's side of Z₀: below it a shunt R = Z₀·Z/(Z₀ − Z), above it a series R = Z − Z₀. Later events are scaled
    /// to the line of Z₀ (see <see cref="ScaledAfter"/>). Boundaries of |ρ| below <see cref="NegligibleReflection"/>
    /// between the two do not count. Not tried while the loss is estimated with the events.
    /// </summary>
    private static List<RunModelEvent>? WithCompound(IReadOnlyList<RunModelEvent> events, RunModel m, int index)
    {
        // With the loss estimated along, the level an end's echo returns to is the cable's DC resistance as much as a
        // resistor's: the reading is not identifiable, and it lets a resistor soak up the loss (benchmark with only VF
        // and Z₀ told: 158 false events without this gate and the refinement's like it, 148 with them).
        var e = m.Events[index];
        if (m.Context.EstimateLoss || e.Element != RunModelElement.Boundary) return null;
        // The section's start: the boundary before, passing over any that barely change the line (a fit's leftovers).
        int start = index - 1;
        while (start >= 0 && m.Events[start].Element == RunModelElement.Boundary && Math.Abs(LocalReflection(m, start)) < NegligibleReflection) start--;
        if (start < 0 || m.Events[start].Element != RunModelElement.Boundary) return null;
        double z0 = m.Context.ImpedanceOhms, zPrev = RunModelBuilder.ImpedanceBefore(m, index), z = e.Value;
        if (Math.Abs(RunModelBuilder.ImpedanceBefore(m, start) - z0) > CompoundLineDeviation * z0) return null;
        if (Math.Abs(zPrev - z0) < CompoundLineDeviation * z0 || Math.Abs(z - z0) < 0.01 * z0) return null;
        var list = ScaledAfter(events, index, z0 / z);
        list[index] = e with { Value = z0 };
        list.Insert(index + 1, ResistorReading(e, z0, z));
        return list;
    }

    /// <summary>
    /// <paramref name="events"/> without the events at the double bounce between event <paramref name="index"/> and a
    /// later one j (at t_j + (t_j − t_index), within 0.75 of an effective rise), or null when there are none. A boundary
    /// and the resistor that reflects alike from the front reflect with opposite signs from behind, so a fit that took a
    /// resistor for a boundary will have put a stand-in event at that echo; it goes with the resistive hypothesis.
    /// </summary>
    private static List<RunModelEvent>? WithoutEchoes(List<RunModelEvent> events, int index, double effectiveRiseSeconds)
    {
        double ti = events[index].RoundTripSeconds;
        bool IsEcho(int k) => Enumerable.Range(index + 1, Math.Max(0, k - index - 1))
            .Any(j => Math.Abs(events[k].RoundTripSeconds - (2 * events[j].RoundTripSeconds - ti)) < 0.75 * effectiveRiseSeconds);
        var kept = events.Where((_, k) => k <= index || !IsEcho(k)).ToList();
        return kept.Count < events.Count ? kept : null;
    }

    /// <summary>Event <paramref name="index"/> as two of its kind ±<paramref name="halfGapSeconds"/> around it, sharing its size.</summary>
    private static List<RunModelEvent> Split(RunModel m, int index, double halfGapSeconds)
    {
        var e = m.Events[index];
        double t1 = Math.Max(e.RoundTripSeconds - halfGapSeconds, e.RoundTripSeconds / 2), t2 = e.RoundTripSeconds + halfGapSeconds;
        var list = m.Events.ToList();
        list.RemoveAt(index);
        switch (e.Element)
        {
            case RunModelElement.Boundary:
                double zPrev = RunModelBuilder.ImpedanceBefore(m, index);
                list.Add(e with { RoundTripSeconds = t1, Value = Math.Sqrt(zPrev * e.Value) });
                list.Add(e with { RoundTripSeconds = t2 });
                break;
            case RunModelElement.ShuntCapacitor or RunModelElement.SeriesInductor or RunModelElement.SeriesResistor:
                list.Add(e with { RoundTripSeconds = t1, Value = e.Value / 2 });
                list.Add(e with { RoundTripSeconds = t2, Value = e.Value / 2 });
                break;
            case RunModelElement.ShuntResistor:
                list.Add(e with { RoundTripSeconds = t1, Value = e.Value * 2 });
                list.Add(e with { RoundTripSeconds = t2, Value = e.Value * 2 });
                break;
        }
        return list;
    }
}
