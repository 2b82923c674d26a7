using System.Globalization;
using CableFault.Analysis;

namespace CableFault.Workflows;

/// <summary>
/// A launch (lead-in) cable between the instrument and the run. Its round trip is taken off every event time, so
/// distances start at the lead's far connector, and whatever lies inside the lead (its connector included) is dropped.
/// </summary>
/// <param name="LengthMeters">Physical length of the lead, m (&gt; 0).</param>
/// <param name="VelocityFactor">Velocity factor of the lead's cable, (0, 1].</param>
public sealed record LaunchLead(double LengthMeters, double VelocityFactor)
{
    /// <summary>
    /// Events closer than this many rise times to the lead's far connector are taken as that connector: the fit
    /// cannot split two events closer than about one rise time, so anything there is indistinguishable from the joint.
    /// </summary>
    public const double ConnectorRiseTimes = 0.5;

    /// <summary>Round trip through the lead, s: 2·L/(VF·c).</summary>
    public double RoundTripSeconds => 2 * LengthMeters / (VelocityFactor * PhysicalConstants.SpeedOfLightMetersPerSecond);

    /// <summary>What is wrong with the values, one line each; empty when usable.</summary>
    public IReadOnlyList<string> Problems()
    {
        var problems = new List<string>();
        if (!(LengthMeters > 0) || !double.IsFinite(LengthMeters)) problems.Add($"lead length {LengthMeters.ToString(CultureInfo.InvariantCulture)} m must be a positive number");
        if (!(VelocityFactor > 0 && VelocityFactor <= 1)) problems.Add($"lead velocity factor {VelocityFactor.ToString(CultureInfo.InvariantCulture)} must be between 0 and 1, e.g. 0.66");
        return problems;
    }

    /// <summary>Options with the reference plane moved to the far end of the lead (adds to any offset already set).</summary>
    public LocateOptions Shift(LocateOptions options)
    {
        ArgumentNullException.ThrowIfNull(options);
        return options with { TimeZeroOffsetSeconds = (options.TimeZeroOffsetSeconds ?? 0) + RoundTripSeconds };
    }

    /// <summary>
    /// The result without the events inside the lead or at its far connector (round trip after the shift of at most
    /// <see cref="ConnectorRiseTimes"/> rise times), with a note of how many were dropped.
    /// </summary>
    public LocateResult DropLeadEvents(LocateResult result)
    {
        ArgumentNullException.ThrowIfNull(result);
        double limit = ConnectorRiseTimes * result.Characteristics.RiseTimeSeconds;
        var kept = result.Events.Where(e => e.RoundTripSeconds > limit).ToList();
        int dropped = result.Events.Count - kept.Count;
        if (dropped == 0) return result;
        var warnings = result.Warnings.Append(
            $"{dropped} event(s) inside the {result.Options.WarningDistance(LengthMeters)} lead or at its connector left out; distances are from the lead's far end.").ToList();
        return result with { Events = kept, Warnings = warnings };
    }
}
