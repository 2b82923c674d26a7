using System.Globalization;
using CableFault.Analysis;
using CableFault.Traces;

namespace CableFault.Comparison;

/// <summary>
/// The repair check: is the current trace of a run back to its baseline (as installed, or before the damage), and if
/// not, what is different and where? With <see cref="ReferenceKind.Pair"/> the same check compares a suspect pair
/// against a healthy pair of the same cable, with pair-to-pair tolerances, a fitted length stretch and an impedance
/// offset estimate (<see cref="PairSpread"/>). Pure: values in, a result record out.
/// </summary>
public static class RepairCheck
{
    /// <summary>Two VFs (or Z₀s) closer than this fraction are taken as the same setting (metadata carries a few digits).</summary>
    public const double SameSettingFraction = 1e-3;

    /// <summary>Compares <paramref name="current"/> against <paramref name="baseline"/>. Throws
    /// <see cref="InputException"/> on bad options, unusable traces, or traces read with different cable settings that
    /// the options do not settle.</summary>
    public static CompareResult Compare(Trace baseline, Trace current, RepairCheckOptions options)
    {
        ArgumentNullException.ThrowIfNull(baseline);
        ArgumentNullException.ThrowIfNull(current);
        ArgumentNullException.ThrowIfNull(options);
        var problems = options.Problems();
        if (problems.Count > 0) throw new InputException("compare options: " + string.Join("; ", problems) + ".");

        var tol = options.EffectiveTolerances;
        var kind = options.ReferenceKind;
        string noun = ReferenceKindNames.Noun(kind);
        var settings = ResolveSettings(baseline, current, options, out var settingWarnings);
        var pair = TracePairPreparation.Prepare(baseline, current, options.MatchRise);
        var warnings = new List<string>(settingWarnings);
        warnings.AddRange(pair.Warnings);
        options.CancellationToken.ThrowIfCancellationRequested();

        var locateOptions = settings.ToLocateOptions() with { CancellationToken = options.CancellationToken, WarningsInFeet = options.WarningsInFeet };
        var locB = Locator.Locate(pair.Baseline, locateOptions);
        var locC = Locator.Locate(pair.Current, locateOptions);
        Trace referenceTrace = pair.Baseline, currentTrace = pair.Current;
        var spread = PairSpread.None(settings.ImpedanceOhms);
        if (kind == ReferenceKind.Pair || tol.ImpedanceFraction is not null)
            spread = spread with
            {
                CurrentImpedanceOhms = PairImpedance.Estimate(pair.CurrentAmplitudeVolts / pair.BaselineAmplitudeVolts,
                    settings.ImpedanceOhms, settings.SourceImpedanceOhms),
            };
        if (tol.LengthFraction > 0)
        {
            double blind0 = Math.Max(locB.BlindZoneMeters, locC.BlindZoneMeters);
            double v0 = settings.VelocityFactor * PhysicalConstants.SpeedOfLightMetersPerSecond;
            double? anchor = LengthStretch.AnchorSeconds(OnTheRun(locB, blind0, out _), pair.Baseline, v0);
            double? scale = anchor is double a ? LengthStretch.Refine(pair.Baseline, pair.Current, a, tol.LengthFraction) : null;
            if (anchor is double anchorSeconds && scale is double f)
            {
                options.CancellationToken.ThrowIfCancellationRequested();
                double anchorMeters = v0 * anchorSeconds / 2;
                (referenceTrace, currentTrace) = LengthStretch.Apply(pair.Baseline, pair.Current, f);
                locC = Locator.Locate(currentTrace, locateOptions);
                spread = spread with { LengthScale = f, LengthFitted = true, LengthFitDistanceMeters = anchorMeters };
                warnings.Add(Invariant(
                    $"the current trace's time axis was scaled by 1/{f:0.0000} to line it up with the {noun} around {locateOptions.WarningDistance(anchorMeters, "0.00")} (electrical length {S((f - 1) * 100, 2)} %); a fault within ±{tol.LengthFraction * 100:0.#} % of that point would look the same"));
            }
            else
            {
                warnings.Add(Invariant(
                    $"the current trace does not match the {noun} around its far end within ±{tol.LengthFraction * 100:0.#} % of length: the traces are compared without stretching"));
            }
        }
        foreach (string w in locB.Warnings.Except(locB.Characteristics.Warnings)) warnings.Add($"{noun}: {w}");
        foreach (string w in locC.Warnings.Except(locC.Characteristics.Warnings)) warnings.Add($"current: {w}");
        double blind = Math.Max(locB.BlindZoneMeters, locC.BlindZoneMeters);

        double v = settings.VelocityFactor * PhysicalConstants.SpeedOfLightMetersPerSecond;
        var distances = referenceTrace.TimesSeconds().Select(t => v * t / 2).ToArray();
        var difference = new double[distances.Length];
        for (int i = 0; i < difference.Length; i++) difference[i] = currentTrace.SamplesVolts[i] - referenceTrace.SamplesVolts[i];
        double band = Math.Max(tol.MinimumBand,
            options.NoiseBandSigmas * Math.Sqrt(pair.BaselineNoiseRelative * pair.BaselineNoiseRelative + pair.CurrentNoiseRelative * pair.CurrentNoiseRelative));
        // One rise time of round trip, as a distance: the reach of an event's own edge.
        double slack = v * Math.Max(pair.BaselineRiseSeconds, pair.CurrentRiseSeconds) / 2;
        // Against a reference pair an event's edge is judged over the distance tolerance around it: the far pair's loss
        // spreads an edge over tens of centimetres, so the difference it leaves peaks after the located onset.
        double PeakNear(double meters) => PeakDifference(distances, difference, meters,
            kind == ReferenceKind.Pair ? Math.Max(2 * slack, tol.DistanceAt(meters)) : 2 * slack);

        // A stretch cuts the reference's record where the current one ends: events past the cut have no partner.
        var eventsB = OnTheRun(locB, blind, out double endB);
        if (spread.LengthFitted) eventsB = eventsB.Where(e => e.DistanceMeters <= distances[^1] - slack).ToList();
        var eventsC = OnTheRun(locC, blind, out double endC);
        int beyond = locB.Events.Count + locC.Events.Count - eventsB.Count - eventsC.Count;
        if (beyond > 0)
            warnings.Add(Invariant($"{beyond} event(s) found beyond the end of the run ({locateOptions.WarningDistance(endB, "0.00")} baseline, {locateOptions.WarningDistance(endC, "0.00")} current) or in the blind zone were left out: past an open or short end they can only be re-reflections"));
        var changes = CompareEvents(eventsB, eventsC, tol, PeakNear, requireTraceEvidence: kind == ReferenceKind.Pair);

        // A change alters everything after it (transmitted level, later echoes): a region is explained by any change
        // that lies before its end, with one rise time of slack for the change's own edge. Against a reference pair only
        // a failing change where the region starts (within the distance tolerance) explains it: the locator reads two
        // different pairs, and a misread far end must not stand in for a fault half-way along.
        static double Nearest(EventChange c) => Math.Min(c.Baseline?.DistanceMeters ?? double.MaxValue, c.Current?.DistanceMeters ?? double.MaxValue);
        var failing = changes.Where(c => c.ExceedsTolerance).Select(Nearest).ToList();
        double firstChange = changes.Where(c => c.Kind != EventChangeKind.Unchanged).Select(Nearest).DefaultIfEmpty(double.PositiveInfinity).Min();
        Func<double, double, bool> explains = kind == ReferenceKind.Pair
            ? (start, end) => failing.Any(d => Math.Abs(d - start) <= tol.DistanceAt(start) + slack)
            : (start, end) => firstChange <= end + slack;
        var regions = FindRegions(distances, difference, band, slack, explains);
        var reasons = new List<string>();
        foreach (var change in changes.Where(c => c.ExceedsTolerance)) reasons.Add(change.Description);
        if (tol.ImpedanceFraction is double zFraction && spread.ImpedanceOffsetFraction is double zOff && Math.Abs(zOff) > zFraction)
            reasons.Add(Invariant(
                $"the current run's impedance reads {spread.CurrentImpedanceOhms:0.#} Ω against the {noun}'s {spread.ReferenceImpedanceOhms:0.#} Ω ({S(zOff * 100, 1)} %), beyond ±{zFraction * 100:0.#} %: wet or damaged along its length, or not the same cable"));
        var unexplained = regions.Where(r => !r.Explained && r.StartMeters > blind && Math.Abs(r.PeakDifference) > tol.Reflection).ToList();
        foreach (var region in unexplained)
            reasons.Add(kind == ReferenceKind.Pair
                ? Invariant($"the current pair departs from the reference pair at {region.StartMeters:0.00} m: the traces differ by up to {S(region.PeakDifference, 3)} (of the incident step), most at {region.PeakDistanceMeters:0.00} m ({region.StartMeters:0.00}–{region.EndMeters:0.00} m), with no located event to name it")
                : Invariant($"the traces differ by {S(region.PeakDifference, 3)} (of the incident step) at {region.PeakDistanceMeters:0.00} m ({region.StartMeters:0.00}–{region.EndMeters:0.00} m) with no event change to explain it"));
        double? firstDifference = failing.Concat(unexplained.Select(r => r.StartMeters)).Where(d => d < double.MaxValue)
            .Select(d => (double?)d).Min();
        bool pass = reasons.Count == 0;
        if (pass)
        {
            int same = changes.Count(c => c.Kind == EventChangeKind.Unchanged);
            string distanceText = tol.DistanceFraction > 0
                ? Invariant($"max({tol.DistanceMeters:0.###} m, {tol.DistanceFraction * 100:0.##} % of the distance)")
                : Invariant($"{tol.DistanceMeters:0.###} m");
            reasons.Add(string.Create(CultureInfo.InvariantCulture,
                $"{same} event(s) unchanged within ±{distanceText} and ±{tol.Reflection:0.###} reflection; no new or gone event above {tol.Reflection:0.###}; no difference above the tolerance outside the blind zone ({blind:0.###} m)"));
            if (kind == ReferenceKind.Pair)
                reasons.Add(Invariant(
                    $"pair spread: electrical length {(spread.LengthDifferenceFraction is double l ? S(l * 100, 2) + " %" : "not fitted")}, impedance {(spread.ImpedanceOffsetOhms is double dz ? S(dz, 1) + " Ω" : "not estimated")} against the reference pair (accepted up to ±{tol.LengthFraction * 100:0.#} % and ±{(tol.ImpedanceFraction ?? 0) * 100:0.#} %)"));
        }

        return new CompareResult
        {
            Pass = pass, Reasons = reasons, Tolerances = tol, Settings = settings,
            Baseline = referenceTrace, Current = currentTrace, DistancesMeters = distances, Difference = difference,
            NoiseBand = band, Regions = regions, Events = changes, BaselineLocate = locB, CurrentLocate = locC,
            BaselineRiseTimeSeconds = pair.BaselineRiseSeconds, CurrentRiseTimeSeconds = pair.CurrentRiseSeconds,
            RiseMatched = pair.RiseMatched, BlindZoneMeters = blind, Warnings = warnings,
            ReferenceKind = kind, Spread = spread, FirstDifferenceMeters = firstDifference,
        };
    }

