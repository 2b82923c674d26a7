using CableFault.Cables;

namespace CableFault.Networks;

/// <summary>A length of uniform cable.</summary>
/// <param name="LengthMeters">Physical length, m (&gt; 0).</param>
/// <param name="Medium">The cable's propagation medium.</param>
/// <param name="CableDesignation">The library designation it came from, if any (for display).</param>
public sealed record CableSegment(double LengthMeters, CableMedium Medium, string? CableDesignation = null) : NetworkElement
{
    /// <summary>One-way delay l / v, s.</summary>
    public double DelaySeconds => LengthMeters / Medium.VelocityMetersPerSecond;
}
