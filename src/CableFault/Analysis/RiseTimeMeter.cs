namespace CableFault.Analysis;

/// <summary>
/// Reference-level instants and transition duration (IEEE Std 181-2011, 5.3.3 and 5.3.4): the time a waveform
/// crosses a reference level, found by linear interpolation between the two samples that bracket it.
/// </summary>
public static class RiseTimeMeter
{
    /// <summary>Lower reference level of the transition duration, as a fraction of the amplitude (IEEE 181: 10 %).</summary>
    public const double LowerReferenceFraction = 0.1;

    /// <summary>Upper reference level (IEEE 181: 90 %).</summary>
    public const double UpperReferenceFraction = 0.9;

    /// <summary>
    /// Fractional sample index at which <paramref name="samples"/> first crosses <paramref name="level"/> going in
    /// direction <paramref name="sign"/> (+1 rising, −1 falling), searching from <paramref name="from"/> to
    /// <paramref name="to"/> (inclusive). Linear interpolation: i + (level − x_i) / (x_{i+1} − x_i). NaN when none.
    /// </summary>
    public static double CrossingIndex(ReadOnlySpan<double> samples, double level, int sign, int from, int to)
    {
        from = Math.Max(0, from);
        to = Math.Min(samples.Length - 1, to);
        for (int i = from; i < to; i++)
        {
            double a = sign * (samples[i] - level), b = sign * (samples[i + 1] - level);
            if (a < 0 && b >= 0) return i + a / (a - b);
        }
        return double.NaN;
    }

    /// <summary>
    /// 10–90 % transition duration in samples between <paramref name="baseline"/> and <paramref name="top"/>
    /// (state levels), searching the crossings nearest the 50 % crossing at <paramref name="midIndex"/>.
    /// NaN when either crossing is missing.
    /// </summary>
    public static double TransitionDurationSamples(ReadOnlySpan<double> samples, double baseline, double top, double midIndex)
    {
        int sign = top > baseline ? 1 : -1;
        double l10 = baseline + LowerReferenceFraction * (top - baseline);
        double l90 = baseline + UpperReferenceFraction * (top - baseline);
        int mid = (int)Math.Floor(midIndex);
        // The 10 % instant is the last lower-level crossing before the middle, the 90 % instant the first after it.
        double t10 = double.NaN;
        for (int i = mid; i >= 0 && i + 1 < samples.Length; i--)
        {
            double a = sign * (samples[i] - l10), b = sign * (samples[i + 1] - l10);
            if (a < 0 && b >= 0) { t10 = i + a / (a - b); break; }
        }
        double t90 = CrossingIndex(samples, l90, sign, Math.Max(0, mid - 1), samples.Length - 1);
        return t90 - t10;
    }
}
