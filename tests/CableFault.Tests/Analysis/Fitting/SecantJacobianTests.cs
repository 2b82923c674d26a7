using CableFault.Analysis;
using Xunit;

namespace CableFault.Tests.Analysis.Fitting;

/// <summary>
/// Broyden's secant update (Broyden, <i>Math. Comp.</i> 19, 1965), which the fit applies to its columns in place: the
/// columns are checked against the update formula J₊ = J + (Δf − J·Δu)·Δuᵀ/(Δuᵀ·Δu) written out directly, with a
/// fixed parameter and a column replaced by its exact value at the new point.
/// </summary>
public sealed class SecantJacobianTests
{
    private const int SampleCount = 1_001;
    private const int ParameterCount = 7;

    /// <summary>Parameter 0 has an exact column (replaced at every point, as the fit's amplitude is); parameter 3 is fixed.</summary>
    private static readonly bool[] Free = [true, true, true, false, true, true, true];

    [Fact]
    public void UpdatedColumnsFollowBroydensFormula()
    {
        var random = new Random(3);
        var (u0, f0, columns) = Start(random);
        var expected = columns.Select(c => (double[])c.Clone()).ToArray();
        var secant = new SecantJacobian(ParameterCount, Free);
        secant.Reset(u0, f0, columns);

        var (u1, f1, exact) = Step(random, u0);
        secant.Update(u1, f1, exact);

        // Direct: r = Δf − J·Δu over the moved parameters, with the exact column already at the new point.
        var du = Enumerable.Range(0, ParameterCount).Select(j => Free[j] ? u1[j] - u0[j] : 0).ToArray();
        double norm2 = Enumerable.Range(1, ParameterCount - 1).Sum(j => du[j] * du[j]);
        expected[0] = exact[0]!;
        for (int i = 0; i < SampleCount; i++)
        {
            double r = f1[i] - f0[i];
            for (int j = 0; j < ParameterCount; j++) r -= expected[j][i] * du[j];
            for (int j = 1; j < ParameterCount; j++)
                if (Free[j]) Assert.Equal(expected[j][i] + r * du[j] / norm2, secant.Columns![j][i], 1e-12);
        }
        Assert.Equal(exact[0], secant.Columns![0]);
    }

    /// <summary>The Gauss–Newton products the secant Jacobian carries through its rank-one updates (J′ᵀJ′ = JᵀJ + c·tᵀ +
    /// t·cᵀ + (r·r)·t·tᵀ, the exact column's taken afresh) must be the products of its updated columns, taken directly,
    /// to rounding: 1e-12 of |a|·|b| leaves room for three updates' rounding (each ~1e-15 relative) and still catches a
    /// missing or doubled term (of order 1). The products with a vector are taken directly every time.</summary>
    [Fact]
    public void CarriedProductsAreTheUpdatedColumnsProducts()
    {
        var random = new Random(11);
        var (u, f, columns) = Start(random);
        var secant = new SecantJacobian(ParameterCount, Free);
        secant.Reset(u, f, columns);
        var vector = RandomVector(random);
        secant.Products(vector);
        var freeIndices = Enumerable.Range(0, ParameterCount).Where(j => Free[j]).ToArray();
        for (int step = 0; step < SecantJacobian.MaximumUpdates; step++)
        {
            (u, f, var exact) = Step(random, u);
            secant.Update(u, f, exact);
            vector = RandomVector(random);

            var (gram, withVector) = secant.Products(vector);

            var direct = ColumnProducts.Compute(freeIndices.Select(j => secant.Columns![j]).ToArray(), vector);
            for (int a = 0; a < freeIndices.Length; a++)
            {
                double sizeA = Math.Sqrt(ColumnProducts.Dot(secant.Columns![freeIndices[a]], secant.Columns[freeIndices[a]]));
                Assert.Equal(direct.WithVector[a], withVector[a]);
                for (int b = 0; b <= a; b++)
                {
                    double sizeB = Math.Sqrt(ColumnProducts.Dot(secant.Columns[freeIndices[b]], secant.Columns[freeIndices[b]]));
                    Assert.True(Math.Abs(gram[a][b] - direct.Gram[a][b]) <= 1e-12 * sizeA * sizeB,
                        $"step {step}, product ({a}, {b}): carried {gram[a][b]}, direct {direct.Gram[a][b]}");
                }
            }
        }
    }

    private static (double[] U, double[] F, double[][] Columns) Start(Random random)
    {
        var u = Enumerable.Range(0, ParameterCount).Select(_ => random.NextDouble()).ToArray();
        var f = RandomVector(random);
        var columns = Enumerable.Range(0, ParameterCount)
            .Select(j => Free[j] ? RandomVector(random) : new double[SampleCount]).ToArray();
        return (u, f, columns);
    }

    /// <summary>A random move of the free parameters, new model values, and the exact column 0 at the new point.</summary>
    private static (double[] U, double[] F, double[]?[] Exact) Step(Random random, double[] u)
    {
        var next = u.Select((x, j) => Free[j] ? x + 0.1 * (random.NextDouble() - 0.5) : x).ToArray();
        var exact = new double[]?[ParameterCount];
        exact[0] = RandomVector(random);
        return (next, RandomVector(random), exact);
    }

    private static double[] RandomVector(Random random) =>
        Enumerable.Range(0, SampleCount).Select(_ => random.NextDouble() - 0.5).ToArray();
}
