namespace CableFault.Networks;

/// <summary>
/// A point where the run splits into two or more branches (a tap or a Y split). The branches' input admittances add.
/// Must be the last element of its branch.
/// </summary>
public sealed record Junction(IReadOnlyList<NetworkBranch> Branches) : NetworkElement;
