using CableFault.Simulation;
using MathNet.Numerics.LinearAlgebra;
using MathNet.Numerics.Optimization;

namespace CableFault.Analysis;

/// <summary>
/// Least-squares fit of a <see cref="RunModel"/> to <see cref="FitData"/> by Levenberg–Marquardt
/// (MathNet.Numerics.Optimization) on a <see cref="ColumnObjective"/>, with a forward-difference Jacobian whose columns are
/// computed in parallel.
/// </summary>
internal static class ModelFitter
{
    /// <summary>Forward-difference step in the dimensionless parameters: 10⁻³ of a rise time or of a natural-log unit.
    /// The damped-contour inverse amplifies round-off late in the window by up to ~10⁸ (10⁻⁸ relative), so a smaller step
    /// would make the Jacobian noisy; the truncation error (h/2 times the curvature) stays far below the noise.</summary>
    private const double DifferenceStep = 1e-3;

    /// <summary>Indices of the incident amplitude and the level offset in <see cref="RunModel.ToVector"/>.</summary>
    private const int AmplitudeIndex = 0, OffsetIndex = 3;

    /// <summary>Columns that need a model run, from which recording the base point's network pairs pays: the recording
    /// costs about one run's network sweep, and each column then evaluates about half of the network.</summary>
    private const int MinimumColumnsForSnapshots = 3;

    /// <summary>Default iteration limit; warm starts converge in a handful.</summary>
    internal const int DefaultMaximumIterations = 40;

    /// <summary>Fresh starts with a finite-difference Jacobian after LM stalled on a secant one.</summary>
    private const int MaximumSecantRestarts = 2;

    /// <summary>Fits each of <paramref name="starts"/> with every parameter free, side by side (they are independent), in
    /// their order.</summary>
    internal static ModelFit[] FitEach(IReadOnlyList<RunModel> starts, FitData data, double sampleVarianceVolts2,
        int maximumIterations = DefaultMaximumIterations, CancellationToken cancellation = default)
    {
        var fits = new ModelFit[starts.Count];
        ModelSelection.ForEachInParallel(starts.Count, k => fits[k] = Fit(starts[k], data, sampleVarianceVolts2,
            maximumIterations: maximumIterations, cancellation: cancellation), cancellation);
        return fits;
    }

