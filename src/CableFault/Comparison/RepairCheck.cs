using System.Globalization;
using CableFault.Analysis;
using CableFault.Traces;

namespace CableFault.Comparison;

/// <summary>
/// The repair check: is the current trace of a run back to its baseline (as installed, or before the damage), and if
/// not, what is different and where? Pure: values in, a result record out.
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

        var settings = ResolveSettings(baseline, current, options, out var settingWarnings);
        var pair = TracePairPreparation.Prepare(baseline, current, options.MatchRise);
        var warnings = new List<string>(settingWarnings);
        warnings.AddRange(pair.Warnings);
        options.CancellationToken.ThrowIfCancellationRequested();

        var locateOptions = settings.ToLocateOptions() with { CancellationToken = options.CancellationToken };
        var locB = Locator.Locate(pair.Baseline, locateOptions);
        var locC = Locator.Locate(pair.Current, locateOptions);
        foreach (string w in locB.Warnings.Except(locB.Characteristics.Warnings)) warnings.Add($"baseline: {w}");
        foreach (string w in locC.Warnings.Except(locC.Characteristics.Warnings)) warnings.Add($"current: {w}");
        double blind = Math.Max(locB.BlindZoneMeters, locC.BlindZoneMeters);

        var tol = options.Tolerances;
        double v = settings.VelocityFactor * PhysicalConstants.SpeedOfLightMetersPerSecond;
        var distances = pair.Baseline.TimesSeconds().Select(t => v * t / 2).ToArray();
        var difference = new double[distances.Length];
        for (int i = 0; i < difference.Length; i++) difference[i] = pair.Current.SamplesVolts[i] - pair.Baseline.SamplesVolts[i];
        double band = Math.Max(RepairCheckOptions.MinimumBandRelative,
            options.NoiseBandSigmas * Math.Sqrt(pair.BaselineNoiseRelative * pair.BaselineNoiseRelative + pair.CurrentNoiseRelative * pair.CurrentNoiseRelative));
        // One rise time of round trip, as a distance: the reach of an event's own edge.
        double slack = v * Math.Max(pair.BaselineRiseSeconds, pair.CurrentRiseSeconds) / 2;
        double PeakNear(double meters) => PeakDifference(distances, difference, meters, 2 * slack);

        var eventsB = OnTheRun(locB, blind, out double endB);
        var eventsC = OnTheRun(locC, blind, out double endC);
        int beyond = locB.Events.Count + locC.Events.Count - eventsB.Count - eventsC.Count;
        if (beyond > 0)
            warnings.Add(Invariant($"{beyond} event(s) found beyond the end of the run ({endB:0.00} m baseline, {endC:0.00} m current) or in the blind zone were left out: past an open or short end they can only be re-reflections"));
        var changes = CompareEvents(eventsB, eventsC, tol, PeakNear);

        // A change alters everything after it (transmitted level, later echoes): a region is explained by any change
        // that lies before its end, with one rise time of slack for the change's own edge.
        double firstChange = changes.Where(c => c.Kind != EventChangeKind.Unchanged).Select(c => Math.Min(c.Baseline?.DistanceMeters ?? double.MaxValue, c.Current?.DistanceMeters ?? double.MaxValue))
            .DefaultIfEmpty(double.PositiveInfinity).Min();
        var regions = FindRegions(distances, difference, band, slack, firstChange);

        var reasons = new List<string>();
        foreach (var change in changes.Where(c => c.ExceedsTolerance)) reasons.Add(change.Description);
        foreach (var region in regions.Where(r => !r.Explained && r.StartMeters > blind && Math.Abs(r.PeakDifference) > tol.Reflection))
            reasons.Add(string.Create(CultureInfo.InvariantCulture,
                $"the traces differ by {S(region.PeakDifference, 3)} (of the incident step) at {region.PeakDistanceMeters:0.00} m ({region.StartMeters:0.00}–{region.EndMeters:0.00} m) with no event change to explain it"));
        bool pass = reasons.Count == 0;
        if (pass)
        {
            int same = changes.Count(c => c.Kind == EventChangeKind.Unchanged);
            reasons.Add(string.Create(CultureInfo.InvariantCulture,
                $"{same} event(s) unchanged within ±{tol.DistanceMeters:0.###} m and ±{tol.Reflection:0.###} reflection; no new or gone event above {tol.Reflection:0.###}; no difference above the tolerance outside the blind zone ({blind:0.###} m)"));
        }

        return new CompareResult
        {
            Pass = pass, Reasons = reasons, Tolerances = tol, Settings = settings,
            Baseline = pair.Baseline, Current = pair.Current, DistancesMeters = distances, Difference = difference,
            NoiseBand = band, Regions = regions, Events = changes, BaselineLocate = locB, CurrentLocate = locC,
            BaselineRiseTimeSeconds = pair.BaselineRiseSeconds, CurrentRiseTimeSeconds = pair.CurrentRiseSeconds,
            RiseMatched = pair.RiseMatched, BlindZoneMeters = blind, Warnings = warnings,
        };
    }

    /// <summary>Resolves the cable settings of both traces and refuses when they disagree and no option settles it.</summary>
    private static CableSettings ResolveSettings(Trace baseline, Trace current, RepairCheckOptions options, out IReadOnlyList<string> warnings)
    {
        var sb = CableSettings.Resolve(baseline, options.VelocityFactor, options.ImpedanceOhms, options.CableDesignation,
            options.SourceImpedanceOhms, options.Library);
        var sc = CableSettings.Resolve(current, options.VelocityFactor, options.ImpedanceOhms, options.CableDesignation,
            options.SourceImpedanceOhms, options.Library);
        string nb = TracePairPreparation.Name(baseline, "baseline"), nc = TracePairPreparation.Name(current, "current");
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
        CompareTolerances tol, Func<double, double> peakNear)
    {
        var changes = new List<EventChange>();
        foreach (var (ib, ic) in EventMatcher.Match(baseline, current, tol.MatchWindowMeters))
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
                bool moved = Math.Abs(shift) > tol.DistanceMeters;
                bool valueChanged = b.Value is double vb && c.Value is double vc && Math.Max(Math.Abs(b.Reflection), Math.Abs(c.Reflection)) > tol.Reflection
                    && Math.Abs(vc - vb) > tol.ValueFraction * Math.Max(Math.Abs(vb), Math.Abs(vc));
                bool changed = Math.Abs(dRho) > tol.Reflection || valueChanged;
                var kind = moved ? EventChangeKind.Moved : changed ? EventChangeKind.Changed : EventChangeKind.Unchanged;
                string kindNote = b.Kind == c.Kind ? Name(c.Kind) : $"{Name(c.Kind)} (was read as {Name(b.Kind)})";
                string text = kind switch
                {
                    EventChangeKind.Moved => Invariant($"{kindNote} moved by {S(shift, 2)} m, from {b.DistanceMeters:0.00} m to {c.DistanceMeters:0.00} m{(changed ? Invariant($", reflection {S(b.Reflection, 3)} → {S(c.Reflection, 3)}") : "")}"),
                    EventChangeKind.Changed => Invariant($"{kindNote} at {c.DistanceMeters:0.00} m changed: reflection {S(b.Reflection, 3)} → {S(c.Reflection, 3)}{(valueChanged ? Invariant($", value {b.Value:G3} → {c.Value:G3}") : "")}"),
                    _ => Invariant($"{kindNote} at {c.DistanceMeters:0.00} m unchanged (shift {S(shift, 3)} m, reflection change {S(dRho, 3)})"),
                };
                changes.Add(new EventChange(kind, b, c, moved || changed, text, peakNear(c.DistanceMeters)));
            }
        }
        return changes;
    }

    private static List<DifferenceRegion> FindRegions(double[] distances, double[] difference, double band, double slackMeters,
        double firstChangeMeters)
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
            bool explained = firstChangeMeters <= distances[e] + slackMeters;
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
