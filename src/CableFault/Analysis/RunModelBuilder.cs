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

    /// <summary>Longest branch round trip, in effective rise times, started as a tap from its ringing: a longer branch
    /// shows its echoes apart, and the selection's tap alternatives read it from them (a 7 m branch at a 3 ns effective
    /// rise, 18 rises, went wrong from this start).</summary>
    private const double MaximumRingingBranchRiseTimes = 10;

    /// <summary>Last multiple of the branch round trip searched for ringing candidates.</summary>
    private const int MaximumRingingEchoes = 8;

    /// <summary>Fewest ringing candidates (the branch end's first echo and at least two more) for a drop to start as a tap.</summary>
    private const int MinimumRingingCandidates = 3;

    /// <summary>
    /// A second start for <paramref name="m"/> in which each drop that rings as a tap does is a tap, or null when none
    /// does: a junction with an open branch of round trip Δ reflects a drop (ρ = −1/3 when all three lines match) and
    /// then the branch end's echo again after every further Δ, each weaker, so the detector sees a staircase or a row of
    /// spots at t + Δ, t + 2Δ, …, which a first fit from those candidates rarely takes apart. A drop with
    /// −0.6 &lt; ρ &lt; −0.1 whose next event lies Δ later (one rise to <see cref="MaximumRingingBranchRiseTimes"/>
    /// effective rises) and with at least
    /// <see cref="MinimumRingingCandidates"/> events at consecutive whole multiples of Δ (within a quarter of Δ and 0.75
    /// of a rise) becomes a tap of branch Δ, and those events go: the model makes the ringing itself. An echo ladder
    /// between a drop and a later event (a leak and a short end a little further on) rings alike, so this is only a
    /// start the first fit weighs against the detector's own (see <see cref="ModelSelection.Select"/>).
    /// </summary>
    internal static RunModel? RingingTapStart(RunModel m, double effectiveRiseSeconds)
    {
        var result = m.Events.ToList();
        double rise = m.Context.ReferenceRiseSeconds;
        double z = m.Context.ImpedanceOhms;
        bool changed = false;
        for (int i = 0; i + 1 < result.Count; i++)
        {
            var e = result[i];
            if (e.Element != RunModelElement.Boundary) continue;
            double rho = (e.Value - z) / (e.Value + z);
            double before = z;
            z = e.Value;
            if (!(rho > -0.6 && rho < -0.1)) continue;
            double delta = result[i + 1].RoundTripSeconds - e.RoundTripSeconds;
            if (delta < rise || delta > MaximumRingingBranchRiseTimes * effectiveRiseSeconds) continue;
            double tolerance = Math.Min(0.25 * delta, 0.75 * rise);
            var ringing = new List<RunModelEvent>();
            // The echoes weaken with each round trip: the ringing is what lies at consecutive multiples (a branch whose
            // echoes alternate in sign may show only every other one), up to the eighth.
            for (int n = 1, misses = 0; n <= MaximumRingingEchoes && misses < 2; n++)
            {
                var at = result.Skip(i + 1).Where(x => Math.Abs(x.RoundTripSeconds - e.RoundTripSeconds - n * delta) < tolerance).ToList();
                misses = at.Count == 0 ? misses + 1 : 0;
                ringing.AddRange(at);
            }
            if (ringing.Count < MinimumRingingCandidates) continue;
            result[i] = new RunModelEvent(RunModelElement.Tap, e.RoundTripSeconds, delta);
            result.RemoveAll(ringing.Contains);
            changed = true;
            // After a tap the main line is back at the impedance before it.
            z = before;
        }
        return changed ? m.WithEvents(result) : null;
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
