namespace CableFault.Analysis;

/// <summary>Turns the conditioning's event candidates into a starting <see cref="RunModel"/>.</summary>
internal static class RunModelBuilder
{
    /// <summary>Most events a starting model takes (the strongest by signal-to-noise); bounds the fit's cost.</summary>
    internal const int MaximumEvents = 16;

    /// <summary>Largest |Δρ| turned into a finite impedance: 0.95 is already 39:1; beyond that the selection tries an open or short.</summary>
    private const double MaximumStartingReflection = 0.95;

    /// <summary>
    /// Steps become boundaries (impedance from the layer-peeled profile, else Z_prev(1 + Δρ)/(1 − Δρ)); dips become shunt
    /// capacitors and bumps series inductors, sized from the peak: a first-order transient of time constant τ seen
    /// through an edge of rise t_r peaks at about τ/(τ + t_r) of the step, so τ ≈ t_r·|p|/(1 − |p|);
    /// C = 2τ/Z and L = 2Zτ (DESIGN.md §2).
    /// </summary>
    internal static RunModel FromCandidates(RunModelContext context, double amplitudeVolts, double riseSeconds,
        IReadOnlyList<EventCandidate> candidates, double earliestSeconds)
    {
        var chosen = candidates.Where(c => c.RoundTripSeconds > earliestSeconds && double.IsFinite(c.ReflectionStep))
            .OrderByDescending(c => c.SignalToNoise).Take(MaximumEvents).OrderBy(c => c.RoundTripSeconds).ToList();
        var events = new List<RunModelEvent>();
        double z = context.ImpedanceOhms;
        foreach (var c in chosen)
        {
            double rho = Math.Clamp(c.ReflectionStep, -MaximumStartingReflection, MaximumStartingReflection);
            switch (c.Shape)
            {
                case CandidateShape.Step:
                    double after = c.ImpedanceAfterOhms is double zi && zi > 0 && double.IsFinite(zi)
                        ? Math.Clamp(zi, z / 40, z * 40)
                        : z * (1 + rho) / (1 - rho);
                    events.Add(new RunModelEvent(RunModelElement.Boundary, c.RoundTripSeconds, after));
                    z = after;
                    break;
                case CandidateShape.Dip:
                case CandidateShape.Bump:
                    events.Add(SpotFromPeak(c.Shape == CandidateShape.Dip, c.RoundTripSeconds, rho, riseSeconds, z));
                    break;
            }
        }
        return new RunModel(context, amplitudeVolts, 0, riseSeconds, events);
    }

    /// <summary>
    /// A shunt C (dip) or series L (bump) at <paramref name="timeSeconds"/> on a line of <paramref name="z"/> Ω whose
    /// excursion peaks at <paramref name="peakFraction"/> of the incident step: τ ≈ t_r·|p|/(1 − |p|) (|p| capped at 0.9),
    /// C = 2τ/Z, L = 2Zτ (see <see cref="FromCandidates"/>).
    /// </summary>
    internal static RunModelEvent SpotFromPeak(bool dip, double timeSeconds, double peakFraction, double riseSeconds, double z)
    {
        double p = Math.Min(Math.Abs(peakFraction), 0.9);
        double tau = Math.Max(riseSeconds * p / (1 - p), riseSeconds * 1e-3);
        return dip
            ? new RunModelEvent(RunModelElement.ShuntCapacitor, timeSeconds, 2 * tau / z)
            : new RunModelEvent(RunModelElement.SeriesInductor, timeSeconds, 2 * z * tau);
    }

    /// <summary>Line impedance just before event <paramref name="index"/>, Ω.</summary>
    internal static double ImpedanceBefore(RunModel model, int index)
    {
        double z = model.Context.ImpedanceOhms;
        for (int i = 0; i < index; i++)
            if (model.Events[i].Element == RunModelElement.Boundary) z = model.Events[i].Value;
        return z;
    }
}
