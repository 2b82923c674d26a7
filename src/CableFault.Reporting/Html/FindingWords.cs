using CableFault.Analysis;

namespace CableFault.Reporting.Html;

/// <summary>Plain words for events, and the order a technician reads them in: unexpected and worst first.</summary>
public static class FindingWords
{
    /// <summary>
    /// Slack around the recorded run length within which an end-like event is taken as the run's own end: three
    /// standard deviations of the located distance plus 2 % of the length, since installed lengths in asset records
    /// are rarely better than that (common practice).
    /// </summary>
    public const double ExpectedEndLengthFraction = 0.02;

    /// <summary>Standard deviations of the located distance allowed between an end-like event and the recorded length.</summary>
    public const double ExpectedEndSigmas = 3;

    /// <summary>Name for people, capitalised: "Open", "Impedance drop", ... (the words of the locate output).</summary>
    public static string Name(EventKind kind)
    {
        string words = Locate.EventWording.KindWords(kind);
        return char.ToUpperInvariant(words[0]) + words[1..];
    }

    /// <summary>What such an event usually is on an installed run; hedged, since the trace alone cannot tell.</summary>
    public static string LikelyCause(EventKind kind) => kind switch
    {
        EventKind.Open => "a break, an unplugged connector or the end of the cable",
        EventKind.Short => "conductors touching: crushed cable, a nail or staple, a shorted connector",
        EventKind.ImpedanceRise => "a section of different cable, or a stretched or damaged section",
        EventKind.ImpedanceDrop => "a crushed, kinked or wet section, or a section of different cable",
        EventKind.Capacitive => "a crimp, a tight bend, a drop of water or a cable tie pulled too hard",
        EventKind.Inductive => "a connector pair or joint, possibly loose",
        EventKind.PartialShort => "insulation leakage, often water or corrosion",
        EventKind.SeriesResistance => "a corroded or loose joint or connector",
        EventKind.Tap => "a branch, splitter or bridged tap",
        EventKind.Termination => "a load or terminating resistor",
        _ => "something changes here, but its kind cannot be told from this trace",
    };

    /// <summary>Numbers the events by distance and orders them: attention first (worst kind first, then nearest),
    /// then possible ends, then listed features, then the recorded end, then echoes beyond an open or short.</summary>
    /// <param name="events">The located events.</param>
    /// <param name="expectedLengthMeters">The run's recorded length, m, or null.</param>
    /// <param name="asBuilt">The events held against the run's as-built list (the same events), or null: an event not
    /// on the list needs attention, one on it does not.</param>
    public static IReadOnlyList<ReportFinding> Rank(IReadOnlyList<LocatedEvent> events, double? expectedLengthMeters,
        Workflows.AsBuiltMatch? asBuilt = null)
    {
        ArgumentNullException.ThrowIfNull(events);
        // By reference: two events with equal values are still two events.
        var matches = asBuilt?.Events.ToDictionary(m => (object)m.Event, ReferenceEqualityComparer.Instance);
        // A list that names the end decides about the end too; one that does not leaves the "probable end" guess.
        bool listsEnd = asBuilt?.List.Entries.Any(e => e.AcceptedKinds.Any(IsEndLike)) ?? false;
        var byDistance = events.OrderBy(e => e.DistanceMeters).ToList();
        // Past a full reflection nothing of the cable can be seen: anything later is an echo of what came before.
        var wall = byDistance.FirstOrDefault(e => e.Kind is EventKind.Open or EventKind.Short);
        int lastOnCable = wall is null ? byDistance.Count - 1 : byDistance.IndexOf(wall);
        var findings = new List<ReportFinding>();
        for (int i = 0; i < byDistance.Count; i++)
        {
            var e = byDistance[i];
            var role = FindingRole.Attention;
            var match = matches is not null && matches.TryGetValue((object)e, out var m) ? (Workflows.AsBuiltEventMatch?)m : null;
            if (i > lastOnCable)
            {
                role = FindingRole.BeyondEnd;
            }
            else if (match is { Expected: true })
            {
                role = FindingRole.Listed;
                if (IsEndLike(e.Kind) && expectedLengthMeters is double recorded
                    && Math.Abs(e.DistanceMeters - recorded) <= ExpectedEndSigmas * e.DistanceSigmaMeters + ExpectedEndLengthFraction * recorded)
                    role = FindingRole.Expected;
            }
            else if (match is not null && (listsEnd || !IsEndLike(e.Kind)))
            {
                role = FindingRole.Attention;
            }
            else if (IsEndLike(e.Kind))
            {
                if (expectedLengthMeters is double length)
                {
                    double slack = ExpectedEndSigmas * e.DistanceSigmaMeters + ExpectedEndLengthFraction * length;
                    if (Math.Abs(e.DistanceMeters - length) <= slack) role = FindingRole.Expected;
                }
                else if (i == lastOnCable)
                {
                    role = FindingRole.PossibleEnd;
                }
            }
            findings.Add(new ReportFinding(i + 1, e, Severity(e.Kind), role, match));
        }
        return findings
            .OrderBy(f => f.Role)
            .ThenByDescending(f => f.Severity)
            .ThenBy(f => f.Event.DistanceMeters)
            .ToList();
    }

