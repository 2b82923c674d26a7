namespace CableFault.Analysis;

/// <summary>
/// Whether the instrument's step settles slowly after its fast edge, from the trace itself. A real step generator often
/// creeps on by a per cent or so over some tens of nanoseconds (common practice); every echo carries the same creep, so
/// a model whose edge settles at once explains it with invented events (a row of small rises near the connector, or a
/// wrong kind at a tap). The detector's events are fitted once with a first-order settling of the step free (its part
/// and time constant) and once without, and the Bayesian information criterion decides, as for the cable's loss
/// (<see cref="LossEstimation"/>). When it wins, the settling is held at its estimate for the rest of the analysis.
/// </summary>
internal static class SettlingEstimation
{
    /// <summary>Starting part of the step that settles: 0.2 %, small enough for a step that settles at once and large
    /// enough that the fit's derivative with respect to the time constant is not zero.</summary>
    private const double StartFraction = 0.002;

    /// <summary>Starting time constant, in instrument rise times.</summary>
    private const double StartRiseTimes = 10;

    /// <summary>Shortest time constant taken, in rise times: a faster settling is a matter of the edge's own shape,
    /// which the rise parameter already absorbs.</summary>
    private const double ShortestRiseTimes = 3;

    /// <summary>Smallest settling part taken: below 0.2 % the fixed threshold of listed events already keeps its
    /// traces out of the report (<see cref="EventClassifier.MinimumListedStepReflection"/>).</summary>
    private const double SmallestFraction = 0.002;

    /// <summary>The settling's part and time constant, s, or null when the trace shows none the criterion accepts.</summary>
    internal static (double Fraction, double Seconds)? Estimate(RunModel initial, FitData data, CancellationToken cancellation)
    {
        var c = initial.Context;
        double span = data.TimeAt(data.Samples.Length - 1) - data.StartTimeSeconds;
        bool Plausible(RunModelContext found) => Math.Abs(found.SettlingFraction) >= SmallestFraction
            && found.SettlingSeconds >= ShortestRiseTimes * c.ReferenceRiseSeconds && found.SettlingSeconds <= span / 4;
        var found = ContextProbe.Decide(initial,
            c with { SettlingFraction = StartFraction, SettlingSeconds = StartRiseTimes * c.ReferenceRiseSeconds, EstimateSettling = true },
            c with { SettlingFraction = 0, SettlingSeconds = 0, EstimateSettling = false }, data, Plausible, "settling", cancellation);
        return found is null ? null : (found.SettlingFraction, found.SettlingSeconds);
    }
}
