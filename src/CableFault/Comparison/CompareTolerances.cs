namespace CableFault.Comparison;

/// <summary>
/// How far an event may drift between the reference and the current trace before the check fails. The defaults of a
/// fresh instance (<see cref="ForBaseline"/>) are re-measurement tolerances; <see cref="ForPair"/> gives the wider
/// pair-to-pair ones. Every default is a public constant with the reasoning behind it, so a report can quote it.
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

    /// <summary>
    /// Pair default of <see cref="Reflection"/>: 0.06 (a return loss of about 24 dB). Pairs of one cable differ in Z₀ by
    /// up to about ±5 % (common practice). Each trace is divided by its own incident step, which removes the level offset
    /// itself, but the instrument's source, matched to the nominal Z₀, then looks mismatched by Γ_s = (Z_s − Z)/(Z_s + Z)
    /// (up to ∓0.025) to the odd pair: its echoes come back (1 + Γ_s) times as large and the level after an open end
    /// settles at 1 + Z_s/Z instead of 2 — up to 0.05 apart. Impedance ripple along each pair and noise take the rest.
    /// A leak of R between the conductors gives ρ = −Z₀/(2R + Z₀) (DESIGN.md §2), so on a 100 Ω pair a leak below about
    /// 780 Ω still fails.
    /// </summary>
    public const double PairReflection = 0.06;

    /// <summary>
    /// Pair default of <see cref="DistanceFraction"/>: 0.015 (1.5 % of the distance). Pairs of one cable are twisted at
    /// different lay lengths, so the conductor of one pair is 1–3 % longer per metre of cable than another's (common
    /// practice). The fitted stretch (<see cref="LengthFraction"/>) removes the mean difference when both far ends are
    /// seen; what is left is the variation of lay and VF along the run, taken here as half the largest spread. When no
    /// stretch could be fitted the far ends already disagree, which fails the check by itself.
    /// </summary>
    public const double PairDistanceFraction = 0.015;

    /// <summary>
    /// Pair default of <see cref="LengthFraction"/>: 0.04. The largest electrical-length difference of two pairs that is
    /// absorbed as lay-length spread: the 1–3 % of different twist rates (common practice) plus about 1 % of VF
    /// difference between pairs of the same insulation (from memory). A fault within this fraction of the far end cannot
    /// be told from a shorter pair by the reference pair alone.
    /// </summary>
    public const double PairLengthFraction = 0.04;

    /// <summary>
    /// Pair default of <see cref="ImpedanceFraction"/>: 0.05. A 100 Ω pair is commonly specified as 100 Ω ± 5 %
    /// over the pairs of one cable (common practice); a pair whose Z₀ reads further from its neighbour's is wet along its
    /// length (water raises the capacitance and lowers Z₀), damaged, or not of the same cable.
    /// </summary>
    public const double PairImpedanceFraction = 0.05;

    /// <summary>
    /// Pair default of <see cref="MinimumBand"/>: 0.01 of the step. The impedance of a twisted pair ripples along its
    /// length by about ±1 % (from memory), giving reflections of about ±0.005 on each pair and so up to ±0.01 between two
    /// pairs; differences within that are not listed as regions.
    /// </summary>
    public const double PairMinimumBand = 0.01;

    /// <summary>The re-measurement tolerances (the defaults of a fresh instance).</summary>
    public static CompareTolerances ForBaseline() => new();

    /// <summary>The pair-to-pair tolerances: reflection <see cref="PairReflection"/>, distance
    /// max(<see cref="DefaultDistanceMeters"/>, <see cref="PairDistanceFraction"/>·d), length stretch up to
    /// ±<see cref="PairLengthFraction"/>, Z₀ offset up to ±<see cref="PairImpedanceFraction"/>, band at least
    /// <see cref="PairMinimumBand"/>.</summary>
    public static CompareTolerances ForPair() => new()
    {
        Reflection = PairReflection,
        DistanceFraction = PairDistanceFraction,
        LengthFraction = PairLengthFraction,
        ImpedanceFraction = PairImpedanceFraction,
        MinimumBand = PairMinimumBand,
    };

    /// <summary>The default tolerances of a reference kind.</summary>
    public static CompareTolerances For(ReferenceKind kind) => kind == ReferenceKind.Pair ? ForPair() : ForBaseline();

    /// <summary>Reflection tolerance, dimensionless, in (0, 2].</summary>
    public double Reflection { get; init; } = DefaultReflection;

    /// <summary>Distance tolerance, m (&gt; 0).</summary>
    public double DistanceMeters { get; init; } = DefaultDistanceMeters;

    /// <summary>Pairing window, m (≥ <see cref="DistanceMeters"/>).</summary>
    public double MatchWindowMeters { get; init; } = DefaultMatchWindowMeters;

    /// <summary>Relative lumped-value tolerance, &gt; 0.</summary>
    public double ValueFraction { get; init; } = DefaultValueFraction;

    /// <summary>Part of the distance tolerance that grows with distance, dimensionless, in [0, 0.2]: the tolerance at
    /// d is max(<see cref="DistanceMeters"/>, DistanceFraction·d). 0 for a baseline.</summary>
    public double DistanceFraction { get; init; }

    /// <summary>Largest relative difference of electrical length absorbed by stretching the current trace's time axis
    /// onto the reference's, dimensionless, in [0, 0.2]; 0 (no stretch) for a baseline.</summary>
    public double LengthFraction { get; init; }

    /// <summary>Largest relative Z₀ offset of the current run against the reference accepted, in (0, 1], or null when
    /// the offset is not judged (a baseline: the same conductors).</summary>
    public double? ImpedanceFraction { get; init; }

    /// <summary>Smallest half-width of the difference band, in units of the incident step, in [0, 0.5).</summary>
    public double MinimumBand { get; init; } = RepairCheckOptions.MinimumBandRelative;

    /// <summary>Distance tolerance at distance d, m: max(<see cref="DistanceMeters"/>, <see cref="DistanceFraction"/>·|d|).</summary>
    public double DistanceAt(double meters) => Math.Max(DistanceMeters, DistanceFraction * Math.Abs(meters));

    /// <summary>Pairing window at distance d, m: max(<see cref="MatchWindowMeters"/>, <see cref="DistanceAt"/>(d)).</summary>
    public double MatchWindowAt(double meters) => Math.Max(MatchWindowMeters, DistanceAt(meters));

    /// <summary>Every problem with the tolerances, each naming its option; empty when valid.</summary>
    public IReadOnlyList<string> Problems()
    {
        var problems = new List<string>();
        if (!(Reflection > 0 && Reflection <= 2)) problems.Add($"--tolerance-reflection {Reflection} must be in (0, 2], e.g. {DefaultReflection}");
        if (!(DistanceMeters > 0) || !double.IsFinite(DistanceMeters)) problems.Add($"--tolerance-distance-m {DistanceMeters} must be a positive number of metres, e.g. {DefaultDistanceMeters}");
        if (!(MatchWindowMeters >= DistanceMeters) || !double.IsFinite(MatchWindowMeters)) problems.Add($"--match-window-m {MatchWindowMeters} must be at least the distance tolerance ({DistanceMeters} m)");
        if (!(ValueFraction > 0) || !double.IsFinite(ValueFraction)) problems.Add($"value tolerance {ValueFraction} must be a positive fraction, e.g. {DefaultValueFraction}");
        if (!(DistanceFraction >= 0 && DistanceFraction <= 0.2)) problems.Add($"--tolerance-distance-pct {DistanceFraction * 100} must be between 0 and 20 %, e.g. {PairDistanceFraction * 100}");
        if (!(LengthFraction >= 0 && LengthFraction <= 0.2)) problems.Add($"--tolerance-length-pct {LengthFraction * 100} must be between 0 and 20 %, e.g. {PairLengthFraction * 100}");
        if (ImpedanceFraction is double z && !(z > 0 && z <= 1)) problems.Add($"--tolerance-z0-pct {z * 100} must be above 0 and at most 100 %, e.g. {PairImpedanceFraction * 100}");
        if (!(MinimumBand >= 0 && MinimumBand < 0.5)) problems.Add($"minimum band {MinimumBand} must be in [0, 0.5) of the step");
        return problems;
    }
}