    /// <summary>Resolves the cable settings of both traces and refuses when they disagree and no option settles it (for a
    /// reference pair the reference's settings are used, with a warning).</summary>
    private static CableSettings ResolveSettings(Trace baseline, Trace current, RepairCheckOptions options, out IReadOnlyList<string> warnings)
    {
        var sb = CableSettings.Resolve(baseline, options.VelocityFactor, options.ImpedanceOhms, options.CableDesignation,
            options.SourceImpedanceOhms, options.Library);
        var sc = CableSettings.Resolve(current, options.VelocityFactor, options.ImpedanceOhms, options.CableDesignation,
            options.SourceImpedanceOhms, options.Library);
        string nb = TracePairPreparation.Name(baseline, ReferenceKindNames.Noun(options.ReferenceKind)), nc = TracePairPreparation.Name(current, "current");
        if (options.ReferenceKind == ReferenceKind.Pair && (Differ(sb.VelocityFactor, sc.VelocityFactor) || Differ(sb.ImpedanceOhms, sc.ImpedanceOhms)))
        {
            // Pairs of one cable differ by design; the reference pair's settings read both, and the stretch and the
            // impedance estimate measure the difference instead of assuming it.
            warnings = sb.Warnings.Union(sc.Warnings).Append(string.Create(CultureInfo.InvariantCulture,
                $"{nc} carries VF {sc.VelocityFactor:0.###} and Z0 {sc.ImpedanceOhms:0.##} Ω, {nb} VF {sb.VelocityFactor:0.###} and Z0 {sb.ImpedanceOhms:0.##} Ω; both are read with the reference pair's")).ToList();
            return sb;
        }
        if (Differ(sb.VelocityFactor, sc.VelocityFactor))
            throw new InputException(string.Create(CultureInfo.InvariantCulture,
                $"{nb} is read with VF {sb.VelocityFactor:0.###} ({sb.VelocityFactorSource}) but {nc} with VF {sc.VelocityFactor:0.###} ({sc.VelocityFactorSource}); distances would not line up — give --vf to use one VF for both"));
        if (Differ(sb.ImpedanceOhms, sc.ImpedanceOhms))
            throw new InputException(string.Create(CultureInfo.InvariantCulture,
                $"{nb} is read with Z0 {sb.ImpedanceOhms:0.##} Ω ({sb.ImpedanceSource}) but {nc} with Z0 {sc.ImpedanceOhms:0.##} Ω ({sc.ImpedanceSource}); give --z0 to use one impedance for both"));
        warnings = sb.Warnings.Union(sc.Warnings).ToList();
        return sb;
    }

