using System.Globalization;
using CableFault.Cables;
using CableFault.Simulation;
using CableFault.Traces;

namespace CableFault.Analysis;

/// <summary>
/// The front door of the analysis: characterise → align → profile → detect → fit → classify.
/// </summary>
public static class Locator
{
    /// <summary>Rise times of baseline before the incident edge kept in the fit window (the edge's position, height
    /// and rise are fitted along with the events).</summary>
    internal const double WindowLeadRiseTimes = 6;

    /// <summary>Rise times of record kept after the last candidate: the step settles, and a lumped event's tail and the
    /// level after it (which tells an end from a change of line) are seen.</summary>
    internal const double WindowTailRiseTimes = 24;

    /// <summary>Blind zone in rise times of round trip: one rise time plus the half of the edge before its 50 % point.</summary>
    internal const double BlindZoneRiseTimes = 1.5;

    /// <summary>Incident step over noise below which a trace is hopeless: nothing in it can be read (a reflection is at
    /// most as large as the step).</summary>
    internal const double MinimumIncidentSignalToNoise = 5;

    /// <summary>Finds and classifies every event on the run. Throws <see cref="InputException"/> on hopeless input
    /// (no incident edge, noise as large as the step, invalid options).</summary>
    public static LocateResult Locate(Trace raw, LocateOptions options)
    {
        ArgumentNullException.ThrowIfNull(raw);
        ArgumentNullException.ThrowIfNull(options);
        var problems = options.Problems();
        if (problems.Count > 0) throw new InputException("locate options: " + string.Join("; ", problems) + ".");
        // A batch's traces already keep the cores busy: their runs keep to their own thread.
        using var sideBySide = options.SplitRunsAcrossCores ? default : BinSplitting.SideBySide();
        var characteristics = TraceConditioner.Characterise(raw);
        if (!(characteristics.IncidentAmplitudeVolts > MinimumIncidentSignalToNoise * characteristics.NoiseRmsVolts))
            throw new InputException(string.Create(CultureInfo.InvariantCulture,
                $"trace: the incident step ({characteristics.IncidentAmplitudeVolts:G3} V) is not clearly above the noise ({characteristics.NoiseRmsVolts:G3} V RMS); check the connection and averaging, then measure again."));
        options.Progress?.Report(0.1);
        var aligned = TraceConditioner.Align(raw, characteristics);
        var profile = LayerPeeling.Profile(aligned, characteristics, options.ImpedanceOhms, options.VelocityFactor,
            options.Loss, options.SourceImpedanceOhms);
        options.Progress?.Report(0.2);
        var candidates = EventDetector.Detect(aligned, characteristics, profile);
        options.Progress?.Report(0.3);
        var result = Refine(aligned, characteristics, profile, candidates, options);
        options.Progress?.Report(1.0);
        return result;
    }

    /// <summary>Like <see cref="Locate"/>, but returns false with a one-line message instead of throwing on bad input.</summary>
    public static bool TryLocate(Trace raw, LocateOptions options, out LocateResult? result, out string? error)
    {
        try
        {
            result = Locate(raw, options);
            error = null;
            return true;
        }
        catch (InputException e)
        {
            result = null;
            error = e.Message;
            return false;
        }
    }

    /// <summary>How the warning begins that the fit left part of the trace unexplained (see
    /// <see cref="LocateResult.LeavesTraceUnexplained"/>).</summary>
    internal const string ResidualWarningLead = "the model leaves a residual of";

    /// <summary>Smallest residual RMS, as a share of the incident step, that the unexplained-trace warning is given for:
    /// half the smallest listed step (<see cref="EventClassifier.MinimumListedStepReflection"/>). An unlisted step of
    /// that size halfway along the record would leave 0.35 % (ρ·√½); a misfit below 0.25 % is the scale of a cable's own
    /// impedance variation, or of a section whose dielectric differs from the cable's in loss (a wet stretch), which the
    /// model draws in the cable's own medium. Against the noise alone, a residual of 1 mV on a 1 V step can be five
    /// times a smoothed record's noise while every event is right (the demo's wet section).</summary>
    internal const double ResidualWarningFloorRelative = EventClassifier.MinimumListedStepReflection / 2;

