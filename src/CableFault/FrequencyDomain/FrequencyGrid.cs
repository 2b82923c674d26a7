using System.Numerics;
using MathNet.Numerics.Interpolation;

namespace CableFault.FrequencyDomain;

/// <summary>
/// Uniform frequency grids for the inverse FFT: recognising harmonic (f = k·Δf) and uniform sweeps, and resampling
/// other sweeps by cubic spline.
/// </summary>
/// <remarks>
/// Resampling interpolates the real and imaginary parts separately (natural cubic spline, MathNet). Both are smooth
/// wherever the sweep resolves the response at all, and unlike magnitude and unwrapped phase they stay well defined
/// where |Γ| passes near zero (a matched load, a resonance), where phase is noise and unwrapping would jump by 2π.
/// </remarks>
internal static class FrequencyGrid
{
    /// <summary>
    /// Largest departure of a point from its grid position, as a fraction of Δf, still taken as on the grid (10⁻³).
    /// Files written with six significant digits are off by up to about 10⁻⁶ relative, so this only catches rounding.
    /// </summary>
    internal const double SnapToleranceSteps = 1e-3;

    /// <summary>True when f_i = (m + i)·Δf for all i within the tolerance; returns Δf and the first bin m ≥ 0.</summary>
    internal static bool TryHarmonic(IReadOnlyList<double> frequenciesHz, out double stepHz, out int firstBin)
    {
        int n = frequenciesHz.Count;
        stepHz = 0;
        firstBin = 0;
        if (n < 2) return false;
        double estimate = (frequenciesHz[n - 1] - frequenciesHz[0]) / (n - 1);
        double m = frequenciesHz[0] / estimate;
        if (m > int.MaxValue / 2.0) return false;
        int bin = (int)Math.Round(m);
        double step = frequenciesHz[n - 1] / (bin + n - 1);
        for (int i = 0; i < n; i++)
            if (Math.Abs(frequenciesHz[i] - (bin + i) * step) > SnapToleranceSteps * step) return false;
        stepHz = step;
        firstBin = bin;
        return true;
    }

    /// <summary>True when the points are equally spaced within the tolerance; returns Δf.</summary>
    internal static bool IsUniform(IReadOnlyList<double> frequenciesHz, out double stepHz)
    {
        int n = frequenciesHz.Count;
        stepHz = (frequenciesHz[n - 1] - frequenciesHz[0]) / (n - 1);
        for (int i = 0; i < n; i++)
            if (Math.Abs(frequenciesHz[i] - (frequenciesHz[0] + i * stepHz)) > SnapToleranceSteps * stepHz) return false;
        return true;
    }

    /// <summary>Median spacing of the sweep, Hz: the step a resampled grid keeps.</summary>
    internal static double MedianStepHz(IReadOnlyList<double> frequenciesHz)
    {
        var steps = new double[frequenciesHz.Count - 1];
        for (int i = 0; i < steps.Length; i++) steps[i] = frequenciesHz[i + 1] - frequenciesHz[i];
        Array.Sort(steps);
        return steps[steps.Length / 2];
    }

    /// <summary>Γ at <paramref name="targetHz"/> (each within the measured span) by natural cubic splines on Re and Im.</summary>
    internal static Complex[] Resample(IReadOnlyList<double> frequenciesHz, IReadOnlyList<Complex> values, IReadOnlyList<double> targetHz)
    {
        var x = frequenciesHz.ToArray();
        var re = CubicSpline.InterpolateNatural(x, values.Select(v => v.Real).ToArray());
        var im = CubicSpline.InterpolateNatural(x, values.Select(v => v.Imaginary).ToArray());
        var result = new Complex[targetHz.Count];
        double lo = x[0], hi = x[^1];
        for (int i = 0; i < result.Length; i++)
        {
            double f = Math.Clamp(targetHz[i], lo, hi);
            result[i] = new Complex(re.Interpolate(f), im.Interpolate(f));
        }
        return result;
    }
}
