using CableFault.Analysis;
using CableFault.Cables;

namespace CableFault.Workflows;

/// <summary>
/// What a trace says when the velocity factor is not known: the round trip of each event, its electrical length
/// (the distance at v = c) and the distance interval for the VF range of an insulation class, instead of one number
/// with false precision.
/// </summary>
public static class VelocityFactorRange
{
    /// <summary>The entries for every event of <paramref name="result"/>, with the VF range of <paramref name="insulation"/>
    /// (<see cref="InsulationClassRanges.VelocityFactorRange"/>; the unknown class spans the common cables).</summary>
    public static IReadOnlyList<VelocityFactorRangeEntry> For(LocateResult result, InsulationClass insulation)
    {
        ArgumentNullException.ThrowIfNull(result);
        var (low, high) = InsulationClassRanges.VelocityFactorRange(insulation);
        double c = PhysicalConstants.SpeedOfLightMetersPerSecond;
        return result.Events.Select(e =>
        {
            double electrical = c * e.RoundTripSeconds / 2;
            return new VelocityFactorRangeEntry(e, e.RoundTripSeconds, electrical, low * electrical, high * electrical);
        }).ToList();
    }
}
