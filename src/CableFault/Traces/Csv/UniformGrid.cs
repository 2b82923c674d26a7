using MathNet.Numerics.Interpolation;
using MathNet.Numerics.Statistics;

namespace CableFault.Traces.Csv;

/// <summary>
/// Puts strictly increasing sample times onto the uniform grid a <see cref="Trace"/> needs: checks that every step is
/// within <see cref="TraceCsvReader.MaxStepDeviation"/> of the median step, keeps the samples as they are when the
/// times already sit on the grid (to <see cref="OnGridTolerance"/> of a step), and otherwise interpolates them onto
/// it with MathNet's natural cubic spline. Both checks allow each time the rounding of its printed digits
/// (<see cref="TimePrecision"/>): times printed to a picosecond are on a 37.5 ps grid if they round to it.
/// </summary>
internal static class UniformGrid
{
    /// <summary>
    /// Largest distance of any sample time from the ideal grid, as a fraction of the step, still taken as "on the
    /// grid" (1e-6). Times printed in decimal and summed in binary floating point wander by far less than this;
    /// moving a sample by 1e-6 of a step changes its value by about 1e-6 of the sample-to-sample change, which is far
    /// below any sampler's noise, so resampling would only add interpolation error.
    /// </summary>
    public const double OnGridTolerance = 1e-6;

    /// <summary>Output samples interpolated per spline piece; bounds the interpolator's memory on long records.</summary>
    private const int ChunkSamples = 4096;

    /// <summary>
    /// Source samples added on each side of a chunk. A natural cubic spline's response to a change at one knot decays by
    /// 2 − √3 ≈ 0.268 per knot, so after 12 knots a chunk edge moves the values by under 1e-6 of what it would on the
    /// whole record.
    /// </summary>
    private const int ChunkMargin = 12;

    /// <summary>Largest share of the median step that printing may excuse: a missing sample (a step twice the median,
    /// 100 % off) is still a gap however coarsely the times are printed.</summary>
    private const double MaxPrintedAllowance = 0.5;

    public static (double Start, double Interval, double[] Samples) Build(
        double[] times, double[] values, int[] lineNumbers, TimePrecision precision, string sourceName, List<string> warnings)
    {
        double Quantum(int i) => precision.QuantumSeconds(i, times[i]);
        int n = times.Length;
        double start = times[0];
        double interval = (times[n - 1] - start) / (n - 1);

        var steps = new double[n - 1];
        for (int i = 0; i < steps.Length; i++) steps[i] = times[i + 1] - times[i];
        double medianStep = ArrayStatistics.MedianInplace(steps); // reorders steps; they are recomputed below

        double worstStep = 0;
        for (int i = 0; i < n - 1; i++)
        {
            double step = times[i + 1] - times[i];
            double deviation = Math.Abs(step - medianStep) / medianStep;
            if (deviation > TraceCsvReader.MaxStepDeviation)
            {
                // Each end of the step is rounded by up to half its place, and the median step by as much again.
                double printed = Math.Min(MaxPrintedAllowance, (Quantum(i) + Quantum(i + 1)) / medianStep);
                if (deviation > TraceCsvReader.MaxStepDeviation + printed)
                {
                    string what = step > medianStep ? "a gap" : "an irregular step";
                    string allowed = printed > 0
                        ? $"{TraceCsvReader.MaxStepDeviation + printed:P0} allowed for jitter and the times' printed rounding"
                        : $"{TraceCsvReader.MaxStepDeviation:P0} allowed";
                    throw new InputException(
                        $"{sourceName}: line {lineNumbers[i + 1]}: time step {step:G4} s after line {lineNumbers[i]} is {what} " +
                        $"({deviation:P1} off the typical {medianStep:G4} s, more than the {allowed}); " +
                        "samples may be missing or records merged, export one uniformly sampled record.");
                }
            }
            worstStep = Math.Max(worstStep, deviation);
        }

        // The grid runs from the first time to the last, each rounded by up to half its place.
        double endsRounding = (Quantum(0) + Quantum(n - 1)) / 2;
        double worstOffGrid = 0, worstUnprinted = 0;
        for (int i = 0; i < n; i++)
        {
            double offset = Math.Abs(times[i] - (start + i * interval));
            worstOffGrid = Math.Max(worstOffGrid, offset / interval);
            if (offset <= OnGridTolerance * interval) continue;
            double rounding = Math.Min(MaxPrintedAllowance * interval, Quantum(i) / 2 + endsRounding);
            worstUnprinted = Math.Max(worstUnprinted, Math.Max(0, offset - rounding) / interval);
        }
        if (worstUnprinted <= OnGridTolerance) return (start, interval, values);

        warnings.Add(
            $"{sourceName}: sample times deviate from a uniform grid by up to {worstOffGrid:P2} of the {interval:G4} s step " +
            $"(steps vary by up to {worstStep:P2}); resampled onto the uniform grid.");
        return (start, interval, Resample(times, values, start, interval));
    }

    private static double[] Resample(double[] times, double[] values, double start, double interval)
    {
        int n = times.Length;
        var result = new double[n];
        for (int k0 = 0; k0 < n; k0 += ChunkSamples)
        {
            int k1 = Math.Min(n, k0 + ChunkSamples);
            int lo = Math.Max(0, LowerBound(times, start + k0 * interval) - ChunkMargin);
            int hi = Math.Min(n, LowerBound(times, start + (k1 - 1) * interval) + ChunkMargin + 1);
            double[] x = times[lo..hi];
            double[] y = values[lo..hi];
            // The sampler band-limits the trace, so a smooth interpolant fits it: the natural cubic spline is
            // fourth-order accurate on smooth data. Akima's local slopes are only second order and were about 60 times
            // worse on an edge three samples wide (see TraceCsvJitterTests); their overshoot advantage matters only
            // between knots, and jitter moves the evaluation points at most 1 % of a step from a knot.
            IInterpolation spline = x.Length >= 3
                ? CubicSpline.InterpolateNaturalSorted(x, y)
                : LinearSpline.InterpolateSorted(x, y);
            for (int k = k0; k < k1; k++) result[k] = spline.Interpolate(start + k * interval);
        }
        // The ends are on the grid by construction; keep them exact rather than spline-evaluated.
        result[0] = values[0];
        result[n - 1] = values[n - 1];
        return result;
    }

    /// <summary>Index of the first time not below <paramref name="t"/> (n when all are below).</summary>
    private static int LowerBound(double[] times, double t)
    {
        int i = Array.BinarySearch(times, t);
        return i >= 0 ? i : ~i;
    }
}
