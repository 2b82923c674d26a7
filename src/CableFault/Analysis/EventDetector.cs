using CableFault.Traces;

namespace CableFault.Analysis;

/// <summary>
/// Finds the places where the run changes from the layer-peeled impedance profile, rejecting noise and
/// multiple-reflection ghosts.
/// </summary>
/// <remarks>
/// <para>Detection runs on the log-impedance q_j = ln(Z_j / Z_0): a boundary from Z_a to Z_b changes q by
/// ln(Z_b/Z_a) = 2·atanh(k), so step sizes add along the run and convert back to a local reflection k = tanh(Δq/2).
/// The detector is a matched box difference D(j) = mean(q[j, j+w)) − mean(q[j−w, j)) with w ≈ one rise time of
/// layers, which peaks at the start of the layer where the impedance changes.</para>
/// <para>Threshold: <see cref="DefaultThresholdSigma"/> = 5 standard deviations of D's noise (estimated robustly as
/// 1.4826·MAD of D over the profile, and never below the noise expected from the trace's own noise). For Gaussian
/// noise P(|D| &gt; 5σ) = 5.7·10⁻⁷, so even a 32 768-layer profile expects fewer than 0.02 false events. A floor of
/// <see cref="MinimumLogImpedanceStep"/> ignores the impedance wander every real cable has.</para>
/// <para>Ghosts: layer peeling removes multiple reflections by construction. As a backstop (residual ghosts survive
/// where loss or band-limiting make the peeling imperfect), a candidate arriving at t_i + t_j − t_k of three earlier
/// boundaries (k before i and j) whose size is within twice |k_i·k_j·k_k| plus the noise is dropped.</para>
/// </remarks>
public static class EventDetector
{
    /// <summary>Default detection threshold, in standard deviations of the difference noise.</summary>
    public const double DefaultThresholdSigma = 5.0;

    /// <summary>Smallest change of ln Z reported, 0.01 (≈ 0.5 Ω on 50 Ω, Δρ ≈ 0.005): below the ±2 Ω tolerance of
    /// ordinary cable (common practice), so such wander is not a fault.</summary>
    public const double MinimumLogImpedanceStep = 0.01;

    /// <summary>A local reflection beyond this magnitude at the end of the profile is reported as an open or short
    /// (no impedance after it).</summary>
    public const double EndReflectionMagnitude = 0.9;

