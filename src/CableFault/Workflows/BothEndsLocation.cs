using System.Globalization;
using CableFault.Analysis;

namespace CableFault.Workflows;

/// <summary>
/// Combines the located events of one run measured from end A and from end B. An event at x from A is seen at round
/// trip t_A = 2x/v from A and t_B = 2(L − x)/v from B, so t_A + t_B = 2L/v = T for every event and
/// x = L·t_A/(t_A + t_B): the velocity factor cancels and only the length and the two fitted times remain.
/// </summary>
public static class BothEndsLocation
{
    /// <summary>
    /// Two events pair up when t_A + t_B is within this many combined 1-σ of T. Four σ keeps a true pair (a 6e-5
    /// chance of missing it for Gaussian errors) while the floor below keeps noiseless fits from demanding ps agreement.
    /// </summary>
    public const double MatchSigmas = 4;

    /// <summary>
    /// …and always within this many rise times: two events closer than about one rise time cannot be told apart by
    /// the fit in the first place, so no pairing can be sharper than that.
    /// </summary>
    public const double MatchFloorRiseTimes = 1.0;

    /// <summary>
    /// Combines the two locate results. Locate both with <c>VelocityFactorRelativeSigma = 0</c> so the event σ's are
    /// timing σ's alone (a non-zero VF term is removed in quadrature here anyway).
    /// </summary>
    /// <param name="fromA">Locate result of the trace taken at end A.</param>
    /// <param name="fromB">Locate result of the trace taken at end B (same run, same cable).</param>
    /// <param name="lengthMeters">Physical length of the run between the two reference planes, m (&gt; 0).</param>
    /// <param name="lengthSigmaMeters">1-σ of that length, m (≥ 0).</param>
    /// <exception cref="InputException">Bad length, or the traces share no event and show no far ends.</exception>
    public static BothEndsResult Combine(LocateResult fromA, LocateResult fromB, double lengthMeters, double lengthSigmaMeters = 0)
    {
        ArgumentNullException.ThrowIfNull(fromA);
        ArgumentNullException.ThrowIfNull(fromB);
        if (!(lengthMeters > 0) || !double.IsFinite(lengthMeters)) throw new InputException($"run length {lengthMeters.ToString(CultureInfo.InvariantCulture)} m must be a positive number; give --length");
        if (!(lengthSigmaMeters >= 0) || !double.IsFinite(lengthSigmaMeters)) throw new InputException("length uncertainty must be zero or positive");

        var a = Timed(fromA);
        var b = Timed(fromB);
        double rise = Math.Max(fromA.Characteristics.RiseTimeSeconds, fromB.Characteristics.RiseTimeSeconds);
        double nominalT = 2 * lengthMeters / (fromA.Options.VelocityFactor * PhysicalConstants.SpeedOfLightMetersPerSecond);
        var warnings = new List<string>();

        // The far ends: the last event from each side, when it is an open or a short. Either both are the run's ends
        // (t_A ≈ t_B ≈ T) or one full break seen from both sides (t_A + t_B = T); the stated VF tells which, since the
        // two readings differ by a factor of two.
        var sums = new List<(double T, double Sigma)>();
        TimedEvent? endA = a.Count > 0 && IsEnd(a[^1].Event) ? a[^1] : null;
        TimedEvent? endB = b.Count > 0 && IsEnd(b[^1].Event) ? b[^1] : null;
        if (endA is not null && endB is not null)
        {
            double s = endA.Seconds + endB.Seconds;
            bool ends = Math.Abs(Math.Log(s / 2 / nominalT)) < Math.Abs(Math.Log(s / nominalT));
            if (ends)
            {
                a.RemoveAt(a.Count - 1);
                b.RemoveAt(b.Count - 1);
                sums.Add((s / 2, Math.Sqrt(endA.Sigma * endA.Sigma + endB.Sigma * endB.Sigma) / 2));
            }
        }

        double tolerance(TimedEvent x, TimedEvent y, double tSigma) =>
            Math.Max(MatchSigmas * Math.Sqrt(x.Sigma * x.Sigma + y.Sigma * y.Sigma + tSigma * tSigma), MatchFloorRiseTimes * rise);

        // Without far ends, T is the pair sum that most events agree on (ties: nearest the stated VF's T).
        if (sums.Count == 0)
        {
            var hypotheses = a.SelectMany(x => b.Select(y => x.Seconds + y.Seconds)).ToList();
            if (hypotheses.Count == 0)
                throw new InputException("the two traces show no event in common and no far ends; check that both are of the same run and that it has a fault or an open/shorted end");
            double best = hypotheses
                .OrderByDescending(h => a.Count(x => b.Any(y => Math.Abs(x.Seconds + y.Seconds - h) <= tolerance(x, y, 0))))
                .ThenBy(h => Math.Abs(Math.Log(h / nominalT)))
                .First();
            sums.Add((best, double.PositiveInfinity));
        }

        // Pair greedily, closest sums first.
        double tGuess = sums[0].T, tGuessSigma = double.IsInfinity(sums[0].Sigma) ? 0 : sums[0].Sigma;
        var pairs = a.SelectMany(x => b.Select(y => (A: x, B: y, Miss: Math.Abs(x.Seconds + y.Seconds - tGuess))))
            .Where(p => p.Miss <= tolerance(p.A, p.B, tGuessSigma))
            .OrderBy(p => p.Miss)
            .ToList();
        var matched = new List<(TimedEvent A, TimedEvent B)>();
        var usedA = new HashSet<TimedEvent>(); var usedB = new HashSet<TimedEvent>();
        foreach (var p in pairs)
        {
            if (usedA.Contains(p.A) || usedB.Contains(p.B)) continue;
            usedA.Add(p.A); usedB.Add(p.B);
            matched.Add((p.A, p.B));
        }

        // T from every estimate, inverse-variance weighted (an estimate with zero σ is floored at 1 fs to stay finite).
        var estimates = sums.Where(s => double.IsFinite(s.Sigma))
            .Concat(matched.Select(m => (T: m.A.Seconds + m.B.Seconds, Sigma: Math.Sqrt(m.A.Sigma * m.A.Sigma + m.B.Sigma * m.B.Sigma))))
            .ToList();
        if (estimates.Count == 0) throw new InputException("the two traces show no event in common; check that both are of the same run");
        double weightSum = estimates.Sum(e => 1 / Math.Max(e.Sigma * e.Sigma, 1e-30));
        double t = estimates.Sum(e => e.T / Math.Max(e.Sigma * e.Sigma, 1e-30)) / weightSum;
        double tSigma = Math.Sqrt(1 / weightSum);

        double length = lengthMeters, sigmaL = lengthSigmaMeters;
        var events = new List<BothEndsEvent>();
        foreach (var (x, y) in matched)
        {
            double s = x.Seconds + y.Seconds;
            double d = length * x.Seconds / s;
            // ∂x/∂t_A = L·t_B/S², ∂x/∂t_B = −L·t_A/S², ∂x/∂L = x/L.
            double sigma = Math.Sqrt(Math.Pow(length * y.Seconds / (s * s) * x.Sigma, 2) + Math.Pow(length * x.Seconds / (s * s) * y.Sigma, 2)
                + Math.Pow(d / length * sigmaL, 2));
            events.Add(new BothEndsEvent(d, sigma, SeenFrom.BothEnds, x.Event, y.Event));
        }
        foreach (var x in a.Where(x => !usedA.Contains(x)))
        {
            double d = length * x.Seconds / t;
            double sigma = Math.Sqrt(Math.Pow(length / t * x.Sigma, 2) + Math.Pow(d / t * tSigma, 2) + Math.Pow(d / length * sigmaL, 2));
            events.Add(new BothEndsEvent(d, sigma, SeenFrom.EndAOnly, x.Event, null));
            warnings.Add(string.Create(CultureInfo.InvariantCulture, $"event at {fromA.Options.WarningDistance(d)} from A is seen from end A only; its position uses the end-to-end time, check it"));
        }
        foreach (var y in b.Where(y => !usedB.Contains(y)))
        {
            double dB = length * y.Seconds / t;
            double d = length - dB;
            double sigma = Math.Sqrt(Math.Pow(length / t * y.Sigma, 2) + Math.Pow(dB / t * tSigma, 2) + Math.Pow(d / length * sigmaL, 2));
            events.Add(new BothEndsEvent(d, sigma, SeenFrom.EndBOnly, null, y.Event));
            warnings.Add(string.Create(CultureInfo.InvariantCulture, $"event at {fromA.Options.WarningDistance(d)} from A is seen from end B only; its position uses the end-to-end time, check it"));
        }

        double c = PhysicalConstants.SpeedOfLightMetersPerSecond;
        double vf = 2 * length / (c * t);
        double vfSigma = vf * Math.Sqrt(Math.Pow(tSigma / t, 2) + Math.Pow(sigmaL / length, 2));
        if (!(vf > 0 && vf <= 1))
            warnings.Add(string.Create(CultureInfo.InvariantCulture, $"the pair implies VF {vf:0.###}, which is impossible: check --length and that both traces are of the same run"));
        return new BothEndsResult(length, events.OrderBy(e => e.DistanceFromAMeters).ToList(), t, tSigma, vf, vfSigma, warnings);
    }

    private static bool IsEnd(LocatedEvent e) => e.Kind is EventKind.Open or EventKind.Short;

    /// <summary>Events with their timing σ: σ_t = 2·σ_timing/v, where σ_timing² = σ_d² − (d·δVF/VF)² (Locator's sum).</summary>
    private static List<TimedEvent> Timed(LocateResult result)
    {
        double v = result.Options.VelocityFactor * PhysicalConstants.SpeedOfLightMetersPerSecond;
        double relative = result.Options.VelocityFactorRelativeSigma;
        return result.Events
            .Where(e => e.RoundTripSeconds > 0)
            .OrderBy(e => e.RoundTripSeconds)
            .Select(e =>
            {
                double timing = Math.Sqrt(Math.Max(0, e.DistanceSigmaMeters * e.DistanceSigmaMeters - Math.Pow(e.DistanceMeters * relative, 2)));
                return new TimedEvent(e, e.RoundTripSeconds, 2 * timing / v);
            })
            .ToList();
    }

    private sealed record TimedEvent(LocatedEvent Event, double Seconds, double Sigma);
}
