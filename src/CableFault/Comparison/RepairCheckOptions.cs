using CableFault.Cables;

namespace CableFault.Comparison;

/// <summary>What <see cref="RepairCheck.Compare"/> needs besides the two traces.</summary>
public sealed record RepairCheckOptions
{
    /// <summary>
    /// Default half-width of the noise band in standard deviations of the combined noise: 5. The chance that white
    /// Gaussian noise exceeds 5σ is 5.7·10⁻⁷ per sample, so a 20 000-sample record shows a false difference about once
    /// in a hundred comparisons (normal distribution tail; common practice).
    /// </summary>
    public const double DefaultNoiseBandSigmas = 5;

    /// <summary>
    /// Smallest half-width of the noise band, in units of the incident step: 0.002. Noise-free (computed) traces still
    /// differ by interpolation error on the common grid (a cubic spline on a grid of rise/8 errs by well under 0.1 % of
    /// a step) and by the last bit of an 8–10 bit digitiser (0.1–0.4 %).
    /// </summary>
    public const double MinimumBandRelative = 0.002;

    /// <summary>
    /// Relative rise-time difference above which a warning is given (10 %): a sharper edge on one trace leaves a
    /// difference of about ρ·0.24·Δσ/σ at every event of reflection ρ, i.e. 2 % of an open end's step at 10 %.
    /// </summary>
    public const double RiseMismatchWarningFraction = 0.10;

    /// <summary>VF to use for both traces (--vf), or null to take it from the traces' metadata or cable type.</summary>
    public double? VelocityFactor { get; init; }

    /// <summary>Z₀ to use for both traces (--z0), Ω, or null.</summary>
    public double? ImpedanceOhms { get; init; }

    /// <summary>Cable type designation (--cable), or null.</summary>
    public string? CableDesignation { get; init; }

    /// <summary>Instrument source impedance, Ω, or null (metadata, else Z₀).</summary>
    public double? SourceImpedanceOhms { get; init; }

    /// <summary>Cable types to resolve designations against.</summary>
    public CableLibrary Library { get; init; } = CableLibrary.BuiltIn;

    /// <summary>What the reference trace is: an earlier capture of the same run (default) or a healthy pair of the
    /// same cable. Sets the default tolerances and the wording of the verdict.</summary>
    public ReferenceKind ReferenceKind { get; init; } = ReferenceKind.Baseline;

    /// <summary>Tolerances for the verdict, or null for the defaults of <see cref="ReferenceKind"/>
    /// (<see cref="CompareTolerances.For"/>).</summary>
    public CompareTolerances? Tolerances { get; init; }

    /// <summary>The tolerances the check uses: <see cref="Tolerances"/> when given, else the defaults of the kind.</summary>
    public CompareTolerances EffectiveTolerances => Tolerances ?? CompareTolerances.For(ReferenceKind);

    /// <summary>Band-limit the sharper trace with a Gaussian so both have the slower rise time.</summary>
    public bool MatchRise { get; init; }

    /// <summary>Noise band half-width in σ of the combined noise (&gt; 0).</summary>
    public double NoiseBandSigmas { get; init; } = DefaultNoiseBandSigmas;

    /// <summary>Distances in the warnings in feet instead of metres (what the user asked to see); the results stay in
    /// metres.</summary>
    public bool WarningsInFeet { get; init; }

    /// <summary>Cancels the comparison.</summary>
    public CancellationToken CancellationToken { get; init; }

    /// <summary>Every problem with the options, each naming the option; empty when valid.</summary>
    public IReadOnlyList<string> Problems()
    {
        var problems = new List<string>(EffectiveTolerances.Problems());
        if (VelocityFactor is double vf && !(vf > 0 && vf <= 1)) problems.Add($"--vf {vf} must be in (0, 1], e.g. 0.66");
        if (ImpedanceOhms is double z && (!(z > 0) || !double.IsFinite(z))) problems.Add($"--z0 {z} must be a positive number of ohms, e.g. 50");
        if (!(NoiseBandSigmas > 0) || !double.IsFinite(NoiseBandSigmas)) problems.Add($"noise band {NoiseBandSigmas} σ must be positive");
        return problems;
    }
}