    /// <summary>Event candidates, in order of round-trip time.</summary>
    /// <param name="aligned">Aligned trace (used for its time grid).</param>
    /// <param name="characteristics">Trace characteristics (rise time, noise).</param>
    /// <param name="profile">Layer-peeled profile of the same trace.</param>
    /// <param name="thresholdSigma">Detection threshold in noise standard deviations (&gt; 0).</param>
    public static IReadOnlyList<EventCandidate> Detect(Trace aligned, TraceCharacteristics characteristics,
        ImpedanceProfile profile, double thresholdSigma = DefaultThresholdSigma)
    {
        ArgumentNullException.ThrowIfNull(aligned);
        ArgumentNullException.ThrowIfNull(characteristics);
        ArgumentNullException.ThrowIfNull(profile);
        if (!(thresholdSigma > 0)) throw new ArgumentOutOfRangeException(nameof(thresholdSigma), "The threshold must be positive.");
        int m = profile.Length;
        if (m < 8) return [];

        double z0 = profile.ImpedanceOhms[0];
        double layerSeconds = profile.RoundTripSecondsAt(profile.LayerThicknessMeters);
        int w = Math.Max(2, (int)Math.Round(characteristics.RiseTimeSeconds / layerSeconds));
        var q = new double[m + w];
        for (int j = 0; j < m; j++) q[j] = Math.Log(Math.Max(profile.ImpedanceOhms[j], 1e-9) / z0);
        for (int j = m; j < q.Length; j++) q[j] = q[m - 1];      // hold the last level so a final climb is seen
        bool truncated = profile.DistancesMeters[m - 1] < aligned.EndTimeSeconds * profile.VelocityMetersPerSecond / 2 - 4 * profile.LayerThicknessMeters;

        // Box difference via prefix sums; it is defined from the end of the blind zone on.
        var prefix = new double[q.Length + 1];
        for (int j = 0; j < q.Length; j++) prefix[j + 1] = prefix[j] + q[j];
        int first = Math.Max(w, (int)Math.Ceiling(LayerPeeling.BlindZoneRiseTimes * characteristics.RiseTimeSeconds / layerSeconds) + 1);
        int last = m;                                               // D(j) for j ≤ m uses the held tail
        if (last - first < 4) return [];
        var d = new double[last + 1];
        for (int j = first; j <= last; j++)
            d[j] = (prefix[j + w] - prefix[j]) / w - (prefix[j] - prefix[j - w]) / w;

        double sigma = DifferenceNoise(d, first, last, characteristics, w, layerSeconds, aligned.SampleIntervalSeconds);
        double threshold = Math.Max(thresholdSigma * sigma, MinimumLogImpedanceStep);

        var regions = FindRegions(d, first, last, threshold, w);
        var candidates = new List<(EventCandidate C, double K)>();
        int transientEnd = -1_000_000_000;
        double transientBefore = 0;
        for (int r = 0; r < regions.Count; r++)
        {
            var (start, end, peak) = regions[r];
            int prevEnd = r > 0 ? regions[r - 1].End : first - w;
            int nextStart = r + 1 < regions.Count ? regions[r + 1].Start : q.Length;
            double before = Level(q, Math.Max(prevEnd + 1, start - w / 2 - 3 * w), start - w / 2, start - 1);
            double after = Level(q, end + w / 2, Math.Min(nextStart - 1, end + w / 2 + 3 * w), end + 1);
            double snr = Math.Abs(d[peak]) / sigma;
            double time = TimeAt(profile, RefinePeak(d, peak, first, last));

            // A transient: the next region has the opposite sign, follows closely and the level comes back.
            if (r + 1 < regions.Count && Math.Sign(d[regions[r + 1].Peak]) != Math.Sign(d[peak])
                && regions[r + 1].Start - end <= 4 * w)
            {
                var next = regions[r + 1];
                int nextNextStart = r + 2 < regions.Count ? regions[r + 2].Start : q.Length;
                double afterPair = Level(q, next.End + w / 2, Math.Min(nextNextStart - 1, next.End + w / 2 + 3 * w), next.End + 1);
                double excursion = Extreme(q, start, next.End, before);
                if (Math.Abs(afterPair - before) < 0.5 * Math.Abs(excursion))
                {
                    var shape = excursion < 0 ? CandidateShape.Dip : CandidateShape.Bump;
                    candidates.Add((new EventCandidate(time, Math.Tanh(excursion / 2), shape, snr, null), Math.Tanh(excursion / 2)));
                    transientEnd = next.End;
                    transientBefore = before;
                    r++;
                    continue;
                }
            }

            // The slow recovery of a transient crosses the threshold again: it is no new event if the level ends
            // where it was before the transient.
            if (start - transientEnd <= 4 * w && Math.Abs(after - transientBefore) < 2 * threshold) continue;

            double k = Math.Tanh((after - before) / 2);
            bool isEnd = truncated && r == regions.Count - 1;
            // Peeling stops where the impedance leaves [Z0/19, 19·Z0]: nothing measurable passes beyond, so the
            // last climb is an open (+1) or a short (−1).
            if (isEnd && Math.Abs(k) > 0.5) k = Math.Sign(k);
            double? zAfter = Math.Abs(k) >= EndReflectionMagnitude ? null : z0 * Math.Exp(after);
            candidates.Add((new EventCandidate(time, k, CandidateShape.Step, snr, zAfter), k));
        }

        return RejectGhosts(candidates, Math.Max(characteristics.RiseTimeSeconds, 2 * layerSeconds), sigma);
    }

    private static double DifferenceNoise(double[] d, int first, int last, TraceCharacteristics c, int w, double layerSeconds, double sampleSeconds)
    {
        var values = new double[last - first + 1];
        Array.Copy(d, first, values, 0, values.Length);
        double robust = NoiseEstimator.MadToSigma * NoiseEstimator.MedianAbsoluteDeviation(values);
        // Expected: a layer's q carries about 2·σ_ρ of noise (dq ≈ 2 dρ for small ρ), σ_ρ = σ_v / A / √(block);
        // the box difference of two w-layer means has √(2/w) of that.
        double block = Math.Max(1, layerSeconds / sampleSeconds);
        double expected = 2 * c.NoiseRelative / Math.Sqrt(block) * Math.Sqrt(2.0 / w);
        return Math.Max(robust, double.IsFinite(expected) ? expected : 0);
    }

