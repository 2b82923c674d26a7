using MathNet.Numerics.LinearAlgebra;
using MathNet.Numerics.Optimization;

namespace CableFault.Analysis;

/// <summary>
/// The weighted least-squares objective χ²(q) = w·Σ(yᵢ − fᵢ(q))² for MathNet's Levenberg–Marquardt minimizer, with the
/// gradient g = −w·Jᵀ(y − f) and the Gauss–Newton Hessian H = w·JᵀJ formed straight from the Jacobian's columns
/// (Madsen, Nielsen &amp; Tingleff, <i>Methods for Non-Linear Least Squares Problems</i>, 2nd ed., 2004, §3.2).
/// </summary>
/// <remarks>
/// MathNet's general objective builds an N×p matrix for every Jacobian, weights it element by element, transposes it
/// twice and multiplies N×p by p×N: for a run model (N ≈ 1 000 samples, p ≈ 30) that cost as much as the forward model
/// itself. Here only the free columns' dot products are taken (H is symmetric, so half of them), with one weight w for
/// every sample. Fixed parameters get zero rows and columns, as in MathNet's own objective, so LM leaves them alone.
/// </remarks>
/// <param name="observed">y, the data.</param>
/// <param name="weight">w = 1/σ² of every sample.</param>
/// <param name="model">f(q), the model at parameters q.</param>
/// <param name="jacobianColumns">∂f/∂x_j at q, one array per parameter, in some parameters x with x_j = q_j·factor_j;
/// arrays of fixed parameters are not read.</param>
/// <param name="columnFactors">factor_j: ∂f/∂q_j = (∂f/∂x_j)/factor_j.</param>
/// <param name="products">The free columns' products JᵀJ and Jᵀr (as <see cref="ColumnProducts.Compute"/> gives them)
/// at the point <paramref name="jacobianColumns"/> was last asked for, given r; null takes them from the columns.</param>
internal sealed class ColumnObjective(double[] observed, double weight, Func<double[], double[]> model,
    Func<double[], double[][]> jacobianColumns, double[] columnFactors,
    Func<double[], (double[][] Gram, double[] WithVector)>? products = null) : IObjectiveModel
{
    private double[] point = [];
    private bool[] isFixed = [];
    private double[]? values;
    private double value;
    private Vector<double>? gradient;
    private Matrix<double>? hessian;

    public Vector<double> ObservedY => Vector<double>.Build.DenseOfArray(observed);

    /// <summary>Null: every sample has the same weight w (see the constructor).</summary>
    public Matrix<double>? Weights => null;

    public Vector<double> ModelValues => Vector<double>.Build.DenseOfArray(Values());

    public Vector<double> Point => Vector<double>.Build.DenseOfArray(point);

    /// <summary>χ² = w·Σ(y − f)².</summary>
    public double Value
    {
        get
        {
            Values();
            return value;
        }
    }

    public Vector<double> Gradient
    {
        get
        {
            if (gradient is null) EvaluateDerivatives();
            return gradient!;
        }
    }

    public Matrix<double> Hessian
    {
        get
        {
            if (hessian is null) EvaluateDerivatives();
            return hessian!;
        }
    }

    public int FunctionEvaluations { get; set; }

    public int JacobianEvaluations { get; set; }

    public int DegreeOfFreedom => observed.Length - isFixed.Count(f => !f);

    public bool IsGradientSupported => true;

    public bool IsHessianSupported => true;

    public void SetParameters(Vector<double> initialGuess, List<bool>? fixedParameters = null)
    {
        point = initialGuess.ToArray();
        isFixed = fixedParameters?.ToArray() ?? new bool[point.Length];
        Invalidate();
    }

    public void EvaluateAt(Vector<double> parameters)
    {
        point = parameters.ToArray();
        Invalidate();
    }

    /// <summary>Not used by the minimizer; a fresh objective is built for every fit.</summary>
    public IObjectiveModel Fork() => throw new NotSupportedException("ColumnObjective is built per fit and is not forked.");

    /// <summary>Not used by the minimizer; a fresh objective is built for every fit.</summary>
    public IObjectiveModel CreateNew() => throw new NotSupportedException("ColumnObjective is built per fit.");

    /// <summary>Not used by the minimizer.</summary>
    public IObjectiveFunction ToObjectiveFunction() => throw new NotSupportedException("ColumnObjective serves least squares only.");

    private void Invalidate()
    {
        values = null;
        gradient = null;
        hessian = null;
    }

    private double[] Values()
    {
        if (values is not null) return values;
        values = model(point);
        FunctionEvaluations++;
        double sum = 0;
        for (int i = 0; i < observed.Length; i++)
        {
            double r = observed[i] - values[i];
            sum += r * r;
        }
        value = weight * sum;
        return values;
    }

    private void EvaluateDerivatives()
    {
        var f = Values();
        var columns = jacobianColumns(point);
        JacobianEvaluations++;
        int p = point.Length;
        var residual = new double[observed.Length];
        for (int i = 0; i < residual.Length; i++) residual[i] = observed[i] - f[i];
        var g = new double[p];
        var h = new double[p, p];
        var active = Enumerable.Range(0, p).Where(j => !isFixed[j]).ToArray();
        // The p(p + 1)/2 dot products are a large share of a long fit's LM step: taken a block of samples at a time,
        // spread over the cores, each bit for bit the plain dot product (see ColumnProducts).
        var (gram, withResidual) = products is null
            ? ColumnProducts.Compute(active.Select(j => columns[j]).ToArray(), residual)
            : products(residual);
        for (int a = 0; a < active.Length; a++)
        {
            int j = active[a];
            g[j] = -weight * withResidual[a] / columnFactors[j];
            for (int b = 0; b <= a; b++)
            {
                int k = active[b];
                double hjk = weight * gram[a][b] / (columnFactors[j] * columnFactors[k]);
                h[j, k] = hjk;
                h[k, j] = hjk;
            }
        }
        gradient = Vector<double>.Build.DenseOfArray(g);
        hessian = Matrix<double>.Build.DenseOfArray(h);
    }
}