    private static bool Differ(double a, double b) => Math.Abs(a - b) > SameSettingFraction * Math.Max(Math.Abs(a), Math.Abs(b));

    /// <summary>The events on the run itself: outside the blind zone and not past the first open or short end (after an
    /// end with |ρ| ≥ <see cref="EndReflection"/> nothing is transmitted further, so later "events" are re-reflections).</summary>
    private static List<LocatedEvent> OnTheRun(LocateResult located, double blindMeters, out double endMeters)
    {
        var kept = new List<LocatedEvent>();
        endMeters = double.PositiveInfinity;
        foreach (var e in located.Events.OrderBy(e => e.DistanceMeters))
        {
            if (e.DistanceMeters <= blindMeters) continue;
            kept.Add(e);
            if (e.Kind is EventKind.Open or EventKind.Short && Math.Abs(e.Reflection) >= EndReflection) { endMeters = e.DistanceMeters; break; }
        }
        return kept;
    }

    /// <summary>|ρ| from which an open or short is taken as the end of the run: 0.8 leaves room for the loss of a long
    /// run (a far open on lossy coax can read 0.85–0.95) while no splice or tap comes near it.</summary>
    public const double EndReflection = 0.8;

    private static double PeakDifference(double[] distances, double[] difference, double meters, double halfWidthMeters)
    {
        double peak = 0;
        for (int i = 0; i < distances.Length; i++)
            if (Math.Abs(distances[i] - meters) <= halfWidthMeters && Math.Abs(difference[i]) > Math.Abs(peak)) peak = difference[i];
        return peak;
    }

