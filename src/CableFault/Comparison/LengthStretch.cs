using CableFault.Analysis;
using CableFault.Traces;
using MathNet.Numerics.Interpolation;

namespace CableFault.Comparison;

/// <summary>
/// Absorbs a uniform difference of electrical length between two runs (pairs of one cable twisted at different lay
/// lengths, or insulated slightly differently): picks a common far event of both runs, fits the time scale s that best
/// carries the current trace onto the reference around it, and resamples the current trace at s·t so that both share one
/// time axis.
/// </summary>
internal static class LengthStretch
{
    /// <summary>
    /// Nearest event a stretch is fitted on, m: 5. An event's position is read to a few centimetres (the fit's σ), which
    /// at 5 m is already 1 % of the distance; nearer events would turn their reading error into a false length change.
    /// </summary>
    internal const double MinimumFitDistanceMeters = 5;

    /// <summary>Smallest |ρ| of an event a stretch is fitted on: 0.2. Ends, taps and large impedance steps are read to
    /// centimetres; small events are placed less surely and are exactly what a fault would add or move.</summary>
    internal const double MinimumFitReflection = 0.2;

    /// <summary>Steps of the scale search across ±limit: 200, i.e. 0.04 % steps for a ±4 % limit, refined by a parabola
    /// through the best three.</summary>
    private const int SearchSteps = 200;

    /// <summary>
    /// Smallest share of the reference's variance around the anchor that the stretched current trace must explain for the
    /// stretch to count: 0.9. The same far end seen on two healthy pairs (or on a pair with a leak before it, which only
    /// scales the echo) matches to well above 0.95; a pair broken earlier shows no edge there and explains almost nothing.
    /// </summary>
    internal const double MinimumExplainedShare = 0.9;

    /// <summary>Range of the fitted gain a of the current trace's echo: 0.5–2. A leak or a different Z₀ scales the far
    /// echo by tens of percent; an echo at half or double the height is a different event, not the same end.</summary>
    internal const double MaximumGain = 2, MinimumGain = 0.5;

    /// <summary>
    /// Round-trip time of the event the stretch is anchored on, s: the farthest event of the reference with
    /// |ρ| ≥ <see cref="MinimumFitReflection"/> beyond <see cref="MinimumFitDistanceMeters"/> (normally its far end, the
    /// one event every pair of a cable shares, and the farthest gives the smallest relative error); when the locator
    /// found none, the steepest edge of the reference trace beyond that distance. Only the reference is used: it is the
    /// healthy pair, and the suspect's own events are what is being checked.
    /// </summary>
    internal static double? AnchorSeconds(IReadOnlyList<LocatedEvent> reference, Trace referenceTrace, double velocityMetersPerSecond)
    {
        var located = reference.Where(e => e.DistanceMeters >= MinimumFitDistanceMeters && Math.Abs(e.Reflection) >= MinimumFitReflection)
            .MaxBy(e => e.DistanceMeters);
        if (located is not null) return located.RoundTripSeconds;
        double nearest = 2 * MinimumFitDistanceMeters / velocityMetersPerSecond;
        var times = referenceTrace.TimesSeconds();
        var y = referenceTrace.SamplesVolts;
        int h = Math.Max(4, (int)Math.Ceiling(1e-9 / referenceTrace.SampleIntervalSeconds)); // slope over ±1 ns
        double bestSlope = 0; double? at = null;
        for (int k = h; k < times.Length - h; k++)
        {
            if (times[k] < nearest) continue;
            double slope = Math.Abs(y[k + h] - y[k - h]);
            if (slope > bestSlope) { bestSlope = slope; at = times[k]; }
        }
        return bestSlope > MinimumFitReflection / 2 ? at : null;
    }

