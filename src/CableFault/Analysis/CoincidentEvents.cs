namespace CableFault.Analysis;

/// <summary>
/// Two fitted events at practically one place (closer than <see cref="CoincidenceRiseFraction"/> of the effective rise)
/// are one event unless the data very strongly want both: two elements at one spot can trade size against each other
/// (a step and a leak, a step and a spot), so a fit may keep both for a sliver of χ², and a technician would be told of
/// two faults where there is one. Each is tried away in turn; the simpler model stays unless the pair earns
/// <see cref="StrongEvidenceMargin"/> BIC units (Kass &amp; Raftery, <i>J. Am. Stat. Assoc.</i> 90, 1995: ΔBIC &gt; 10 is
/// "very strong" evidence). A real compound spot (a leak right at a change of cable) earns far more than that.
/// </summary>
internal static class CoincidentEvents
{
    /// <summary>Fraction of the effective rise within which two events count as one place.</summary>
    internal const double CoincidenceRiseFraction = 0.25;

    /// <summary>BIC units a coincident pair must earn over the single event.</summary>
    internal const double StrongEvidenceMargin = 10;

    /// <summary>Iteration limit of each trial (warm started).</summary>
    private const int TrialIterations = 20;

    /// <summary>The fit with coincident pairs reduced to one event where the data allow; <paramref name="trials"/> counts
    /// the fits made.</summary>
    internal static ModelFit Resolve(ModelFit best, FitData data, double variance, double effectiveRiseSeconds, ref int trials,
        CancellationToken cancellation)
    {
        double Bic(ModelFit f) => ModelSelection.Criterion(f, data, variance);
        if (AsTermination(best.Model, effectiveRiseSeconds) is { } terminated)
        {
            best = ModelFitter.Fit(terminated, data, variance, cancellation: cancellation);
            trials++;
        }
        double bestBic = Bic(best);
        for (int guard = 0; guard < 8; guard++)
        {
            var m = best.Model;
            int pair = Enumerable.Range(0, Math.Max(0, m.Events.Count - 1))
                .Where(i => m.Events[i + 1].RoundTripSeconds - m.Events[i].RoundTripSeconds < CoincidenceRiseFraction * effectiveRiseSeconds)
                .DefaultIfEmpty(-1).First();
            if (pair < 0) break;
            ModelFit? winner = null;
            double winnerBic = double.PositiveInfinity;
            var candidates = new List<RunModel>();
            foreach (int drop in new[] { pair, pair + 1 })
            {
                var list = m.Events.ToList();
                // Removing the first of a boundary pair keeps the line impedance the second one set.
                if (drop == pair && list[pair + 1].Element != RunModelElement.Boundary && list[pair].Element == RunModelElement.Boundary)
                    continue;
                list.RemoveAt(drop);
                candidates.Add(m.WithEvents(list));
            }
            // The two readings are independent: fitted side by side.
            var fits = new ModelFit[candidates.Count];
            ModelSelection.ForEachInParallel(candidates.Count, c => fits[c] = ModelFitter.Fit(candidates[c], data, variance,
                candidates[c].FreeMask(pair - 1, int.MaxValue, withLoss: false), TrialIterations, cancellation), cancellation);
            foreach (var fit in fits)
            {
                trials++;
                double bic = Bic(fit);
                if (bic < winnerBic) { winner = fit; winnerBic = bic; }
            }
            if (winner is null || winnerBic >= bestBic + StrongEvidenceMargin) break;
            (best, bestBic) = (winner, winnerBic);
        }
        return best;
    }

    /// <summary>
    /// The model with a resistor right before its end (a series R and a short, a shunt R and an open, at one place) as the
    /// one resistive end it is: R to ground through a line of zero length either way, the last event a boundary to R
    /// (see <see cref="RunModel"/>: a last boundary is a matched line of that impedance). Null when there is none.
    /// </summary>
    internal static RunModel? AsTermination(RunModel m, double effectiveRiseSeconds)
    {
        int n = m.Events.Count;
        if (n < 2) return null;
        RunModelEvent resistor = m.Events[n - 2], end = m.Events[n - 1];
        bool pair = (resistor.Element, end.Element) is (RunModelElement.SeriesResistor, RunModelElement.Short)
            or (RunModelElement.ShuntResistor, RunModelElement.Open);
        if (!pair || end.RoundTripSeconds - resistor.RoundTripSeconds >= CoincidenceRiseFraction * effectiveRiseSeconds) return null;
        var termination = new RunModelEvent(RunModelElement.Boundary, end.RoundTripSeconds, resistor.Value);
        return m.WithEvents(m.Events.Take(n - 2).Append(termination));
    }
}
