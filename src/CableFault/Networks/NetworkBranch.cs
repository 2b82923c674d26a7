namespace CableFault.Networks;

/// <summary>An ordered list of elements from the branch's start outward, ending in a <see cref="RunEnd"/> or <see cref="Junction"/>.</summary>
public sealed record NetworkBranch(IReadOnlyList<NetworkElement> Elements)
{
    /// <summary>Convenience constructor.</summary>
    public NetworkBranch(params NetworkElement[] elements) : this((IReadOnlyList<NetworkElement>)elements) { }
}