    private static List<EventChange> CompareEvents(IReadOnlyList<LocatedEvent> baseline, IReadOnlyList<LocatedEvent> current,
        CompareTolerances tol, Func<double, double> peakNear, bool requireTraceEvidence)
    {
        var changes = new List<EventChange>();
        foreach (var (ib, ic) in EventMatcher.Match(baseline, current, tol.MatchWindowAt))
        {
            var b = ib >= 0 ? baseline[ib] : null;
            var c = ic >= 0 ? current[ic] : null;
            // A new or gone event is judged by what the traces show at its place (the difference at the captured rise
            // time), not by the fitted reflection: the fit may read it at a smoothed rise, or invent it in one trace.
            if (b is null)
            {
                double peak = peakNear(c!.DistanceMeters);
                bool big = Math.Abs(peak) > tol.Reflection;
                changes.Add(new EventChange(EventChangeKind.New, null, c, big, Invariant(
                    $"new {Name(c.Kind)} at {c.DistanceMeters:0.00} m: the trace differs by {S(peak, 3)} there{(big ? "" : " (within the tolerance)")}"), peak));
            }
            else if (c is null)
            {
                double peak = peakNear(b.DistanceMeters);
                bool big = Math.Abs(peak) > tol.Reflection;
                changes.Add(new EventChange(EventChangeKind.Gone, b, null, big, Invariant(
                    $"{Name(b.Kind)} at {b.DistanceMeters:0.00} m is gone: the trace differs by {S(peak, 3)} there{(big ? "" : " (within the tolerance)")}"), peak));
            }
            else
            {
                double shift = c.DistanceMeters - b.DistanceMeters, dRho = c.Reflection - b.Reflection;
                // Against a reference pair the locator reads two different pairs, and may split a far end dispersed by
                // loss differently on each (a ghost step before it, the end a metre later): a matched event only fails
                // when the traces themselves differ there by more than the reflection tolerance.
                bool evidence = !requireTraceEvidence
                    || Math.Max(Math.Abs(peakNear(b.DistanceMeters)), Math.Abs(peakNear(c.DistanceMeters))) > tol.Reflection;
                bool readMoved = Math.Abs(shift) > tol.DistanceAt(b.DistanceMeters);
                bool valueChanged = b.Value is double vb && c.Value is double vc && Math.Max(Math.Abs(b.Reflection), Math.Abs(c.Reflection)) > tol.Reflection
                    && Math.Abs(vc - vb) > tol.ValueFraction * Math.Max(Math.Abs(vb), Math.Abs(vc));
                bool readChanged = Math.Abs(dRho) > tol.Reflection || valueChanged;
                bool moved = readMoved && evidence, changed = readChanged && evidence;
                var kind = moved ? EventChangeKind.Moved : changed ? EventChangeKind.Changed : EventChangeKind.Unchanged;
                string kindNote = b.Kind == c.Kind ? Name(c.Kind) : $"{Name(c.Kind)} (was read as {Name(b.Kind)})";
                string text = kind switch
                {
                    EventChangeKind.Moved => Invariant($"{kindNote} moved by {S(shift, 2)} m, from {b.DistanceMeters:0.00} m to {c.DistanceMeters:0.00} m{(changed ? Invariant($", reflection {S(b.Reflection, 3)} → {S(c.Reflection, 3)}") : "")}"),
                    EventChangeKind.Changed => Invariant($"{kindNote} at {c.DistanceMeters:0.00} m changed: reflection {S(b.Reflection, 3)} → {S(c.Reflection, 3)}{(valueChanged ? Invariant($", value {b.Value:G3} → {c.Value:G3}") : "")}"),
                    _ => Invariant($"{kindNote} at {c.DistanceMeters:0.00} m unchanged (shift {S(shift, 3)} m, reflection change {S(dRho, 3)}{(readMoved || readChanged ? "; the fits differ but the traces agree there within the tolerance" : "")})"),
                };
                changes.Add(new EventChange(kind, b, c, moved || changed, text, peakNear(c.DistanceMeters)));
            }
        }
        return changes;
    }