    /// <summary>Share of the record left off its end when the whole record is fitted: the smoothing's σ is a few
    /// hundredths of a per cent of the span, and it holds the last (noisy) sample beyond the end.</summary>
    private const double WholeRecordEndMarginShare = 0.005;

    /// <summary>Half-settling times of the last candidate's echo kept after it on a lossy cable.</summary>
    internal const double LossySettlingTimes = 10;

    /// <summary>
    /// How long the echo of an event at round trip <paramref name="roundTripSeconds"/> takes to settle on a cable with
    /// <paramref name="loss"/>, s: <see cref="LossySettlingTimes"/> times its half-settling time. Skin effect makes the
    /// round trip's step response erfc(a/(2√t)) with a = 2dk/√π (the loss e^(−a√s), k in Np/m/√Hz, d = v·t/2), which
    /// reaches half its step at t₅₀ = (a/0.954)² (erfc(0.477) = 0.5) and creeps on far longer. The level it settles to
    /// (through the run's resistance) is what tells a short from a change of line, so the window must reach past it.
    /// </summary>
    internal static double LossySettlingSeconds(CableLossModel? loss, double velocityMetersPerSecond, double roundTripSeconds)
    {
        if (loss is null || loss.SkinLossNepersPerMeterPerRootHertz <= 0) return 0;
        double a = loss.SkinLossNepersPerMeterPerRootHertz * velocityMetersPerSecond * roundTripSeconds / Math.Sqrt(Math.PI);
        double halfSeconds = a / 0.954 * (a / 0.954);
        return LossySettlingTimes * halfSeconds;
    }

