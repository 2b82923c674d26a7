namespace CableFault.Comparison;

/// <summary>
/// How far an event may drift between the baseline and the current trace before the repair check fails.
/// Every default is a public constant with the reasoning behind it, so a report can quote it.
/// </summary>
public sealed record CompareTolerances
{
    /// <summary>
    /// Default largest change of reflection (dimensionless, in units of the incident step) accepted for an event, and
    /// the largest difference a new or vanished event may leave: 0.03, a return loss of about 30 dB. A sound connector
    /// pair or splice on coax stays below about |ρ| = 0.02–0.03 at the frequencies a sub-nanosecond edge carries
    /// (common practice), so a repair made with good connectors passes and a poor splice, a crushed spot or a tap
    /// fails. It is four times the combined noise band of two 1 mV captures of a 1 V step (0.007) and twice that of
    /// two 2 mV captures, so noise alone does not reach it.
    /// </summary>
    public const double DefaultReflection = 0.03;

    /// <summary>
    /// Default largest shift of an event, m: 0.25. Two captures with the same settings place an unchanged event within
    /// a few centimetres (the time zero is read to a few picoseconds); the rest of the margin absorbs re-made test leads
    /// and connectors and the VF's drift with temperature (about 0.1 % between seasons, from memory), while staying
    /// shorter than the shortest piece a crew splices in (about 0.5 m; common practice).
    /// </summary>
    public const double DefaultDistanceMeters = 0.25;

    /// <summary>
    /// Default search window for pairing an event on the current trace with one on the baseline, m: 3. An event that
    /// moved by more than this is reported as one gone and one new; 3 m covers a replaced section of ordinary length.
    /// </summary>
    public const double DefaultMatchWindowMeters = 3.0;

    /// <summary>
    /// Default largest relative change of a lumped value (F, H, Ω) accepted when the event itself is above the
    /// reflection tolerance: 0.5. Lumped values read from a fit scatter by tens of percent for small events, so only
    /// a change by half or more is called a change.
    /// </summary>
    public const double DefaultValueFraction = 0.5;

    /// <summary>Reflection tolerance, dimensionless, in (0, 2].</summary>
    public double Reflection { get; init; } = DefaultReflection;

    /// <summary>Distance tolerance, m (&gt; 0).</summary>
    public double DistanceMeters { get; init; } = DefaultDistanceMeters;

    /// <summary>Pairing window, m (≥ <see cref="DistanceMeters"/>).</summary>
    public double MatchWindowMeters { get; init; } = DefaultMatchWindowMeters;

    /// <summary>Relative lumped-value tolerance, &gt; 0.</summary>
    public double ValueFraction { get; init; } = DefaultValueFraction;

    /// <summary>Every problem with the tolerances, each naming its option; empty when valid.</summary>
    public IReadOnlyList<string> Problems()
    {
        var problems = new List<string>();
        if (!(Reflection > 0 && Reflection <= 2)) problems.Add($"--tolerance-reflection {Reflection} must be in (0, 2], e.g. {DefaultReflection}");
        if (!(DistanceMeters > 0) || !double.IsFinite(DistanceMeters)) problems.Add($"--tolerance-distance-m {DistanceMeters} must be a positive number of metres, e.g. {DefaultDistanceMeters}");
        if (!(MatchWindowMeters >= DistanceMeters) || !double.IsFinite(MatchWindowMeters)) problems.Add($"--match-window-m {MatchWindowMeters} must be at least the distance tolerance ({DistanceMeters} m)");
        if (!(ValueFraction > 0) || !double.IsFinite(ValueFraction)) problems.Add($"value tolerance {ValueFraction} must be a positive fraction, e.g. {DefaultValueFraction}");
        return problems;
    }
}
