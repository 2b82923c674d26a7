using System.Globalization;
using CableFault.Analysis;
using CableFault.Cables;
using CableFault.Workflows;

namespace CableFault.Reporting.Locate;

/// <summary>
/// One line saying how the distances were worked out: which workflow, where the VF came from, what was taken off the
/// time axis. Shown under the event tables so that every distance can be traced to its method.
/// </summary>
public static class DistanceMethod
{
    /// <summary>"single-ended, VF 0.660 from cable type RG-213 (±2 %)", with a launch lead or time offset when used.</summary>
    /// <param name="options">The options the run was located with (VF, its source and σ, time-zero offset).</param>
    /// <param name="cable">The cable type named, when the VF came from it (a calibrated type says what it was calibrated on).</param>
    /// <param name="lead">The launch lead removed, or null.</param>
    /// <param name="unit">Distance unit for the lead's length.</param>
    public static string Describe(LocateOptions options, CableType? cable, LaunchLead? lead, DistanceUnit unit)
    {
        ArgumentNullException.ThrowIfNull(options);
        ArgumentNullException.ThrowIfNull(unit);
        var inv = CultureInfo.InvariantCulture;
        string vf = string.Create(inv, $"VF {options.VelocityFactor:0.000}");
        string sigma = string.Create(inv, $" (±{options.VelocityFactorRelativeSigma * 100:0.#} %)");
        string source = options.VelocityFactorSource switch
        {
            "option" => $"single-ended, {vf} given on the command line{sigma}",
            "metadata" => $"single-ended, {vf} from the trace file{sigma}",
            "cable" => $"single-ended, {vf} from {CableWords(cable)}{sigma}",
            "calibrated" => $"single-ended, {vf} calibrated earlier (recorded in the trace file){sigma}",
            "job" => $"single-ended, {vf} from the job file{sigma}",
            "default" => string.Create(inv, $"single-ended, VF not known: {options.VelocityFactor:0.00} assumed{sigma}, so each distance is really an interval over the VF range of the cable's insulation"),
            string other => $"single-ended, {vf} ({other}){sigma}",
        };
        var parts = new List<string> { source };
        double offset = options.TimeZeroOffsetSeconds ?? 0;
        if (lead is not null)
        {
            parts.Add(string.Create(inv, $"launch lead {unit.Format(lead.LengthMeters, 1)} (VF {lead.VelocityFactor:0.00}) removed"));
            offset -= lead.RoundTripSeconds;
        }
        if (Math.Abs(offset) > 1e-15)
            parts.Add(string.Create(inv, $"reference plane moved {offset * 1e9:0.###} ns round trip past the edge"));
        return string.Join("; ", parts);
    }

    /// <summary>"both ends: x = L·t_A/(t_A + t_B) over L = 48.500 m ± 0.100 m (no VF needed)".</summary>
    /// <param name="lengthMeters">Physical length between the two measuring points, m.</param>
    /// <param name="lengthSigmaMeters">Its 1-σ uncertainty, m.</param>
    /// <param name="unit">Distance unit.</param>
    public static string BothEnds(double lengthMeters, double lengthSigmaMeters, DistanceUnit unit)
    {
        ArgumentNullException.ThrowIfNull(unit);
        return $"both ends: x = L·t_A/(t_A + t_B) over L = {unit.Format(lengthMeters, 3)} ± {unit.Format(lengthSigmaMeters, 3)} (no VF needed)";
    }

    private static string CableWords(CableType? cable)
    {
        if (cable is null) return "the cable type";
        // A type written by 'calibrate' keeps in its source what it was calibrated on.
        return cable.Source.StartsWith("calibrated", StringComparison.OrdinalIgnoreCase)
            ? $"cable type {cable.Designation}, {cable.Source}"
            : $"cable type {cable.Designation}";
    }
}
