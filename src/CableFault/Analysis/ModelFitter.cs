using MathNet.Numerics.LinearAlgebra;
using MathNet.Numerics.Optimization;

namespace CableFault.Analysis;

/// <summary>
/// Least-squares fit of a <see cref="RunModel"/> to <see cref="FitData"/> by Levenberg–Marquardt
/// (MathNet.Numerics.Optimization), with a forward-difference Jacobian whose columns are computed in parallel.
/// </summary>
internal static class ModelFitter
{
    /// <summary>Forward-difference step in the dimensionless parameters: 10⁻³ of a rise time or of a natural-log unit.
    /// The damped-contour inverse amplifies round-off late in the window by up to ~10⁸ (10⁻⁸ relative), so a smaller step
    /// would make the Jacobian noisy; the truncation error (h/2 times the curvature) stays far below the noise.</summary>
    private const double DifferenceStep = 1e-3;

    /// <summary>Indices of the incident amplitude and the level offset in <see cref="RunModel.ToVector"/>.</summary>
    private const int AmplitudeIndex = 0, OffsetIndex = 3;

    /// <summary>Default iteration limit; warm starts converge in a handful.</summary>
    internal const int DefaultMaximumIterations = 40;

    /// <summary>Fits all parameters, or those marked free in <paramref name="free"/>.</summary>
    internal static ModelFit Fit(RunModel initial, FitData data, double sampleVarianceVolts2, bool[]? free = null,
        int maximumIterations = DefaultMaximumIterations, CancellationToken cancellation = default)
    {
        double[] u0 = initial.ToVector();
        int p = u0.Length;
        free ??= Enumerable.Repeat(true, p).ToArray();
        var y = Vector<double>.Build.DenseOfArray(data.Samples);
        var x = Vector<double>.Build.Dense(y.Count, i => i);
        double weight = 1 / Math.Max(sampleVarianceVolts2, 1e-300);

        // Jacobian in the dimensionless parameters u (forward differences, columns in parallel).
        double[]? cachedU = null, cachedF = null;
        double[]? cachedJU = null;
        double referenceAmplitude = initial.Context.ReferenceAmplitudeVolts;
        double[][]? cachedJ = null;
        double[] Model(double[] u)
        {
            cancellation.ThrowIfCancellationRequested();
            if (cachedU is not null && u.AsSpan().SequenceEqual(cachedU)) return cachedF!;
            var f = initial.FromVector(u).Simulate(data);
            cachedU = u;
            cachedF = f;
            return f;
        }
        double[][] JacobianU(double[] u)
        {
            if (cachedJU is not null && u.AsSpan().SequenceEqual(cachedJU)) return cachedJ!;
            double[] f0 = Model(u);
            var columns = new double[p][];
            Parallel.For(0, p, new ParallelOptions { CancellationToken = cancellation }, j =>
            {
                var col = new double[f0.Length];
                if (free[j] && j == AmplitudeIndex && u[AmplitudeIndex] != 0)
                {
                    // The samples are linear in the amplitude and the level offset: exact columns, no evaluation.
                    double offset = u[OffsetIndex] * referenceAmplitude;
                    for (int i = 0; i < col.Length; i++) col[i] = (f0[i] - offset) / u[AmplitudeIndex];
                }
                else if (free[j] && j == OffsetIndex)
                {
                    Array.Fill(col, referenceAmplitude);
                }
                else if (free[j])
                {
                    var shifted = (double[])u.Clone();
                    shifted[j] += DifferenceStep;
                    var fj = initial.FromVector(shifted).Simulate(data);
                    for (int i = 0; i < col.Length; i++) col[i] = (fj[i] - f0[i]) / DifferenceStep;
                }
                columns[j] = col;
            });
            cachedJU = u;
            cachedJ = columns;
            return columns;
        }

        // LM runs on scaled offsets q_j = (u_j − u₀_j)·s_j with s_j = ‖∂f/∂u_j‖/σ at the start, so that every diagonal
        // entry of JᵀWJ is 1: MathNet's damping μI then acts like Marquardt's μ·diag(JᵀWJ) and no parameter is starved,
        // and its step test ‖Δq‖ ≤ tol·(tol + q·q) is about how far the fit has moved in units of the noise.
        var j0 = JacobianU(u0);
        var scale = new double[p];
        for (int j = 0; j < p; j++)
        {
            double norm = 0;
            foreach (double v in j0[j]) norm += v * v;
            scale[j] = norm > 0 ? Math.Sqrt(norm * weight) : 1;
        }
        double[] ToU(Vector<double> q)
        {
            var u = new double[p];
            for (int j = 0; j < p; j++) u[j] = u0[j] + q[j] / scale[j];
            return u;
        }
        Matrix<double> JacobianQ(Vector<double> q)
        {
            var columns = JacobianU(ToU(q));
            return Matrix<double>.Build.Dense(y.Count, p, (i, j) => columns[j][i] / scale[j]);
        }

        var weights = Vector<double>.Build.Dense(y.Count, weight);
        var objective = ObjectiveFunction.NonlinearModel(
            (q, _) => Vector<double>.Build.DenseOfArray(Model(ToU(q))),
            (q, _) => JacobianQ(q),
            x, y, weights);
        // The objective is χ²/2 in noise units: stop when its gradient is below 10⁻³ per noise-unit of parameter (what is
        // left to gain is far below one unit of χ²), or when LM can no longer find a step that lowers χ² (its damping then shrinks the step to nothing).
        var minimizer = new LevenbergMarquardtMinimizer(initialMu: 1e-3, gradientTolerance: 1e-3, stepTolerance: 1e-15,
            functionTolerance: 0, maximumIterations: maximumIterations);
        NonlinearMinimizationResult? result = null;
        try
        {
            result = minimizer.FindMinimum(objective, Vector<double>.Build.Dense(p), isFixed: free.Select(f => !f).ToList());
        }
        catch (MaximumIterationsException)
        {
        }
        var uBest = result is null ? u0 : ToU(result.MinimizingPoint);
        var model = initial.FromVector(uBest);
        var fitted = Model(uBest);
        double rss = 0;
        for (int i = 0; i < fitted.Length; i++) rss += (data.Samples[i] - fitted[i]) * (data.Samples[i] - fitted[i]);
        var jacobian = new Lazy<Matrix<double>>(() => Matrix<double>.Build.DenseOfColumnArrays(JacobianU(uBest)));
        bool converged = result is not null && result.ReasonForExit is ExitCondition.Converged or ExitCondition.RelativeGradient
            or ExitCondition.AbsoluteGradient or ExitCondition.RelativePoints or ExitCondition.LackOfProgress;
        return new ModelFit(model, fitted, rss, Math.Max(0, result?.Iterations ?? maximumIterations), converged, jacobian, (bool[])free.Clone());
    }

