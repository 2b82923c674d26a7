namespace CableFault.FrequencyDomain;

/// <summary>
/// Resolution figures of a windowed transform, evaluated from the window itself in closed form (no sampling error).
/// </summary>
/// <remarks>
/// Low-pass: the window over harmonics −K … K, w_(−k) = w_k, has the periodic impulse h(t) = Δf·[w₀ + 2Σ w_k cos 2πkΔf t]
/// and the step s(t) = ∫₀ᵗ h = w₀Δf·t + Σ_(k≥1) w_k sin(2πkΔf t)/(πk), which is odd in t and rises by w₀ = 1 across t = 0.
/// The 10–90 % rise is therefore 2·t₄₀ with s(t₄₀) = 0.4. Band-pass: the envelope |Σ_i w_i e^(j2πiΔf t)| / Σ_i w_i.
/// </remarks>
internal static class TransformFigures
{
    /// <summary>10–90 % rise time of the low-pass step of half-window <paramref name="half"/> (w[0] = 1) at step Δf, s.</summary>
    internal static double StepRiseSeconds(IReadOnlyList<double> half, double stepHz)
    {
        double Step(double t)
        {
            double s = half[0] * stepHz * t;
            for (int k = 1; k < half.Count; k++) s += half[k] * Math.Sin(2 * Math.PI * k * stepHz * t) / (Math.PI * k);
            return s / half[0];
        }
        return 2 * FirstCrossing(t => Step(t) - 0.4, half.Count, stepHz);
    }

    /// <summary>Full width at half amplitude of the low-pass impulse, s.</summary>
    internal static double LowPassImpulseWidthSeconds(IReadOnlyList<double> half, double stepHz)
    {
        double peak = half[0] + 2 * half.Skip(1).Sum();
        double H(double t)
        {
            double h = half[0];
            for (int k = 1; k < half.Count; k++) h += 2 * half[k] * Math.Cos(2 * Math.PI * k * stepHz * t);
            return h;
        }
        return 2 * FirstCrossing(t => peak / 2 - H(t), half.Count, stepHz);
    }

    /// <summary>Full width at half amplitude of the band-pass impulse envelope for window <paramref name="weights"/> over a band of step Δf, s.</summary>
    internal static double BandPassImpulseWidthSeconds(IReadOnlyList<double> weights, double stepHz)
    {
        double sum = weights.Sum();
        double centre = (weights.Count - 1) / 2.0; // measuring phase from the band centre keeps the sum small and exact
        double Envelope(double t)
        {
            double re = 0, im = 0;
            for (int i = 0; i < weights.Count; i++)
            {
                double phase = 2 * Math.PI * (i - centre) * stepHz * t;
                re += weights[i] * Math.Cos(phase);
                im += weights[i] * Math.Sin(phase);
            }
            return Math.Sqrt(re * re + im * im) / sum;
        }
        return 2 * FirstCrossing(t => 0.5 - Envelope(t), weights.Count, stepHz);
    }

    /// <summary>
    /// Smallest t &gt; 0 where <paramref name="g"/> changes from negative to ≥ 0, found by scanning in steps of 1/(16·N·Δf)
    /// (a small fraction of any edge the N points can make) and then bisecting to 10⁻¹² of the scan step.
    /// </summary>
    private static double FirstCrossing(Func<double, double> g, int points, double stepHz)
    {
        double scan = 1.0 / (16.0 * points * stepHz);
        double period = 1.0 / stepHz;
        double lo = 0;
        for (double hi = scan; hi < period / 2; hi += scan)
        {
            if (g(hi) >= 0)
            {
                for (int i = 0; i < 60 && hi - lo > 1e-12 * scan; i++)
                {
                    double mid = 0.5 * (lo + hi);
                    if (g(mid) >= 0) hi = mid; else lo = mid;
                }
                return 0.5 * (lo + hi);
            }
            lo = hi;
        }
        throw new InvalidOperationException("The transform's edge does not reach the measurement level within half a period.");
    }
}