    /// <summary>
    /// The scale s in [1 − limit, 1 + limit] that best carries the current trace onto the reference around the anchor at
    /// round-trip time <paramref name="anchorSeconds"/>: least squares of ref(t) − (a·cur(s·t) + b) over
    /// t ∈ anchor·[1 − 2·limit, 1 + 2·limit], with gain a &gt; 0 and offset b fitted for each s (they absorb the other
    /// pair's different echo height and level). Whole-waveform matching, not the locator's event positions, because two
    /// edges dispersed alike by the same loss line up far better than either is located. Null when the best s lies on
    /// the edge of the range (the true one may be beyond it), the window is too short, or the best match explains less than
    /// <see cref="MinimumExplainedShare"/> of the reference's variance there or needs a gain outside
    /// <see cref="MinimumGain"/>–<see cref="MaximumGain"/> (no common event: the current run ends elsewhere).
    /// </summary>
    internal static double? Refine(Trace reference, Trace current, double anchorSeconds, double limitFraction)
    {
        var times = reference.TimesSeconds();
        var curTimes = current.TimesSeconds();
        var spline = CubicSpline.InterpolateNaturalSorted(curTimes, current.SamplesVolts.ToArray());
        double from = anchorSeconds * (1 - 2 * limitFraction), to = anchorSeconds * (1 + 2 * limitFraction);
        double lastAllowed = curTimes[^1] / (1 + limitFraction);
        var window = new List<int>();
        for (int k = 0; k < times.Length; k++)
            if (times[k] >= from && times[k] <= Math.Min(to, lastAllowed)) window.Add(k);
        if (window.Count < 16) return null;

        double variance = 0;
        (double Residual, double Gain) Fit(double scale)
        {
            double sx = 0, sy = 0, sxx = 0, sxy = 0, syy = 0;
            int n = window.Count;
            foreach (int k in window)
            {
                double x = spline.Interpolate(times[k] * scale), y = reference.SamplesVolts[k];
                sx += x; sy += y; sxx += x * x; sxy += x * y; syy += y * y;
            }
            double vxx = sxx - sx * sx / n, vxy = sxy - sx * sy / n, vyy = syy - sy * sy / n;
            variance = vyy;
            if (!(vxx > 0)) return (vyy, 0);
            double gain = vxy / vxx;
            return gain > 0 ? (vyy - vxy * gain, gain) : (vyy, gain); // residual of the best line, or of none when it would invert
        }
        double Cost(double scale) => Fit(scale).Residual;

        var costs = new double[2 * SearchSteps + 1];
        int best = 0;
        for (int i = 0; i < costs.Length; i++)
        {
            costs[i] = Cost(1 + limitFraction * (i - SearchSteps) / SearchSteps);
            if (costs[i] < costs[best]) best = i;
        }
        if (best == 0 || best == costs.Length - 1) return null;
        double step = limitFraction / SearchSteps;
        double curvature = costs[best - 1] - 2 * costs[best] + costs[best + 1];
        double offset = curvature > 0 ? 0.5 * (costs[best - 1] - costs[best + 1]) / curvature : 0;
        double fitted = 1 + step * (best - SearchSteps + Math.Clamp(offset, -0.5, 0.5));
        var (residual, gain) = Fit(fitted);
        if (!(variance > 0) || 1 - residual / variance < MinimumExplainedShare || gain < MinimumGain || gain > MaximumGain) return null;
        return fitted;
    }

    /// <summary>
    /// The current trace read at s·t on the reference's grid (natural cubic spline, MathNet) for t ≥ 0, unchanged before
    /// the incident edge (t &lt; 0, where nothing has propagated), and both traces cut to the samples whose stretched time
    /// lies inside the current record.
    /// </summary>
    internal static (Trace Reference, Trace Current) Apply(Trace reference, Trace current, double scale)
    {
        var times = current.TimesSeconds();
        var spline = CubicSpline.InterpolateNaturalSorted(times, current.SamplesVolts.ToArray());
        double last = times[^1];
        var y = new List<double>(times.Length);
        for (int k = 0; k < times.Length; k++)
        {
            double t = times[k] < 0 ? times[k] : times[k] * scale;
            if (t > last) break;
            y.Add(t == times[k] ? current.SamplesVolts[k] : spline.Interpolate(t));
        }
        var cutReference = reference.WithSamples(reference.SamplesVolts.ToArray().Take(y.Count));
        return (cutReference, current.WithSamples(y));
    }
}