    /// <summary>RSS of a model without fitting it.</summary>
    internal static double ResidualSumOfSquares(RunModel model, FitData data)
    {
        var f = model.Simulate(data);
        double rss = 0;
        for (int i = 0; i < f.Length; i++) rss += (data.Samples[i] - f[i]) * (data.Samples[i] - f[i]);
        return rss;
    }

    /// <summary>
    /// Covariance of the free dimensionless parameters, σ²(JᵀJ)⁻¹ (the Gauss–Newton approximation at the minimum;
    /// e.g. Press et al., <i>Numerical Recipes</i>, 3rd ed., §15.5), with σ² the variance of one analysed sample divided
    /// by the independent fraction (correlated samples carry less information). Fixed parameters get zero variance.
    /// </summary>
    internal static Matrix<double> Covariance(ModelFit fit, double sampleVarianceVolts2, double independentFraction)
    {
        int p = fit.Free.Length;
        var index = Enumerable.Range(0, p).Where(j => fit.Free[j]).ToArray();
        var j = Matrix<double>.Build.DenseOfColumnVectors(index.Select(k => fit.Jacobian.Column(k)));
        var normal = j.TransposeThisAndMultiply(j);
        var inverse = normal.PseudoInverse();
        var full = Matrix<double>.Build.Dense(p, p);
        double scale = sampleVarianceVolts2 / independentFraction;
        for (int a = 0; a < index.Length; a++)
            for (int b = 0; b < index.Length; b++)
                full[index[a], index[b]] = inverse[a, b] * scale;
        return full;
    }
}