    /// <summary>Fits all parameters, or those marked free in <paramref name="free"/>.</summary>
    internal static ModelFit Fit(RunModel initial, FitData data, double sampleVarianceVolts2, bool[]? free = null,
        int maximumIterations = DefaultMaximumIterations, CancellationToken cancellation = default)
    {
        double[] u0 = initial.ToVector();
        int p = u0.Length;
        free ??= Enumerable.Repeat(true, p).ToArray();
        double weight = 1 / Math.Max(sampleVarianceVolts2, 1e-300);

        // Jacobian in the dimensionless parameters u: forward differences (columns in parallel) at the start and every
        // few steps, Broyden's rank-one secant update in between (see SecantJacobian).
        double[]? cachedU = null, cachedF = null;
        double referenceAmplitude = initial.Context.ReferenceAmplitudeVolts;
        var secant = new SecantJacobian(p, free);
        double[] Model(double[] u)
        {
            cancellation.ThrowIfCancellationRequested();
            if (cachedU is not null && u.AsSpan().SequenceEqual(cachedU)) return cachedF!;
            var f = initial.FromVector(u).Simulate(data);
            cachedU = u;
            cachedF = f;
            return f;
        }
        // reuse: the secant's columns, which a fresh Jacobian replaces, to be overwritten rather than allocated anew.
        double[][] ExactJacobianU(double[] u, double[][]? reuse = null)
        {
            double[] f0 = Model(u);
            var columns = new double[p][];
            // The columns' runs resume from the base point's network pairs: each evaluates only the operations its
            // parameter changes and those nearer the port (bit for bit what a full run gives).
            using var snapshots = CountRunColumns(u) >= MinimumColumnsForSnapshots ? initial.FromVector(u).Snapshot(data) : null;
            Parallel.For(0, p, new ParallelOptions { CancellationToken = cancellation }, j =>
            {
                using var sideBySide = BinSplitting.SideBySide();
                var col = reuse?[j] is { } old && old.Length == f0.Length && free[j] ? old : new double[f0.Length];
                if (free[j] && IsExactColumn(j, u)) FillExactColumn(j, u, f0, referenceAmplitude, col);
                else if (free[j])
                {
                    var shifted = (double[])u.Clone();
                    shifted[j] += DifferenceStep;
                    var fj = initial.FromVector(shifted).Simulate(data, snapshots);
                    for (int i = 0; i < col.Length; i++) col[i] = (fj[i] - f0[i]) / DifferenceStep;
                }
                columns[j] = col;
            });
            return columns;
        }
        int CountRunColumns(double[] u)
        {
            int count = 0;
            for (int j = 0; j < p; j++)
                if (free[j] && !IsExactColumn(j, u)) count++;
            return count;
        }
        double[][] JacobianU(double[] u)
        {
            if (secant.IsAt(u)) return secant.Columns!;
            double[] f0 = Model(u);
            if (secant.CanUpdate)
            {
                var exact = new double[p][];
                for (int j = 0; j < p; j++)
                {
                    if (!free[j] || !IsExactColumn(j, u)) continue;
                    // The column it replaces is read by nothing else.
                    exact[j] = secant.Columns![j] is { } old && old.Length == f0.Length ? old : new double[f0.Length];
                    FillExactColumn(j, u, f0, referenceAmplitude, exact[j]);
                }
                secant.Update(u, f0, exact);
            }
            else secant.Reset(u, f0, ExactJacobianU(u, secant.Columns));
            return secant.Columns!;
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
        double[] ToU(double[] q)
        {
            var u = new double[p];
            for (int j = 0; j < p; j++) u[j] = u0[j] + q[j] / scale[j];
            return u;
        }
        // The products come from the secant Jacobian, which carries them through its rank-one updates.
        var objective = new ColumnObjective(data.Samples, weight, q => Model(ToU(q)), q => JacobianU(ToU(q)), scale,
            secant.Products);
        // The objective is χ²/2 in noise units: stop when its gradient is below 10⁻³ per noise-unit of parameter (what is
        // left to gain is far below one unit of χ²), or when LM can no longer find a step that lowers χ² (its damping then shrinks the step to nothing).
        var minimizer = new LevenbergMarquardtMinimizer(initialMu: 1e-3, gradientTolerance: 1e-3, stepTolerance: 1e-15,
            functionTolerance: 0, maximumIterations: maximumIterations);
        NonlinearMinimizationResult? result = null;
        var isFixed = free.Select(f => !f).ToList();
        var start = Vector<double>.Build.Dense(p);
        int iterations = 0;
        for (int restart = 0; restart <= MaximumSecantRestarts; restart++)
        {
            try
            {
                minimizer.MaximumIterations = Math.Max(1, maximumIterations - iterations);
                result = minimizer.FindMinimum(objective, start, isFixed: isFixed);
                iterations += Math.Max(0, result.Iterations);
            }
            catch (MaximumIterationsException)
            {
                result = null;
                iterations = maximumIterations;
            }
            // A stop decided on a secant Jacobian may be its error, not the minimum: LM then cannot find a descent step
            // and shrinks it to nothing. Go on from there with a fresh finite-difference Jacobian; a real minimum then
            // stops at once on the gradient test.
            if (result is null || !secant.IsUpdated || iterations >= maximumIterations
                || result.ReasonForExit is not (ExitCondition.RelativePoints or ExitCondition.LackOfProgress)) break;
            start = result.MinimizingPoint;
            secant.ForceExact();
        }
        var uBest = result is null ? u0 : ToU(result.MinimizingPoint.ToArray());
        var model = initial.FromVector(uBest);
        var fitted = Model(uBest);
        double rss = 0;
        for (int i = 0; i < fitted.Length; i++) rss += (data.Samples[i] - fitted[i]) * (data.Samples[i] - fitted[i]);
        // The covariance needs the true derivatives: a secant Jacobian is only good enough to steer LM.
        var jacobian = new Lazy<Matrix<double>>(() => Matrix<double>.Build.DenseOfColumnArrays(
            secant.IsAt(uBest) && !secant.IsUpdated ? secant.Columns! : ExactJacobianU(uBest)));
        bool converged = result is not null && result.ReasonForExit is ExitCondition.Converged or ExitCondition.RelativeGradient
            or ExitCondition.AbsoluteGradient or ExitCondition.RelativePoints or ExitCondition.LackOfProgress;
        return new ModelFit(model, fitted, rss, result is null ? maximumIterations : iterations, converged, jacobian, (bool[])free.Clone());
    }

    /// <summary>The amplitude and level-offset columns are exact and cost no model run: the samples are linear in them.</summary>
    private static bool IsExactColumn(int j, double[] u) => (j == AmplitudeIndex && u[AmplitudeIndex] != 0) || j == OffsetIndex;

    /// <summary>∂f/∂u_A = (f − offset)/u_A and ∂f/∂u_offset = A_ref (f is linear in both).</summary>
    private static void FillExactColumn(int j, double[] u, double[] f0, double referenceAmplitude, double[] col)
    {
        if (j == OffsetIndex)
        {
            Array.Fill(col, referenceAmplitude);
            return;
        }
        double offset = u[OffsetIndex] * referenceAmplitude;
        for (int i = 0; i < col.Length; i++) col[i] = (f0[i] - offset) / u[AmplitudeIndex];
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
