namespace CableFault.Workflows;

/// <summary>Which measurement of a both-ends pair shows an event.</summary>
public enum SeenFrom
{
    /// <summary>Seen from both ends: the position needs no velocity factor.</summary>
    BothEnds,

    /// <summary>Seen only from end A (hidden from B, e.g. behind a bigger fault, or a false detection).</summary>
    EndAOnly,

    /// <summary>Seen only from end B.</summary>
    EndBOnly,
}
