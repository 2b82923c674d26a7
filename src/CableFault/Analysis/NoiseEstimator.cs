namespace CableFault.Analysis;

/// <summary>
/// Robust estimates of white-noise RMS from samples that also hold slow trends and a few outliers.
/// </summary>
/// <remarks>
/// <para>For Gaussian noise the median absolute deviation (MAD) times 1.4826 (= 1/Φ⁻¹(3/4)) estimates σ
/// (Rousseeuw &amp; Croux, "Alternatives to the median absolute deviation", JASA 88(424), 1993, eq. 1.1).
/// Unlike the standard deviation it ignores up to half the samples being outliers (glitches, a stray edge).</para>
/// <para>Why first differences: d_i = x_{i+1} − x_i removes any offset and almost all of a slow drift (a drift of
/// slope s adds only s·Δt to each difference), while white noise of RMS σ gives differences of RMS σ·√2. So
/// σ ≈ 1.4826 · MAD(d) / √2. Neighbouring differences are correlated (−1/2), which leaves the estimate unbiased
/// but raises its spread a little over the i.i.d. case (relative standard error about √(1.36 / n) for n i.i.d.
/// samples, the MAD's 37 % Gaussian efficiency, ibid.). Coloured (low-pass filtered) noise is under-estimated by
/// differencing; the characteriser compares with the detrended-baseline estimate and keeps the larger.</para>
/// </remarks>
public static class NoiseEstimator
{
    /// <summary>Consistency factor 1/Φ⁻¹(0.75) = 1.482602218505602 turning a MAD into σ for Gaussian data.</summary>
    public const double MadToSigma = 1.482602218505602;

    /// <summary>σ from the first differences: 1.4826 · MAD(x_{i+1} − x_i) / √2, in the samples' unit. Needs ≥ 3 samples.</summary>
    public static double FromDifferences(ReadOnlySpan<double> samples)
    {
        if (samples.Length < 3) return double.NaN;
        var d = new double[samples.Length - 1];
        for (int i = 0; i < d.Length; i++) d[i] = samples[i + 1] - samples[i];
        return MadToSigma * MedianAbsoluteDeviation(d) / Math.Sqrt(2);
    }

    /// <summary>σ from the residuals of a least-squares straight line through the samples: 1.4826 · MAD(residuals).
    /// Catches low-pass filtered noise that differencing under-reads. Needs ≥ 3 samples.</summary>
    public static double FromDetrended(ReadOnlySpan<double> samples)
    {
        int n = samples.Length;
        if (n < 3) return double.NaN;
        double mx = (n - 1) / 2.0, my = 0;
        for (int i = 0; i < n; i++) my += samples[i];
        my /= n;
        double sxy = 0, sxx = 0;
        for (int i = 0; i < n; i++) { sxy += (i - mx) * (samples[i] - my); sxx += (i - mx) * (i - mx); }
        double slope = sxy / sxx;
        var r = new double[n];
        for (int i = 0; i < n; i++) r[i] = samples[i] - (my + slope * (i - mx));
        return MadToSigma * MedianAbsoluteDeviation(r);
    }

    /// <summary>Median of |x − median(x)|. The array is reordered.</summary>
    internal static double MedianAbsoluteDeviation(double[] values)
    {
        double m = Median(values);
        for (int i = 0; i < values.Length; i++) values[i] = Math.Abs(values[i] - m);
        return Median(values);
    }

    /// <summary>Median (the array is reordered; O(n) selection).</summary>
    internal static double Median(double[] values)
    {
        int n = values.Length;
        if (n == 0) return double.NaN;
        double hi = Select(values, n / 2);
        if (n % 2 == 1) return hi;
        double lo = double.NegativeInfinity;
        for (int i = 0; i < n / 2; i++) if (values[i] > lo) lo = values[i];
        return (lo + hi) / 2;
    }

    /// <summary>Quickselect: places the k-th smallest at index k with smaller ones before it.</summary>
    private static double Select(double[] a, int k)
    {
        int left = 0, right = a.Length - 1;
        var rng = new Random(12345);
        while (right > left)
        {
            double pivot = a[left + rng.Next(right - left + 1)];
            int i = left, j = right;
            while (i <= j)
            {
                while (a[i] < pivot) i++;
                while (a[j] > pivot) j--;
                if (i <= j) { (a[i], a[j]) = (a[j], a[i]); i++; j--; }
            }
            if (k <= j) right = j;
            else if (k >= i) left = i;
            else break;
        }
        return a[k];
    }
}
