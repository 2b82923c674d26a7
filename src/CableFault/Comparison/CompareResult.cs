using CableFault.Analysis;
using CableFault.Traces;

namespace CableFault.Comparison;

/// <summary>Everything <see cref="RepairCheck.Compare"/> found: the verdict and the evidence for it.</summary>
public sealed record CompareResult
{
    /// <summary>True when no event is new, gone, moved or changed beyond the tolerances and no unexplained difference
    /// exceeds the reflection tolerance.</summary>
    public required bool Pass { get; init; }

    /// <summary>Why: one sentence per failing finding, or what was checked when it passes.</summary>
    public required IReadOnlyList<string> Reasons { get; init; }

    /// <summary>The tolerances the verdict used.</summary>
    public required CompareTolerances Tolerances { get; init; }

    /// <summary>The cable settings both traces were read with.</summary>
    public required CableSettings Settings { get; init; }

    /// <summary>The baseline on the common grid: time zero at the incident edge, baseline level removed, polarity
    /// corrected, divided by its incident step (so 1 is the incident level and a reflection ρ shows as 1 + ρ).</summary>
    public required Trace Baseline { get; init; }

    /// <summary>The current trace, prepared the same way on the same grid (band-limited when rise times were matched).</summary>
    public required Trace Current { get; init; }

    /// <summary>Distance of each common-grid sample, m: d = v·t/2.</summary>
    public required double[] DistancesMeters { get; init; }

    /// <summary>Current − baseline on the common grid, in units of the incident step.</summary>
    public required double[] Difference { get; init; }

    /// <summary>Half-width of the noise band, in units of the incident step: k·√(σ_b² + σ_c²) (each σ relative to its
    /// own step), at least <see cref="RepairCheckOptions.MinimumBandRelative"/>.</summary>
    public required double NoiseBand { get; init; }

    /// <summary>Stretches where the difference leaves the noise band, nearest first.</summary>
    public required IReadOnlyList<DifferenceRegion> Regions { get; init; }

    /// <summary>The event-level comparison, by distance.</summary>
    public required IReadOnlyList<EventChange> Events { get; init; }

    /// <summary>What the locator found on the prepared baseline.</summary>
    public required LocateResult BaselineLocate { get; init; }

    /// <summary>What the locator found on the prepared current trace.</summary>
    public required LocateResult CurrentLocate { get; init; }

    /// <summary>10–90 % rise time of the baseline's incident edge as recorded, s.</summary>
    public required double BaselineRiseTimeSeconds { get; init; }

    /// <summary>10–90 % rise time of the current trace's incident edge as recorded, s.</summary>
    public required double CurrentRiseTimeSeconds { get; init; }

    /// <summary>True when the sharper trace was band-limited to the slower rise time.</summary>
    public required bool RiseMatched { get; init; }

    /// <summary>Blind zone of the comparison (the larger of the two), m: nothing closer is judged.</summary>
    public required double BlindZoneMeters { get; init; }

    /// <summary>One-line warnings for the user.</summary>
    public required IReadOnlyList<string> Warnings { get; init; }

    /// <summary>What the reference trace was (<see cref="Baseline"/> holds it either way).</summary>
    public ReferenceKind ReferenceKind { get; init; } = ReferenceKind.Baseline;

    /// <summary>Length stretch and impedance offset of the current run against the reference (none fitted or estimated
    /// for a baseline with the default tolerances). When a stretch was fitted, <see cref="Current"/>,
    /// <see cref="CurrentLocate"/> and <see cref="Difference"/> are on the reference's time axis.</summary>
    public PairSpread? Spread { get; init; }

    /// <summary>Where the current run first differs from the reference beyond the tolerances, m: the nearest failing
    /// event change or unexplained difference region (its start, where the difference leaves the band); null when the
    /// check passes on events and regions.</summary>
    public double? FirstDifferenceMeters { get; init; }
}
