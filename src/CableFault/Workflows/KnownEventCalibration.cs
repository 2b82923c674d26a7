using System.Globalization;
using CableFault.Analysis;

namespace CableFault.Workflows;

/// <summary>
/// Velocity factor from an event at a known distance (a surveyed splice, a listed connector) instead of the far end:
/// useful when the end is out of the record, hidden behind a fault, or not where the records say. VF = 2·D/(c·t).
/// </summary>
public static class KnownEventCalibration
{
    /// <summary>
    /// 1-σ uncertainty of a known distance when none is given, m: 0.25 m, half the as-built list's default tolerance
    /// (<see cref="AsBuiltList.DefaultToleranceMeters"/>, a 95 % bound), since a splice position from the records or
    /// a tape along the route is rarely better (common practice). A fresh, careful measurement deserves a smaller figure.
    /// </summary>
    public const double DefaultDistanceSigmaMeters = 0.25;

    /// <summary>
    /// Half-width of the search around the known distance, in standard deviations: an event is a candidate when it
    /// lies within 3·√((σ_VF/VF·D)² + σ_D² + σ_event²) of D, the distance being located with the VF now in use.
    /// </summary>
    public const double SearchSigmas = 3;

    /// <summary>
    /// Picks the event at the known distance and solves for the VF.
    /// </summary>
    /// <param name="result">A locate result whose event σ's are timing only (located with VF uncertainty 0).</param>
    /// <param name="knownMeters">Known one-way distance of the event from the reference plane, m (&gt; 0).</param>
    /// <param name="knownSigmaMeters">1-σ uncertainty of that distance, m (≥ 0).</param>
    /// <param name="velocityFactorRelativeSigma">Relative 1-σ uncertainty of the VF the trace was located with, which
    /// widens the search (its distances may be off by that fraction).</param>
    /// <returns>The event used and the VF with its relative σ: δVF/VF = √((δt/t)² + (δD/D)²), first-order
    /// propagation of VF = 2D/(c·t).</returns>
    /// <exception cref="InputException">No event near the distance, several, or an impossible VF; one line.</exception>
    public static KnownEventCalibrationResult Calibrate(LocateResult result, double knownMeters, double knownSigmaMeters,
        double velocityFactorRelativeSigma)
    {
        ArgumentNullException.ThrowIfNull(result);
        var inv = CultureInfo.InvariantCulture;
        if (!(knownMeters > 0) || !double.IsFinite(knownMeters))
            throw new InputException(string.Create(inv, $"the known event distance {knownMeters} m must be a positive length"));
        if (!(knownSigmaMeters >= 0) || !double.IsFinite(knownSigmaMeters))
            throw new InputException("the known event's uncertainty must be zero or positive");
        double vfNow = result.Options.VelocityFactor;
        double Window(LocatedEvent e) => SearchSigmas * Math.Sqrt(Math.Pow(velocityFactorRelativeSigma * knownMeters, 2)
            + knownSigmaMeters * knownSigmaMeters + e.DistanceSigmaMeters * e.DistanceSigmaMeters);
        var candidates = result.Events.Where(e => Math.Abs(e.DistanceMeters - knownMeters) <= Window(e))
            .OrderBy(e => Math.Abs(e.DistanceMeters - knownMeters)).ToList();
        string Describe(LocatedEvent e) => string.Create(inv, $"{EventKindNames.ToJsonName(e.Kind)} at {e.DistanceMeters:0.00} m");
        if (candidates.Count == 0)
        {
            string nearest = result.Events.MinBy(e => Math.Abs(e.DistanceMeters - knownMeters)) is { } n ? $"; the nearest is the {Describe(n)}" : "; no events were found at all";
            throw new InputException(string.Create(inv,
                $"no located event lies within ±{Window(new LocatedEvent(knownMeters, 0, EventKind.Unknown, 0, null, null, 0, 0)):0.00} m of {knownMeters:0.00} m under the VF now in use ({vfNow:0.000}){nearest}; check the distance, or give a closer --vf or --cable"));
        }
        if (candidates.Count > 1)
            throw new InputException(string.Create(inv,
                $"{candidates.Count} events could be the one at {knownMeters:0.00} m under VF {vfNow:0.000} ({string.Join(", ", candidates.Select(Describe))}); give a closer --vf or --cable, or a smaller --vf-uncertainty-percent, to narrow the search"));

        var chosen = candidates[0];
        double c = PhysicalConstants.SpeedOfLightMetersPerSecond;
        double t = chosen.RoundTripSeconds;
        double vf = 2 * knownMeters / (c * t);
        double timeSigma = 2 * chosen.DistanceSigmaMeters / (vfNow * c);
        double relative = Math.Sqrt(Math.Pow(timeSigma / t, 2) + Math.Pow(knownSigmaMeters / knownMeters, 2));
        if (!(vf > 0 && vf <= 1))
            throw new InputException(string.Create(inv,
                $"the {Describe(chosen)} ({t * 1e9:0.00} ns round trip) and a known distance of {knownMeters:0.00} m give VF {vf:0.000}, which is impossible; check the distance and its unit"));
        return new KnownEventCalibrationResult(chosen, vf, relative, knownMeters, knownSigmaMeters, vfNow);
    }
}
