namespace CableFault.Benchmarks.Accuracy;

/// <summary>Which simulator made a benchmark trace.</summary>
public enum TraceSource
{
    /// <summary>CableFault's own forward model (ForwardModel.Simulate).</summary>
    Model,
    /// <summary>ngspice in batch mode (Debian package ngspice): T elements for lossless lines, LTRA for lossy ones.</summary>
    Ngspice,
}
