namespace CableFault.Analysis;

/// <summary>
/// Where the fitted model leaves a stretch of residual that noise cannot explain, away from every event it has, the
/// detector missed something there (a small step in the tail of a large spot, a step masked by an echo). Splitting an
/// event cannot reach it; this proposes a new event at the worst such stretch, for <see cref="ModelSelection"/> to test
/// by the information criterion like any other move.
/// </summary>
internal static class MissingEvents
{
    /// <summary>Least distance from an existing event, in effective rise times, for a stretch to count as away from it
    /// (nearer, the event's own split or kind trials are the remedy).</summary>
    internal const double ClearOfEventsRiseTimes = 1.5;

    /// <summary>Largest reflection a proposed boundary starts from: a missed event is a small one.</summary>
    private const double MaximumStartingReflection = 0.5;

    /// <summary>
    /// Candidate models with one event added where the windowed χ² excess (window [t − 2t_r, t + 4t_r], as
    /// <see cref="ModelSelection.LocalExcess"/>) is largest and at least <paramref name="minimumExcess"/>, clear of the
    /// model's events and before any end: a boundary sized from the residual's level after the onset, and a shunt C or
    /// series L sized from its peak (the starting rules of <see cref="RunModelBuilder"/>), and the new event's index.
    /// Empty when there is no such place.
    /// </summary>
    internal static (IReadOnlyList<RunModel> Models, int Index) Propose(ModelFit fit, FitData data, double variance, double effectiveRiseSeconds,
        double minimumExcess)
    {
        var m = fit.Model;
        int n = data.Samples.Length;
        double dt = data.IntervalSeconds;
        var residual = new double[n];
        for (int i = 0; i < n; i++) residual[i] = data.Samples[i] - fit.ModelSamples[i];
        var cumulative = new double[n + 1];
        for (int i = 0; i < n; i++) cumulative[i + 1] = cumulative[i] + residual[i] * residual[i];

        int before = (int)Math.Ceiling(2 * effectiveRiseSeconds / dt), after = (int)Math.Ceiling(4 * effectiveRiseSeconds / dt);
        double nu = data.IndependentFraction;
        // Only between the model's events: past its last one, unexplained residual is more often echo and loss tail
        // the model gets slightly wrong than a missed event (benchmark: insertions there were mostly false).
        double endTime = m.Events.Count > 0 ? m.Events[^1].RoundTripSeconds : 0;
        double bestExcess = minimumExcess;
        int bestIndex = -1;
        for (int i = before; i + after < n; i++)
        {
            double t = data.TimeAt(i) - m.TimeOffsetSeconds;
            if (t <= ClearOfEventsRiseTimes * effectiveRiseSeconds || t >= endTime) continue;
            if (m.Events.Any(e => Math.Abs(e.RoundTripSeconds - t) < ClearOfEventsRiseTimes * effectiveRiseSeconds)) continue;
            int count = before + after + 1;
            double dof = nu * count;
            double excess = nu * (cumulative[i + after + 1] - cumulative[i - before]) / variance - dof - 3 * Math.Sqrt(2 * dof);
            if (excess > bestExcess) { bestExcess = excess; bestIndex = i; }
        }
        if (bestIndex < 0) return ([], -1);

        // The onset: the steepest change of the residual in the window (difference over half an effective rise).
        int half = Math.Max(1, (int)Math.Round(0.5 * effectiveRiseSeconds / dt));
        int onset = bestIndex;
        double steepest = 0;
        for (int i = Math.Max(half, bestIndex - before); i <= Math.Min(n - 1 - half, bestIndex + after); i++)
        {
            double d = Math.Abs(residual[i + half] - residual[i - half]);
            if (d > steepest) { steepest = d; onset = i; }
        }
        double time = data.TimeAt(onset) - m.TimeOffsetSeconds;
        if (time <= 0 || time >= endTime || m.Events.Any(e => Math.Abs(e.RoundTripSeconds - time) < effectiveRiseSeconds)) return ([], -1);

        // Sizes, relative to the incident plateau at the port (2A·Z₀/(Z_s + Z₀), DESIGN.md §2).
        var c = m.Context;
        double plateau = 2 * m.AmplitudeVolts * c.ImpedanceOhms / (c.SourceImpedanceOhms + c.ImpedanceOhms);
        int levelFrom = Math.Min(n - 1, onset + half * 2), levelTo = Math.Min(n - 1, onset + half * 6);
        double level = 0, peak = 0;
        for (int i = levelFrom; i <= levelTo; i++) level += residual[i];
        level /= levelTo - levelFrom + 1;
        for (int i = Math.Max(0, onset - half); i <= Math.Min(n - 1, onset + half * 6); i++)
            if (Math.Abs(residual[i]) > Math.Abs(peak)) peak = residual[i];

        int index = m.Events.Count(e => e.RoundTripSeconds < time);
        var zBefore = RunModelBuilder.ImpedanceBefore(m, index);
        var result = new List<RunModel>();
        // A lasting step: Δρ ≈ ΔV/plateau, Z_after = Z_before(1 + Δρ)/(1 − Δρ); the line after it keeps Z_after until the
        // next boundary, which keeps its own impedance.
        double rho = Math.Clamp(level / plateau, -MaximumStartingReflection, MaximumStartingReflection);
        var boundary = new RunModelEvent(RunModelElement.Boundary, time, zBefore * (1 + rho) / (1 - rho));
        result.Add(m.WithEvents(m.Events.Append(boundary)));
        // A transient, sized from its peak as the detector's candidates are.
        result.Add(m.WithEvents(m.Events.Append(RunModelBuilder.SpotFromPeak(peak < 0, time, peak / plateau, effectiveRiseSeconds, zBefore))));
        return (result, index);
    }
}
