using System.Globalization;
using CableFault.Analysis;

namespace CableFault.Workflows;

/// <summary>
/// Holds located events against an as-built list: each event is expected (a listed feature, within tolerance and of a
/// compatible kind) or unexpected, and listed features that no event matched are named with the likeliest reason.
/// </summary>
public static class AsBuiltMatcher
{
    /// <summary>
    /// Standard deviations of the located distance allowed on top of the record's tolerance: 2, so that with the
    /// tolerance read as a 95 % bound too the gate is a 95 % window for both errors together.
    /// </summary>
    public const double LocatedSigmas = 2;

    /// <summary>
    /// Half-width of the window within which an event and a listed feature are taken as the same place, m:
    /// g = √(T² + (k·σ)²), T the entry's tolerance, σ the event's distance σ (timing and VF), k = <see cref="LocatedSigmas"/>.
    /// The two errors are independent, so their 95 % half-widths add in quadrature (first-order error propagation).
    /// </summary>
    public static double GateMeters(AsBuiltEntry entry, LocatedEvent located)
    {
        ArgumentNullException.ThrowIfNull(entry);
        ArgumentNullException.ThrowIfNull(located);
        return Math.Sqrt(entry.ToleranceMeters * entry.ToleranceMeters + Math.Pow(LocatedSigmas * located.DistanceSigmaMeters, 2));
    }

    /// <summary>Matches the events of a locate result; the record's reach and any full reflection explain misses.</summary>
    public static AsBuiltMatch Match(LocateResult result, AsBuiltList list)
    {
        ArgumentNullException.ThrowIfNull(result);
        double v = result.Options.VelocityFactor * PhysicalConstants.SpeedOfLightMetersPerSecond;
        double reach = v * (result.AlignedTrace.EndTimeSeconds - (result.Options.TimeZeroOffsetSeconds ?? 0)) / 2;
        return Match(result.Events, list, reach);
    }

    /// <summary>
    /// Matches <paramref name="events"/> to <paramref name="list"/> one to one: among all compatible pairs within their
    /// gate (<see cref="GateMeters"/>), the closest (in gate widths) are paired first.
    /// </summary>
    /// <param name="events">Located events.</param>
    /// <param name="list">The as-built list.</param>
    /// <param name="reachMeters">Farthest distance the record covers, m, or null when not known.</param>
    public static AsBuiltMatch Match(IReadOnlyList<LocatedEvent> events, AsBuiltList list, double? reachMeters = null)
    {
        ArgumentNullException.ThrowIfNull(events);
        ArgumentNullException.ThrowIfNull(list);
        var entries = list.Entries;
        var pairs = new List<(int Event, int Entry, double Score, double Offset)>();
        for (int i = 0; i < events.Count; i++)
            for (int j = 0; j < entries.Count; j++)
            {
                double offset = events[i].DistanceMeters - entries[j].DistanceMeters;
                double gate = GateMeters(entries[j], events[i]);
                if (entries[j].Accepts(events[i].Kind) && Math.Abs(offset) <= gate)
                    pairs.Add((i, j, Math.Abs(offset) / gate, offset));
            }
        var eventTo = new int?[events.Count];
        var offsets = new double?[events.Count];
        var entryTaken = new bool[entries.Count];
        foreach (var pair in pairs.OrderBy(p => p.Score))
        {
            if (eventTo[pair.Event] is not null || entryTaken[pair.Entry]) continue;
            eventTo[pair.Event] = pair.Entry;
            offsets[pair.Event] = pair.Offset;
            entryTaken[pair.Entry] = true;
        }

        // Past an open or short nothing of the cable is seen; a located tap's branch ends are opens off the main line,
        // so with a tap in the run no such wall is assumed.
        bool tapped = events.Any(e => e.Kind == EventKind.Tap);
        var wall = tapped ? null : events.Where(e => e.Kind is EventKind.Open or EventKind.Short).MinBy(e => e.DistanceMeters);
        var matched = new List<AsBuiltEventMatch>(events.Count);
        for (int i = 0; i < events.Count; i++)
        {
            AsBuiltEntry? nearby = null;
            if (eventTo[i] is null)
                nearby = entries.Where((entry, j) => !entryTaken[j] && Math.Abs(events[i].DistanceMeters - entry.DistanceMeters) <= GateMeters(entry, events[i]))
                    .MinBy(entry => Math.Abs(events[i].DistanceMeters - entry.DistanceMeters));
            var behind = eventTo[i] is null && wall is not null && events[i].DistanceMeters > wall.DistanceMeters ? wall : null;
            matched.Add(new AsBuiltEventMatch(events[i], eventTo[i] is int j ? entries[j] : null, offsets[i], nearby, behind));
        }

        var missing = new List<AsBuiltMissing>();
        for (int j = 0; j < entries.Count; j++)
        {
            if (entryTaken[j]) continue;
            missing.Add(Miss(entries[j], matched, wall, reachMeters));
        }
        return new AsBuiltMatch(matched, missing, list);
    }

    private static AsBuiltMissing Miss(AsBuiltEntry entry, IReadOnlyList<AsBuiltEventMatch> matched, LocatedEvent? wall, double? reachMeters)
    {
        var inv = CultureInfo.InvariantCulture;
        string name = entry.Name;
        var nearby = matched.Where(m => !m.Expected && ReferenceEquals(m.NearbyEntry, entry)).Select(m => m.Event).FirstOrDefault();
        if (nearby is not null)
            return new AsBuiltMissing(entry, AsBuiltMissReason.KindDiffers, string.Create(inv,
                $"{name} listed at {entry.DistanceMeters:0.0#} m: an event lies there ({nearby.DistanceMeters:0.00} m) but shows as {EventKindNames.ToJsonName(nearby.Kind)}, not as a {entry.Kind.Replace('_', ' ')} normally does"), nearby);
        if (reachMeters is double reach && entry.DistanceMeters - entry.ToleranceMeters > reach)
            return new AsBuiltMissing(entry, AsBuiltMissReason.BeyondRecord, string.Create(inv,
                $"{name} listed at {entry.DistanceMeters:0.0#} m lies beyond the {reach:0.0} m the record covers; record a longer trace to see it"), null);
        if (wall is not null && entry.DistanceMeters - entry.ToleranceMeters > wall.DistanceMeters + LocatedSigmas * wall.DistanceSigmaMeters)
            return new AsBuiltMissing(entry, AsBuiltMissReason.BeyondFullReflection, string.Create(inv,
                $"{name} listed at {entry.DistanceMeters:0.0#} m lies past the {EventKindNames.ToJsonName(wall.Kind)} at {wall.DistanceMeters:0.00} m: the run ends early or is broken there"), null);
        return new AsBuiltMissing(entry, AsBuiltMissReason.NotSeen, string.Create(inv,
            $"{name} listed at {entry.DistanceMeters:0.0#} m: nothing of that kind found within its tolerance; it may have moved, been removed, or be too small to see"), null);
    }
}