    private static List<(int Start, int End, int Peak)> FindRegions(double[] d, int first, int last, double threshold, int w)
    {
        var regions = new List<(int Start, int End, int Peak)>();
        int j = first;
        while (j <= last)
        {
            if (Math.Abs(d[j]) <= threshold) { j++; continue; }
            int sign = Math.Sign(d[j]), start = j, peak = j;
            while (j <= last && Math.Sign(d[j]) == sign && Math.Abs(d[j]) > threshold)
            {
                if (Math.Abs(d[j]) > Math.Abs(d[peak])) peak = j;
                j++;
            }
            // Same-sign regions closer than the box width are one event split by noise.
            if (regions.Count > 0 && Math.Sign(d[regions[^1].Peak]) == sign && start - regions[^1].End <= w)
            {
                var p = regions[^1];
                regions[^1] = (p.Start, j - 1, Math.Abs(d[peak]) > Math.Abs(d[p.Peak]) ? peak : p.Peak);
            }
            else regions.Add((start, j - 1, peak));
        }
        return regions;
    }

    private static double Level(double[] q, int from, int to, int fallback)
    {
        from = Math.Clamp(from, 0, q.Length - 1);
        to = Math.Clamp(to, 0, q.Length - 1);
        if (to < from) return q[Math.Clamp(fallback, 0, q.Length - 1)];
        return NoiseEstimator.Median(q[from..(to + 1)]);
    }

    private static double Extreme(double[] q, int from, int to, double reference)
    {
        double best = 0;
        for (int j = Math.Max(0, from); j <= Math.Min(q.Length - 1, to); j++)
            if (Math.Abs(q[j] - reference) > Math.Abs(best)) best = q[j] - reference;
        return best;
    }

    private static double RefinePeak(double[] d, int peak, int first, int last)
    {
        if (peak <= first || peak >= last) return peak;
        double a = Math.Abs(d[peak - 1]), b = Math.Abs(d[peak]), c = Math.Abs(d[peak + 1]);
        double denominator = a - 2 * b + c;
        // The vertex of the parabola through the three points; a neighbour past a change of sign can be larger than the
        // peak in magnitude, and the vertex then flies off: it is kept within half a layer of the peak sample.
        return denominator < 0 ? peak + Math.Clamp(0.5 * (a - c) / denominator, -0.5, 0.5) : peak;
    }

    private static double TimeAt(ImpedanceProfile profile, double index)
    {
        int i = Math.Clamp((int)Math.Floor(index), 0, profile.Length - 1);
        double frac = index - i;
        double dist = i + 1 < profile.Length
            ? profile.DistancesMeters[i] + frac * (profile.DistancesMeters[i + 1] - profile.DistancesMeters[i])
            : profile.DistancesMeters[i];
        return profile.RoundTripSecondsAt(dist);
    }

    private static List<EventCandidate> RejectGhosts(List<(EventCandidate C, double K)> found, double toleranceSeconds, double sigma)
    {
        var kept = new List<EventCandidate>();
        int n = Math.Min(found.Count, 64);
        for (int c = 0; c < found.Count; c++)
        {
            var (cand, kc) = found[c];
            bool ghost = false;
            for (int i = 0; i < Math.Min(c, n) && !ghost; i++)
            for (int j = i; j < Math.Min(c, n) && !ghost; j++)
            for (int k = 0; k < Math.Min(Math.Min(i, j), n) && !ghost; k++)
            {
                double t = found[i].C.RoundTripSeconds + found[j].C.RoundTripSeconds - found[k].C.RoundTripSeconds;
                if (Math.Abs(t - cand.RoundTripSeconds) > toleranceSeconds) continue;
                double predicted = Math.Abs(found[i].K * found[j].K * found[k].K);
                if (Math.Abs(kc) <= 2 * predicted + 3 * sigma) ghost = true;
            }
            if (!ghost) kept.Add(cand);
        }
        return kept;
    }
}
