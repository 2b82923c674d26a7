using MathNet.Numerics.LinearAlgebra;

namespace CableFault.Analysis;

/// <summary>The result of one least-squares fit of a <see cref="RunModel"/>.</summary>
/// <param name="Model">The fitted model.</param>
/// <param name="ModelSamples">The model at the data's sample times, V.</param>
/// <param name="ResidualSumOfSquares">Σ(y − model)², V².</param>
/// <param name="Iterations">LM iterations used.</param>
/// <param name="Converged">True when LM stopped on a tolerance rather than the iteration limit.</param>
/// <param name="JacobianAtMinimum">∂model/∂u at the minimum (columns of fixed parameters are zero), computed on first use:
/// only the selected model's covariance needs it, and each costs one forward model per parameter.</param>
/// <param name="Free">Which parameters were free.</param>
internal sealed record ModelFit(RunModel Model, double[] ModelSamples, double ResidualSumOfSquares, int Iterations,
    bool Converged, Lazy<Matrix<double>> JacobianAtMinimum, bool[] Free)
{
    /// <summary>∂model/∂u at the minimum.</summary>
    internal Matrix<double> Jacobian => JacobianAtMinimum.Value;

    /// <summary>Number of free parameters.</summary>
    internal int FreeCount => Free.Count(f => f);
}
