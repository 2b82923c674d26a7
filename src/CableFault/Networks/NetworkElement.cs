namespace CableFault.Networks;

/// <summary>
/// One element of a run, in order from the instrument outward. A branch is a list of elements whose last one is
/// a <see cref="RunEnd"/> or a <see cref="Junction"/>.
/// </summary>
public abstract record NetworkElement
{
    /// <summary>Optional name for people ("splice box 3").</summary>
    public string? Label { get; init; }
}
