using CableFault.Analysis;

namespace CableFault.Workflows;

/// <summary>One known feature of a run, as recorded when it was built (a joint, a tap, a change of cable, the end).</summary>
/// <param name="Kind">The feature word or event kind as listed, lower case (see <see cref="AsBuiltKinds"/>).</param>
/// <param name="DistanceMeters">Recorded one-way distance from the instrument connector, m (≥ 0).</param>
/// <param name="Label">Name of the feature in the records (e.g. "S2"), or null.</param>
/// <param name="ToleranceMeters">How far off the recorded distance may be, m (&gt; 0): the entry's own figure, else
/// the list's default, else <see cref="AsBuiltList.DefaultToleranceMeters"/>. Read as a bound that holds about 95 %
/// of the time (about 2 σ).</param>
/// <param name="AcceptedKinds">Located event kinds this feature may show up as.</param>
public sealed record AsBuiltEntry(string Kind, double DistanceMeters, string? Label, double ToleranceMeters,
    IReadOnlyList<EventKind> AcceptedKinds)
{
    /// <summary>Recorded distance, m (finite, ≥ 0).</summary>
    public double DistanceMeters { get; } = double.IsFinite(DistanceMeters) && DistanceMeters >= 0
        ? DistanceMeters : throw new ArgumentOutOfRangeException(nameof(DistanceMeters), DistanceMeters, "A recorded distance must be finite and ≥ 0 m.");

    /// <summary>Tolerance of the recorded distance, m (finite, &gt; 0), a 95 % bound.</summary>
    public double ToleranceMeters { get; } = double.IsFinite(ToleranceMeters) && ToleranceMeters > 0
        ? ToleranceMeters : throw new ArgumentOutOfRangeException(nameof(ToleranceMeters), ToleranceMeters, "A tolerance must be finite and > 0 m.");

    /// <summary>How the entry is named to people: "splice", "splice S2", "connector (roof-entry bulkhead)".</summary>
    public string Name
    {
        get
        {
            string kind = Kind.Replace('_', ' ');
            if (string.IsNullOrWhiteSpace(Label)) return kind;
            return Label.Any(char.IsWhiteSpace) ? $"{kind} ({Label})" : $"{kind} {Label}";
        }
    }

    /// <summary>True when an event of <paramref name="kind"/> can be this feature.</summary>
    public bool Accepts(EventKind kind) => AcceptedKinds.Contains(kind);
}
