namespace CableFault.Comparison;

/// <summary>The stable JSON vocabulary for <see cref="EventChangeKind"/>.</summary>
public static class EventChangeKindNames
{
    /// <summary>unchanged, moved, changed, new or gone.</summary>
    public static string ToJsonName(EventChangeKind kind) => kind switch
    {
        EventChangeKind.Unchanged => "unchanged",
        EventChangeKind.Moved => "moved",
        EventChangeKind.Changed => "changed",
        EventChangeKind.New => "new",
        EventChangeKind.Gone => "gone",
        _ => throw new ArgumentOutOfRangeException(nameof(kind), kind, "Unknown change kind."),
    };
}