    /// <summary>The fit and classification, from the conditioning's outputs.</summary>
    internal static LocateResult Refine(Trace aligned, TraceCharacteristics characteristics, ImpedanceProfile profile,
        IReadOnlyList<EventCandidate> candidates, LocateOptions options)
    {
        var warnings = characteristics.Warnings.ToList();
        double rise = characteristics.RiseTimeSeconds;
        double v = options.VelocityFactor * PhysicalConstants.SpeedOfLightMetersPerSecond;
        double offset = options.TimeZeroOffsetSeconds ?? 0;
        double blindSeconds = BlindZoneRiseTimes * rise;
        double blindMeters = v * blindSeconds / 2;
        if (candidates.Any(c => c.RoundTripSeconds <= blindSeconds))
            warnings.Add(string.Create(CultureInfo.InvariantCulture,
                $"something changes within the blind zone ({options.WarningDistance(blindMeters)}); add a launch cable longer than that to see it."));

        double z0 = options.ImpedanceOhms, zs = options.SourceImpedanceOhms;
        // The port sees the divider 2A·Z₀/(Z_s + Z₀) on the first plateau (DESIGN.md §2): A is V_s/2.
        double amplitude = characteristics.IncidentAmplitudeVolts * (zs + z0) / (2 * z0);
        bool estimateLoss = options.Loss is null && options.EstimateLoss;
        var context = new RunModelContext(options.VelocityFactor, z0, zs, options.Loss, rise, amplitude);

        if (!options.RefineWithModel)
            return Unrefined(aligned, characteristics, profile, candidates, options, warnings, blindSeconds, blindMeters, v, offset);

        var initial = RunModelBuilder.FromCandidates(context, amplitude, rise, candidates, blindSeconds);
        double tailTau = initial.Events.Select(e => e.Element switch
        {
            RunModelElement.ShuntCapacitor => e.Value * z0 / 2,
            RunModelElement.SeriesInductor => e.Value / (2 * z0),
            _ => 0,
        }).DefaultIfEmpty(0).Max();
        double lastTime = initial.Events.Count > 0 ? initial.Events[^1].RoundTripSeconds : 0;
        double firstTime = initial.Events.Count > 0 ? initial.Events[0].RoundTripSeconds : 0;
        // Keep the first echoes of the last event off the earlier ones (at t_last + (t_last − t_i)): they carry the
        // levels that tell a shunt resistor from an impedance drop and a termination from a change of line.
        // On a lossy cable, also past the slow settling of the last echo (see LossySettlingSeconds).
        double WindowEnd(CableLossModel? loss) => lastTime + Math.Max(Math.Max(WindowTailRiseTimes * rise + 5 * tailTau,
            lastTime - firstTime + 8 * rise), LossySettlingSeconds(loss, v, lastTime));
        double end = WindowEnd(options.Loss);
        var data = FitData.Prepare(aligned, -WindowLeadRiseTimes * rise, end, rise, characteristics.NoiseRmsVolts);
        double riseEffective = data.EffectiveRiseSeconds(rise);
        options.Progress?.Report(0.4);

        CableLossModel? estimatedLoss = null;
        ModelSelection.Result? selectedAhead = null;
        if (estimateLoss)
        {
            // Most runs read as lossless, and then the selection starts from the detector's events as they are: it runs
            // beside the probe, on the cores the probe's fits leave idle, and is kept when the probe finds no loss. Not
            // with a settling probe to follow (the selection's start is not yet known), nor while diagnosing (the stages'
            // times, runs and trace lines are read one stage after another).
            var (lossless, coarse, coarseRise) = (initial, data, riseEffective);
            if (!options.SelectAheadOfLossProbe || options.EstimateSettling || ModelSelection.DebugTrace is not null)
                estimatedLoss = LossEstimation.Estimate(initial, data, options.CancellationToken);
            else
                (estimatedLoss, selectedAhead, _) = Speculation.Run(() => LossEstimation.Estimate(lossless, coarse, options.CancellationToken),
                    token => ModelSelection.Select(lossless, coarse, coarseRise, token), loss => loss is null, options.CancellationToken);
            // A lossy run keeps its loss as two parameters of the model: every full refit in the selection (the first,
            // after a removal, the polish) estimates it again with the events as they then are.
            context = context with { Loss = estimatedLoss, EstimateLoss = estimatedLoss is not null };
            initial = initial.WithContext(context);
            // A loss found here was not known when the window was drawn: reach past the last echo's settling, as for a
            // loss told (the selection has not yet run on these data when a loss is found).
            if (WindowEnd(estimatedLoss) is var settled && settled > end)
            {
                end = settled;
                data = FitData.Prepare(aligned, -WindowLeadRiseTimes * rise, end, rise, characteristics.NoiseRmsVolts);
                riseEffective = data.EffectiveRiseSeconds(rise);
            }
        }
        if (options.EstimateSettling && SettlingEstimation.Estimate(initial, data, options.CancellationToken) is var (fraction, settlingSeconds))
        {
            context = context with { SettlingFraction = fraction, SettlingSeconds = settlingSeconds };
            initial = initial.WithContext(context);
            warnings.Add(string.Create(CultureInfo.InvariantCulture,
                $"the instrument's step settles slowly: {fraction * 100:+0.#;-0.#;0} % of it over a time constant of {settlingSeconds * 1e9:0.#} ns after the edge (fitted from the trace); every echo was read with the same settling."));
        }
        else if (options.EstimateSettling)
            warnings.Add("the instrument's step was read as settling at once: the trace shows no slow settling the fit can tell.");
        ModelSelection.DebugTrace?.Invoke($"stage: selection on {data.Samples.Length} samples");
        var selection = selectedAhead ?? ModelSelection.Select(initial, data, riseEffective, options.CancellationToken);
        if (data.FilterSigmaSeconds > 0)
        {
            // The selection ran on strongly smoothed data: look again, far less smoothed (see ResolutionRefinement).
            var fine = FitData.Prepare(aligned, -WindowLeadRiseTimes * rise, end, rise, characteristics.NoiseRmsVolts,
                ResolutionRefinement.MaximumRiseTimesPerWindow);
            double riseFine = fine.EffectiveRiseSeconds(rise);
            options.Progress?.Report(0.8);
            ModelSelection.DebugTrace?.Invoke($"stage: refinement on {fine.Samples.Length} samples");
            selection = ResolutionRefinement.Refine(selection, fine, riseFine, riseEffective, options.CancellationToken,
                (start, stop) => FitData.Prepare(aligned, start, stop, rise, characteristics.NoiseRmsVolts, double.PositiveInfinity), rise);
            ModelSelection.DebugTrace?.Invoke("stage: refinement done");
            data = fine;
            riseEffective = riseFine;
        }
        if (selection.Fit.Model.Context.Loss is { IsLossless: false } && !selection.Fit.Model.Context.ResistiveEnd)
        {
            // A run terminated in about its own impedance ends where the lossy line's creep turns, with no step there:
            // the whole record is read for it (see MatchedLossyEnd).
            // The smoothing holds the last sample beyond the record's end; stop short of where that would show.
            double wholeEnd = aligned.EndTimeSeconds - WholeRecordEndMarginShare * (aligned.EndTimeSeconds - aligned.StartTimeSeconds);
            var whole = FitData.Prepare(aligned, -WindowLeadRiseTimes * rise, wholeEnd, rise, characteristics.NoiseRmsVolts,
                ResolutionRefinement.MaximumRiseTimesPerWindow);
            double riseWhole = whole.EffectiveRiseSeconds(rise);
            if (MatchedLossyEnd.Search(selection, whole, riseWhole, options.CancellationToken) is { } ended)
                (selection, data, riseEffective) = (ended, whole, riseWhole);
        }
        if (data.FilterSigmaSeconds > 0)
            warnings.Add(string.Create(CultureInfo.InvariantCulture,
                $"long record: the model was fitted with an effective rise of {riseEffective * 1e9:0.###} ns, so events closer than about {options.WarningDistance(v * riseEffective / 2)} may show as one."));
        if (SourceImpedanceCheck.Warning(selection, data, riseEffective, options.CancellationToken) is { } sourceWarning) warnings.Add(sourceWarning);
        var fit = selection.Fit;
        var model = fit.Model;
        var covariance = ModelFitter.Covariance(fit, selection.VarianceVolts2, data.IndependentFraction);
        double incidentLevel = 2 * model.AmplitudeVolts * z0 / (zs + z0);
        double recordEnd = aligned.EndTimeSeconds - model.TimeOffsetSeconds;

        double SigmaLog(int i) => model.Events[i].HasValue
            ? Math.Sqrt(Math.Max(0, covariance[model.TimeParameterIndex(i) + 1, model.TimeParameterIndex(i) + 1])) : 0;
        // A faint or loosely sized event after a resistor or step (what a slightly wrong loss model leaves beyond the
        // end) does not make the run go on: the run still ends in that resistance.
        var weak = Enumerable.Range(0, model.Events.Count).Select(i => EventClassifier.IsWeak(model.Events[i].Element, SigmaLog(i),
            selection.Events[i].PeakSignatureVolts, Math.Sqrt(selection.VarianceVolts2))).ToArray();
        var located = new List<LocatedEvent>();
        var faint = new List<LocatedEvent>();
        for (int i = 0; i < model.Events.Count; i++)
        {
            var e = model.Events[i];
            int tIndex = model.TimeParameterIndex(i);
            double sigmaT = Math.Sqrt(Math.Max(0, covariance[tIndex, tIndex])) * context.ReferenceRiseSeconds;
            if (i == model.Events.Count - 1) sigmaT = Math.Sqrt(sigmaT * sigmaT + Math.Pow(selection.LastEventLossSigmaSeconds, 2));
            double sigmaLog = SigmaLog(i);
            bool lastOnMain = weak.Skip(i + 1).All(w => w);
            double misfit = ModelSelection.LocalResidualRatio(fit, data, selection.VarianceVolts2,
                model.TimeOffsetSeconds + e.RoundTripSeconds, riseEffective);
            var (kind, rho, impedance, value, confidence) = EventClassifier.Classify(new EventClassifier.Input(
                e.Element, e.Value, RunModelBuilder.ImpedanceBefore(model, i), sigmaLog,
                selection.Events[i].PeakSignatureVolts, incidentLevel, Math.Sqrt(selection.VarianceVolts2),
                selection.Events[i].DeltaBic, lastOnMain, recordEnd - e.RoundTripSeconds, riseEffective, misfit));
            double t = e.RoundTripSeconds - offset;
            double d = v * t / 2;
            double sigmaD = Math.Sqrt(Math.Pow(v * sigmaT / 2, 2) + Math.Pow(d * options.VelocityFactorRelativeSigma, 2));
            var locatedEvent = new LocatedEvent(d, sigmaD, kind, rho, impedance, value, confidence, t);
            // (Inside the blind zone the rule below speaks for it.)
            if (kind is not (EventKind.Open or EventKind.Short or EventKind.Termination) && t + offset >= blindSeconds
                && EventClassifier.SeenReflection(e.Element, e.Value, RunModelBuilder.ImpedanceBefore(model, i), rise) is double seen
                && Math.Abs(seen) < EventClassifier.MinimumListedStepReflection)
            {
                faint.Add(locatedEvent);
                continue;
            }
            located.Add(locatedEvent);
            if (e.Element == RunModelElement.ShuntResistor && kind == EventKind.Tap)
                warnings.Add(string.Create(CultureInfo.InvariantCulture,
                    $"tap at {options.WarningDistance(d)}: it reflects like {e.Value:0.#} Ω across the line, i.e. a branch into a matched load; if no tap is fitted there, it is a leak of that resistance."));
            if (e.Element == RunModelElement.Tap)
            {
                // The branch's open end is an event of its own, on the branch: d_tap + v·τ_branch/2 from the connector.
                double tEnd = t + e.Value;
                double r = e.Value / context.ReferenceRiseSeconds;
                double varianceEnd = covariance[tIndex, tIndex] + r * r * covariance[tIndex + 1, tIndex + 1] + 2 * r * covariance[tIndex, tIndex + 1];
                double sigmaTEnd = Math.Sqrt(Math.Max(0, varianceEnd)) * context.ReferenceRiseSeconds;
                double dEnd = v * tEnd / 2;
                double sigmaDEnd = Math.Sqrt(Math.Pow(v * sigmaTEnd / 2, 2) + Math.Pow(dEnd * options.VelocityFactorRelativeSigma, 2));
                if (e.RoundTripSeconds + e.Value <= recordEnd)
                    located.Add(new LocatedEvent(dEnd, sigmaDEnd, EventKind.Open, 1.0, null, null, confidence, tEnd));
                warnings.Add(string.Create(CultureInfo.InvariantCulture,
                    $"tap at {options.WarningDistance(d)}: the open end at {options.WarningDistance(dEnd)} is the end of its branch ({options.WarningDistance(v * e.Value / 2)} long, assumed of the same cable), not of the main line."));
            }
        }

        // What the fit puts inside the blind zone is the connector and the cable's impedance against the instrument's,
        // not something a technician can dig for: it is said, not listed.
        // (The blind zone is at the instrument's port, whatever reference plane an offset or a launch lead sets.)
        foreach (var inside in located.Where(e => e.RoundTripSeconds + offset < blindSeconds && e.Kind is not (EventKind.Open or EventKind.Short)).ToList())
        {
            located.Remove(inside);
            warnings.Add(string.Create(CultureInfo.InvariantCulture,
                $"{EventKindNames.ToJsonName(inside.Kind).Replace('_', ' ')} (ρ {inside.Reflection:+0.###;-0.###;0}) at the instrument's connector, inside the blind zone ({options.WarningDistance(blindMeters)}): the cable or connector against the instrument, not located.{SourceImpedanceCheck.ConnectorStepHint(inside, options.SourceImpedanceOhms)}"));
        }

        // An impedance change or spot this small is within the cable's own variation along its length, and a step
        // generator that settles slowly after its edge looks the same (a row of them near the connector): said, not listed.
        if (faint.Count > 0)
        {
            faint.Sort((a, b) => a.DistanceMeters.CompareTo(b.DistanceMeters));
            string where = faint.Count <= 3
                ? "at " + string.Join(", ", faint.Select(e => options.WarningDistance(e.DistanceMeters, "0.##")))
                : $"between {options.WarningDistance(faint[0].DistanceMeters, "0.##")} and {options.WarningDistance(faint[^1].DistanceMeters, "0.##")}";
            warnings.Add(string.Create(CultureInfo.InvariantCulture,
                $"{faint.Count} impedance change(s) or spot(s) under {EventClassifier.MinimumListedStepReflection * 100:0.#} % (|ρ| < {EventClassifier.MinimumListedStepReflection}) {where} not listed: within a cable's own impedance variation, or the instrument's step settling slowly."));
        }

        if (estimateLoss)
            warnings.Add(estimatedLoss is not null && model.Context.Loss is { } estimated
                ? string.Create(CultureInfo.InvariantCulture,
                    $"no cable loss was given: estimated from the trace as {estimated.AttenuationDbPer100m(100e6):0.#} dB/100 m at 100 MHz and {estimated.DcResistanceOhmsPerMeter:0.###} Ω/m DC loop resistance; give the cable type for its data-sheet loss.")
                : "no cable loss was given, and the trace shows none the fit can tell: the cable was read as lossless; give the cable type for its data-sheet loss.");
        double rms = Math.Sqrt(fit.ResidualSumOfSquares / data.Samples.Length);
        if (rms > 3 * Math.Sqrt(selection.VarianceVolts2) && rms > ResidualWarningFloorRelative * incidentLevel)
            warnings.Add(string.Create(CultureInfo.InvariantCulture,
                $"{ResidualWarningLead} {rms:G3} V RMS, {rms / Math.Sqrt(selection.VarianceVolts2):0.#} times the noise and {rms / incidentLevel * 100:0.##} % of the step: part of the trace is not explained; check the cable settings (Z0, VF, loss)."));
        if (!fit.Converged) warnings.Add("the model fit stopped at its iteration limit; positions are from the last iterate.");
        string message = string.Create(CultureInfo.InvariantCulture,
            $"{model.Events.Count} event(s); Levenberg–Marquardt on {data.Samples.Length} samples from {data.StartTimeSeconds * 1e9:0.##} to {data.TimeAt(data.Samples.Length - 1) * 1e9:0.##} ns{(data.FilterSigmaSeconds > 0 ? $" (smoothed to {riseEffective * 1e9:0.###} ns rise)" : "")}; {selection.Trials} alternative model(s) tried; BIC with noise {Math.Sqrt(selection.VarianceVolts2):G3} V.");
        var report = new FitReport(fit.Converged, fit.Iterations, rms, model.ParameterCount, "BIC", message);
        if (located.Count == 0 && SlowChange.Warning(aligned, characteristics, blindSeconds) is { } slow) warnings.Add(slow);
        var modelTrace = new Trace(data.StartTimeSeconds, data.IntervalSeconds, fit.ModelSamples);
        return new LocateResult(aligned, characteristics, profile, located.OrderBy(e => e.DistanceMeters).ToList(), report,
            blindMeters, options, warnings, modelTrace);
    }

    /// <summary>The candidates as detected, without the model: positions from the detector, sizes from the profile.</summary>
    private static LocateResult Unrefined(Trace aligned, TraceCharacteristics characteristics, ImpedanceProfile profile,
        IReadOnlyList<EventCandidate> candidates, LocateOptions options, List<string> warnings, double blindSeconds,
        double blindMeters, double v, double offset)
    {
        var located = new List<LocatedEvent>();
        foreach (var c in candidates.Where(c => c.RoundTripSeconds > blindSeconds))
        {
            double t = c.RoundTripSeconds - offset;
            double d = v * t / 2;
            // Without a model the time is known to about a sample; the VF uncertainty adds in quadrature.
            double sigmaT = aligned.SampleIntervalSeconds;
            double sigmaD = Math.Sqrt(Math.Pow(v * sigmaT / 2, 2) + Math.Pow(d * options.VelocityFactorRelativeSigma, 2));
            double confidence = 1 - Math.Exp(-c.SignalToNoise / EventClassifier.ConfidenceSignalToNoiseScale);
            located.Add(new LocatedEvent(d, sigmaD, EventKind.Unknown, c.ReflectionStep, c.ImpedanceAfterOhms, null, confidence, t));
        }
        var report = new FitReport(false, 0, double.NaN, 0, "none", "model refinement switched off; events as detected, kinds not named.");
        return new LocateResult(aligned, characteristics, profile, located, report, blindMeters, options, warnings, null);
    }
}