    private static List<DifferenceRegion> FindRegions(double[] distances, double[] difference, double band, double slackMeters,
        Func<double, double, bool> explains)
    {
        var regions = new List<DifferenceRegion>();
        int n = difference.Length;
        // Runs outside the band; runs closer than the slack are one region (a bipolar difference crosses zero).
        var runs = new List<(int Start, int End)>();
        for (int i = 0; i < n; i++)
        {
            if (Math.Abs(difference[i]) <= band) continue;
            int j = i;
            while (j + 1 < n && Math.Abs(difference[j + 1]) > band) j++;
            if (runs.Count > 0 && distances[i] - distances[runs[^1].End] < slackMeters) runs[^1] = (runs[^1].Start, j);
            else runs.Add((i, j));
            i = j;
        }
        foreach (var (s, e) in runs)
        {
            int peak = s;
            for (int k = s; k <= e; k++) if (Math.Abs(difference[k]) > Math.Abs(difference[peak])) peak = k;
            bool explained = explains(distances[s], distances[e]);
            regions.Add(new DifferenceRegion(distances[s], distances[e], distances[peak], difference[peak], explained));
        }
        return regions;
    }

    private static string Name(EventKind kind) => EventKindNames.ToJsonName(kind).Replace('_', ' ');

    /// <summary>Signed, rounded first so that a tiny negative number does not print as "-0.000".</summary>
    private static string S(double value, int decimals)
    {
        double r = Math.Round(value, decimals);
        return (r > 0 ? "+" : "") + r.ToString("F" + decimals, CultureInfo.InvariantCulture);
    }

    private static string Invariant(FormattableString text) => text.ToString(CultureInfo.InvariantCulture);
}
