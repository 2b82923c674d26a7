namespace CableFault.Analysis;

/// <summary>
/// State levels by the histogram mode method of IEEE Std 181-2011 (5.2.1.3, Annex A): the level is the centre of the
/// most populated histogram bin of the samples in a region where the waveform sits in one state.
/// </summary>
internal static class StateLevelEstimator
{
    /// <summary>
    /// Mode of the histogram of <paramref name="samples"/>, refined as the mean of the samples in the modal bin and
    /// its two neighbours (the standard leaves bin count to the user; √n bins, 5…64, balances bin noise and width).
    /// Falls back to the mean when the samples span (almost) no range.
    /// </summary>
    public static double HistogramMode(ReadOnlySpan<double> samples)
    {
        int n = samples.Length;
        if (n == 0) return double.NaN;
        double min = double.PositiveInfinity, max = double.NegativeInfinity, sum = 0;
        foreach (double x in samples) { if (x < min) min = x; if (x > max) max = x; sum += x; }
        double mean = sum / n;
        double range = max - min;
        if (n < 5 || range <= 1e-12 * Math.Max(1, Math.Abs(mean))) return mean;
        int bins = Math.Clamp((int)Math.Sqrt(n), 5, 64);
        var counts = new int[bins];
        double width = range / bins;
        foreach (double x in samples) counts[Math.Min(bins - 1, (int)((x - min) / width))]++;
        int mode = 0;
        for (int b = 1; b < bins; b++) if (counts[b] > counts[mode]) mode = b;
        double lo = min + (mode - 1) * width, hi = min + (mode + 2) * width;
        double s = 0; int c = 0;
        foreach (double x in samples) if (x >= lo && x <= hi) { s += x; c++; }
        return c > 0 ? s / c : mean;
    }
}
