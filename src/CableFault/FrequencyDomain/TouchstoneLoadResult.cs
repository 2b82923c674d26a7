namespace CableFault.FrequencyDomain;

/// <summary>What <see cref="TouchstoneTraceLoader.Load"/> returns: the trace, every warning, and the pieces behind them.</summary>
/// <param name="Trace">The time-domain trace (see <see cref="FrequencyToTimeResult.Trace"/>).</param>
/// <param name="Warnings">Reader and conversion warnings, one sentence each.</param>
/// <param name="Data">The reflection data as read.</param>
/// <param name="Conversion">The conversion result with its resolution figures.</param>
public sealed record TouchstoneLoadResult(
    Traces.Trace Trace,
    IReadOnlyList<string> Warnings,
    ReflectionData Data,
    FrequencyToTimeResult Conversion);