    /// <summary>How much an event of this kind calls for action, 0…100 (a short is worst; a termination is usually
    /// meant to be there).</summary>
    public static int Severity(EventKind kind) => kind switch
    {
        EventKind.Short => 100,
        EventKind.Open => 95,
        EventKind.PartialShort => 85,
        EventKind.ImpedanceDrop => 75,
        EventKind.SeriesResistance => 70,
        EventKind.ImpedanceRise => 60,
        EventKind.Tap => 55,
        EventKind.Unknown => 50,
        EventKind.Capacitive => 40,
        EventKind.Inductive => 35,
        _ => 20,
    };

    /// <summary>The one-line summary of a finding: "Open at 143.2 m ± 0.4 m from the connector".</summary>
    public static string Headline(ReportFinding finding, DistanceUnit unit)
    {
        var e = finding.Event;
        string where = ReportNumbers.DistanceWithSigma(e.DistanceMeters, e.DistanceSigmaMeters, unit);
        string size = Size(e);
        string what = size.Length > 0 ? $"{Name(e.Kind)} ({size})" : Name(e.Kind);
        return finding.Role switch
        {
            FindingRole.Listed when finding.AsBuilt?.Entry is { } entry => $"{what} at {where} from the connector: the listed {entry.Name}, as expected",
            FindingRole.Attention when finding.AsBuilt is { NearbyEntry: { } near } => $"Unexpected: {LowerFirst(what)} at {where} from the connector, where the {near.Name} is listed (it should not look like this)",
            FindingRole.Attention when finding.AsBuilt is not null => $"Unexpected: {LowerFirst(what)} at {where} from the connector (not on the as-built list)",
            FindingRole.Expected => $"The run ends as recorded: {what.ToLowerInvariant()} at {where} from the connector",
            FindingRole.PossibleEnd => $"{what} at {where} from the connector — the end of the run, unless the run is longer",
            FindingRole.BeyondEnd => $"Echo at {where}, beyond the end: a re-reflection, not a place on the cable",
            _ => $"{what} at {where} from the connector",
        };
    }

    /// <summary>The event's size in words: impedance after a boundary, the lumped value, or nothing.</summary>
    public static string Size(LocatedEvent e)
    {
        if (e.Value is double value)
        {
            string unit = e.Kind switch { EventKind.Capacitive => "F", EventKind.Inductive => "H", _ => "Ω" };
            if (e.Kind != EventKind.Tap) return "about " + ReportNumbers.Lumped(value, unit);
        }
        if (e.ImpedanceOhms is double z && e.Kind is EventKind.ImpedanceDrop or EventKind.ImpedanceRise)
            return "to about " + ReportNumbers.Ohms(z);
        return "";
    }

    /// <summary>The summary when nothing was found beyond the blind zone.</summary>
    public static string NothingFound(double blindZoneMeters, DistanceUnit unit) =>
        $"No reflection found beyond the first {unit.Format(blindZoneMeters, 2)}: the run looks continuous and matched over the length the record covers";

    /// <summary>The summary when an as-built list was given and every event is on it.</summary>
    public static string NothingUnexpected(int listedCount) =>
        $"Nothing unexpected: every event found is a feature on the as-built list ({Locate.AsBuiltWording.Count(listedCount, "listed feature")} found)";

    /// <summary>The first letter in lower case only, so that unit symbols such as Ω keep their case.</summary>
    private static string LowerFirst(string text) => text.Length == 0 ? text : char.ToLowerInvariant(text[0]) + text[1..];

    private static bool IsEndLike(EventKind kind) => kind is EventKind.Open or EventKind.Short or EventKind.Termination;
}
