using CableFault.Traces;

namespace CableFault.Benchmarks.Accuracy;

/// <summary>
/// The baseline the issue asks <c>locate</c> to beat, scored on the same traces: the far end at the first 50 % crossing
/// after the incident edge; every other event at a threshold crossing of the derivative. It knows the VF and nothing else.
/// </summary>
/// <remarks>
/// Steps: baseline = mean of the first 16 samples; derivative D = 3-point central difference, smoothed by a 3-sample
/// moving average; its noise σ_D = 1.4826·MAD over the samples before the edge; threshold θ = max(6σ_D, 1 % of the incident
/// edge's peak |D|). The incident edge is the first |D| above half the largest |D| in the record; its rise is estimated from
/// the width of that derivative peak (FWHM ≈ 0.92·t_rise for a Gaussian edge). Incident level A = mean over 1.5–2.5 rise
/// times after the edge; final level F = mean of the last 5 % of the record; time zero t₀ = the 50 % crossing between
/// baseline and A. Far end (when |F − A| &gt; 5 % of the step): the first crossing of (A + F)/2 after t₀ + 1.5 t_rise.
/// Other events: each rise of |D| through θ after the incident edge has fallen back below θ/2, before the far end
/// (those within 2 u of it are taken as the far end itself). Distance d = v·(t − t₀)/2.
/// </remarks>
public static class NaiveLocator
{
    public static IReadOnlyList<double> Locate(Trace trace, double velocityFactor)
    {
        var y = trace.SamplesVolts;
        int n = y.Length;
        double dt = trace.SampleIntervalSeconds;
        double v = velocityFactor * PhysicalConstants.SpeedOfLightMetersPerSecond;
        double baseline = 0;
        for (int i = 0; i < 16; i++) baseline += y[i] / 16;

        var raw = new double[n];
        for (int i = 1; i < n - 1; i++) raw[i] = (y[i + 1] - y[i - 1]) / 2;
        var d = new double[n];
        for (int i = 2; i < n - 2; i++) d[i] = (raw[i - 1] + raw[i] + raw[i + 1]) / 3;

        double peak = 0;
        for (int i = 0; i < n; i++) peak = Math.Max(peak, Math.Abs(d[i]));
        int edge = 0;
        while (edge < n && Math.Abs(d[edge]) < peak / 2) edge++;
        while (edge + 1 < n && Math.Abs(d[edge + 1]) >= Math.Abs(d[edge])) edge++; // to the edge's derivative peak
        double edgePeak = Math.Abs(d[edge]);
        int left = edge, right = edge;
        while (left > 0 && Math.Abs(d[left]) > edgePeak / 2) left--;
        while (right < n - 1 && Math.Abs(d[right]) > edgePeak / 2) right++;
        double riseSeconds = Math.Max(2, right - left) * dt / 0.92;
        int riseSamples = Math.Max(1, (int)Math.Round(riseSeconds / dt));

        var before = d.Take(Math.Max(8, left - 2 * riseSamples)).Skip(2).Select(Math.Abs).OrderBy(x => x).ToArray();
        double sigma = before.Length > 0 ? 1.4826 * before[before.Length / 2] : 0;
        double threshold = Math.Max(6 * sigma, 0.01 * edgePeak);

        double incident = Mean(y, edge + (int)(1.5 * riseSamples), edge + (int)(2.5 * riseSamples) + 1);
        double final = Mean(y, n - n / 20, n);
        double t0 = Crossing(y, trace, left, (baseline + incident) / 2) ?? trace.TimeAt(edge);
        double step = incident - baseline;

        double? farTime = null;
        if (Math.Abs(final - incident) > 0.05 * Math.Abs(step))
            farTime = Crossing(y, trace, (int)Math.Ceiling((t0 + 1.5 * riseSeconds - trace.StartTimeSeconds) / dt), (incident + final) / 2);

        var events = new List<double>();
        double mergeSeconds = 2 * riseSeconds; // 2 u of distance is 2 rise times of round trip
        int start = edge;
        while (start < n && Math.Abs(d[start]) >= threshold / 2) start++;
        bool armed = true;
        for (int i = start; i < n - 2; i++)
        {
            double a = Math.Abs(d[i]);
            if (armed && a >= threshold)
            {
                double previous = Math.Abs(d[i - 1]);
                double t = trace.TimeAt(i - 1) + dt * (threshold - previous) / (a - previous);
                if (farTime is double far && t > far - mergeSeconds) break;
                events.Add(v * (t - t0) / 2);
                armed = false;
            }
            else if (!armed && a < threshold / 2) armed = true;
        }
        if (farTime is double farEnd) events.Add(v * (farEnd - t0) / 2);
        return events;
    }

    private static double Mean(IReadOnlyList<double> y, int from, int to)
    {
        from = Math.Clamp(from, 0, y.Count - 1);
        to = Math.Clamp(to, from + 1, y.Count);
        double sum = 0;
        for (int i = from; i < to; i++) sum += y[i];
        return sum / (to - from);
    }

    /// <summary>Time of the first crossing of <paramref name="level"/> at or after sample <paramref name="from"/>, linearly
    /// interpolated; null when there is none.</summary>
    private static double? Crossing(IReadOnlyList<double> y, Trace trace, int from, double level)
    {
        for (int i = Math.Max(1, from); i < y.Count; i++)
        {
            double a = y[i - 1] - level, b = y[i] - level;
            if (a == 0) return trace.TimeAt(i - 1);
            if (a * b < 0) return trace.TimeAt(i - 1) + trace.SampleIntervalSeconds * a / (a - b);
        }
        return null;
    }
}
