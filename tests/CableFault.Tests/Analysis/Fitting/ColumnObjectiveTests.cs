using CableFault.Analysis;
using MathNet.Numerics.LinearAlgebra;
using MathNet.Numerics.Optimization;
using Xunit;

namespace CableFault.Tests.Analysis.Fitting;

/// <summary>
/// The run-model fit's objective against MathNet's own general least-squares objective (ObjectiveFunction.NonlinearModel,
/// an independent implementation of the same χ², gradient −JᵀW(y − f) and Gauss–Newton Hessian JᵀWJ) on a small
/// nonlinear problem: a decaying step f(t) = a·(1 − e^(−t/τ)) + c, with one parameter fixed and the columns scaled.
/// </summary>
public sealed class ColumnObjectiveTests
{
    private const int SampleCount = 64;
    private const double Weight = 4;
    private static readonly double[] Factors = [1.0, 2.5, 0.4];
    private static readonly double[] Times = Enumerable.Range(0, SampleCount).Select(i => 0.1 * i).ToArray();

    /// <summary>Noisy data from a = 1, τ = 1.3, c = 0.05 (seeded).</summary>
    private static readonly double[] Observed = MakeData();

    private static double[] MakeData()
    {
        var random = new Random(11);
        return Times.Select(t => 1.0 * (1 - Math.Exp(-t / 1.3)) + 0.05 + 0.01 * (random.NextDouble() - 0.5)).ToArray();
    }

    /// <summary>The parameters x_j = q_j·factor_j.</summary>
    private static double[] Model(double[] q)
    {
        double a = q[0] * Factors[0], tau = q[1] * Factors[1], c = q[2] * Factors[2];
        return Times.Select(t => a * (1 - Math.Exp(-t / tau)) + c).ToArray();
    }

    /// <summary>∂f/∂x_j (not ∂f/∂q_j: the objective divides by the factors).</summary>
    private static double[][] ColumnsX(double[] q)
    {
        double a = q[0] * Factors[0], tau = q[1] * Factors[1];
        return
        [
            Times.Select(t => 1 - Math.Exp(-t / tau)).ToArray(),
            Times.Select(t => -a * Math.Exp(-t / tau) * t / (tau * tau)).ToArray(),
            Times.Select(_ => 1.0).ToArray(),
        ];
    }

    private static IObjectiveModel Reference() => ObjectiveFunction.NonlinearModel(
        (q, _) => Vector<double>.Build.DenseOfArray(Model(q.ToArray())),
        (q, _) =>
        {
            var columns = ColumnsX(q.ToArray());
            return Matrix<double>.Build.Dense(SampleCount, 3, (i, j) => columns[j][i] / Factors[j]);
        },
        Vector<double>.Build.DenseOfArray(Times), Vector<double>.Build.DenseOfArray(Observed),
        Vector<double>.Build.Dense(SampleCount, Weight));

    private static ColumnObjective Subject() => new(Observed, Weight, Model, ColumnsX, Factors);

    [Theory]
    [InlineData(false)]
    [InlineData(true)]
    public void ValueGradientAndHessianMatchMathNetsObjective(bool fixSecond)
    {
        var point = Vector<double>.Build.DenseOfArray([0.8, 0.5, 0.2]);
        var isFixed = new List<bool> { false, fixSecond, false };
        var reference = Reference();
        var subject = Subject();
        reference.SetParameters(point, isFixed);
        subject.SetParameters(point, isFixed);
        reference.EvaluateAt(point);
        subject.EvaluateAt(point);

        // Same sums in a different order: agreement to rounding (1e-12 relative).
        Assert.Equal(reference.Value, subject.Value, reference.Value * 1e-12);
        for (int j = 0; j < 3; j++)
        {
            Assert.Equal(reference.Gradient[j], subject.Gradient[j], 1e-12 * (1 + Math.Abs(reference.Gradient[j])));
            for (int k = 0; k < 3; k++)
                Assert.Equal(reference.Hessian[j, k], subject.Hessian[j, k], 1e-12 * (1 + Math.Abs(reference.Hessian[j, k])));
        }
        if (fixSecond) Assert.Equal(0, subject.Gradient[1]);
        Assert.Equal(reference.DegreeOfFreedom, subject.DegreeOfFreedom);
    }

    [Fact]
    public void LevenbergMarquardtReachesTheSameMinimum()
    {
        var start = Vector<double>.Build.DenseOfArray([0.5, 0.3, 0.0]);
        var minimizer = new LevenbergMarquardtMinimizer(gradientTolerance: 1e-12, maximumIterations: 200);
        var expected = minimizer.FindMinimum(Reference(), start);
        var actual = minimizer.FindMinimum(Subject(), start);
        for (int j = 0; j < 3; j++) Assert.Equal(expected.MinimizingPoint[j], actual.MinimizingPoint[j], 1e-8);
        // And it is the generating model, to within the added noise: a = 1, τ = 1.3 (q₁ = τ/2.5), c = 0.05 (q₂ = c/0.4).
        Assert.Equal(1.0, actual.MinimizingPoint[0] * Factors[0], 0.02);
        Assert.Equal(1.3, actual.MinimizingPoint[1] * Factors[1], 0.05);
        Assert.Equal(0.05, actual.MinimizingPoint[2] * Factors[2], 0.02);
    }
}
