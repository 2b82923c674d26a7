namespace CableFault.Analysis;

/// <summary>How the model fit went.</summary>
/// <param name="Converged">True when Levenberg–Marquardt stopped on a tolerance (not on the iteration limit).</param>
/// <param name="Iterations">Iterations of the final fit.</param>
/// <param name="ResidualRmsVolts">RMS of trace − model over the fit window, V.</param>
/// <param name="ParameterCount">Number of fitted parameters.</param>
/// <param name="Criterion">The model-selection criterion used, e.g. "BIC".</param>
/// <param name="Message">One line for people: what was fitted and how.</param>
public sealed record FitReport(bool Converged, int Iterations, double ResidualRmsVolts, int ParameterCount,
    string Criterion, string Message);
