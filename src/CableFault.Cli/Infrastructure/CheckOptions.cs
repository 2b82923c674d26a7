using System.CommandLine;
using System.Globalization;
using CableFault.Comparison;

namespace CableFault.Cli.Infrastructure;

/// <summary>
/// The options of the repair/pair check shared by <c>compare</c> and <c>report</c>. Tolerance options have no default
/// value of their own: an option given on the command line wins, and an absent one takes the default of the reference
/// kind (<see cref="CompareTolerances.For"/>).
/// </summary>
internal static class CheckOptions
{
    private static string N(double value) => value.ToString(CultureInfo.InvariantCulture);

    internal static Option<string> ReferenceKind() => new Option<string>("--reference-kind")
    {
        Description = "What the reference trace is: baseline (an earlier capture of the same run; re-measurement tolerances) or pair (a healthy pair of the same cable; pair-to-pair tolerances, length and Z0 difference fitted).",
        DefaultValueFactory = _ => "baseline",
    }.AcceptOnlyFromAmong("baseline", "pair");

    internal static Option<double?> ToleranceReflection() => new("--tolerance-reflection")
    {
        Description = $"Largest accepted change of an event's reflection, and smallest new or gone event that fails (dimensionless, of the incident step). Default {N(CompareTolerances.DefaultReflection)} for a baseline (return loss about 30 dB), {N(CompareTolerances.PairReflection)} for a pair.",
    };

    internal static Option<double?> ToleranceDistance() => new("--tolerance-distance-m")
    {
        Description = $"Largest accepted shift of an event, m (the fixed part for a pair). Default {N(CompareTolerances.DefaultDistanceMeters)}.",
    };

    internal static Option<double?> ToleranceDistancePercent() => new("--tolerance-distance-pct")
    {
        Description = $"Part of the distance tolerance that grows with distance, % of the distance (tolerance = max(--tolerance-distance-m, pct × d)). Default 0 for a baseline, {N(CompareTolerances.PairDistanceFraction * 100)} for a pair.",
    };

    internal static Option<double?> ToleranceLengthPercent() => new("--tolerance-length-pct")
    {
        Description = $"Largest electrical-length difference absorbed by stretching the current trace onto the reference, %. Default 0 (no stretch) for a baseline, {N(CompareTolerances.PairLengthFraction * 100)} for a pair.",
    };

    internal static Option<double?> ToleranceImpedancePercent() => new("--tolerance-z0-pct")
    {
        Description = $"Largest accepted Z0 difference of the current run against the reference, %. Default: not judged for a baseline, {N(CompareTolerances.PairImpedanceFraction * 100)} for a pair.",
    };

    /// <summary>The defaults of <paramref name="kind"/>, with every option that was given put over them.</summary>
    internal static CompareTolerances Tolerances(ReferenceKind kind, double? reflection, double? distanceMeters, double? matchWindowMeters,
        double? distancePercent, double? lengthPercent, double? impedancePercent)
    {
        var t = CompareTolerances.For(kind);
        if (reflection is double r) t = t with { Reflection = r };
        if (distanceMeters is double d) t = t with { DistanceMeters = d };
        if (matchWindowMeters is double w) t = t with { MatchWindowMeters = w };
        if (distancePercent is double dp) t = t with { DistanceFraction = dp / 100 };
        if (lengthPercent is double lp) t = t with { LengthFraction = lp / 100 };
        if (impedancePercent is double zp) t = t with { ImpedanceFraction = zp / 100 };
        return t;
    }
}
