namespace CableFault.Analysis;

/// <summary>
/// A short section of other cable and lumped reactive spots look alike at the resolution of an edge: a section of higher
/// impedance a few rise times long reads first as a series L (or, after splits, as a row of them), a lower one as a shunt
/// C. But a row of lumped spots is not the same run: each spot also delays what follows by its time constant (Z·C/2 or
/// L/(2Z)), so a section read as spots puts every later event too far. These helpers build the section hypothesis that
/// <see cref="ModelSelection"/> and <see cref="ResolutionRefinement"/> test against the spots by the information criterion.
/// </summary>
internal static class ReactiveSections
{
    /// <summary>Largest gap between neighbouring spots of one kind, in effective rise times, for them to be read as one
    /// stretch: spots further apart are separate places (a section that long would show its flat top and not be read as
    /// spots).</summary>
    internal const double ClusterGapRiseTimes = 2;

    /// <summary>Index of the last event of the run of shunt-C or series-L events of one kind that starts at
    /// <paramref name="first"/>, neighbours at most <see cref="ClusterGapRiseTimes"/> effective rises apart
    /// (<paramref name="first"/> itself for a single spot).</summary>
    internal static int ClusterEnd(RunModel m, int first, double effectiveRiseSeconds)
    {
        int last = first;
        while (last + 1 < m.Events.Count && m.Events[last + 1].Element == m.Events[first].Element
               && m.Events[last + 1].RoundTripSeconds - m.Events[last].RoundTripSeconds <= ClusterGapRiseTimes * effectiveRiseSeconds)
            last++;
        return last;
    }

    /// <summary>BIC units by which a section (four parameters) must beat <paramref name="spotCount"/> spots (two each) it
    /// replaces: fewer parameters need only not lose by the evidence margin, as many must not lose, more must win by it.</summary>
    internal static double SectionMargin(int spotCount) =>
        spotCount > 2 ? -ModelSelection.EvidenceMargin : spotCount == 2 ? 0 : ModelSelection.EvidenceMargin;

    /// <summary>True for a shunt capacitor or a series inductor.</summary>
    internal static bool IsReactive(RunModelElement element) =>
        element is RunModelElement.ShuntCapacitor or RunModelElement.SeriesInductor;

    /// <summary>
    /// The model with spots <paramref name="first"/>..<paramref name="last"/> replaced by one section of round trip
    /// <paramref name="tauSeconds"/> centred on them, of the impedance that gives the same area under the reflection as
    /// their summed C or L (see <see cref="SectionImpedance"/>), and the later events moved later by the delay the spots
    /// took up; null when no section fits (it would start at or before the reference plane, or no positive impedance
    /// matches).
    /// </summary>
    internal static RunModel? Replace(RunModel m, int first, int last, double tauSeconds)
    {
        var spots = m.Events.Skip(first).Take(last - first + 1).ToList();
        double total = spots.Sum(e => e.Value);
        double centre = spots.Sum(e => e.Value * e.RoundTripSeconds) / total;
        double t1 = centre - tauSeconds / 2, t2 = centre + tauSeconds / 2;
        if (t1 <= 0 || (first > 0 && t1 <= m.Events[first - 1].RoundTripSeconds)) return null;
        if (last + 1 < m.Events.Count && t2 >= m.Events[last + 1].RoundTripSeconds) return null;
        double z = RunModelBuilder.ImpedanceBefore(m, first);
        double z1 = SectionImpedance(spots[0].Element, total, z, tauSeconds);
        if (!(z1 > 0) || !double.IsFinite(z1)) return null;
        // Each spot delays what lies beyond it by its transmission's low-frequency group delay, Z·C/2 or L/(2Z) each way
        // (T = 1/(1 + jωτ)), so the fit placed the later events that much early; a section of other cable long enough to
        // be resolved is mild and adds almost nothing beyond its length (see SectionExcessDelaySeconds: second order in
        // Z₁ − Z), so they move that much later. The excess of the starting section is not taken off: its length is a
        // guess, and a guess shorter than the true section makes Z₁ extreme and the excess large (taken off, it cost 13
        // false events on benchmark seed 3 and 8 on the stated seed).
        double delay = spots.Sum(e => 2 * SpotDelaySeconds(e, z));
        var list = m.Events.Select((e, k) => k > last ? e with { RoundTripSeconds = e.RoundTripSeconds + delay } : e).ToList();
        list.RemoveRange(first, last - first + 1);
        list.InsertRange(first, [new RunModelEvent(RunModelElement.Boundary, t1, z1), new RunModelEvent(RunModelElement.Boundary, t2, z)]);
        return m.WithEvents(list);
    }

    /// <summary>
    /// Impedance Z₁ of a section of round trip τ in a line of Z with the same area under its reflection as a shunt C or
    /// series L: a short line of Z₁ reflects Γ ≈ jω(τ/4)(Z₁/Z − Z/Z₁) to first order in ωτ (its excess series L
    /// (τ/2)(Z₁ − Z) and shunt C (τ/2)(1/Z₁ − 1/Z), the approximation behind stepped-impedance filters: Pozar,
    /// <i>Microwave Engineering</i>, 4th ed., §8.6, from memory), which is the reflection of C = (τ/2)(1/Z₁ − Z₁/Z²) or
    /// L = (τ/2)(Z₁ − Z²/Z₁). Solved for Z₁: Z₁²/Z² + b·Z₁ − 1 = 0 (C, b = 2C/τ) or Z₁² − b·Z₁ − Z² = 0 (L, b = 2L/τ).
    /// </summary>
    internal static double SectionImpedance(RunModelElement element, double value, double z, double tauSeconds)
    {
        double b = 2 * value / tauSeconds;
        return element == RunModelElement.ShuntCapacitor
            ? z * z * (-b + Math.Sqrt(b * b + 4 / (z * z))) / 2
            : (b + Math.Sqrt(b * b + 4 * z * z)) / 2;
    }

    /// <summary>
    /// The model with shunt C <paramref name="index"/> replaced by a tap whose open branch has the same low-frequency
    /// admittance: an open stub of length ℓ on a line of Z has input admittance j·tan(βℓ)/Z ≈ jωℓ/(vZ) (Pozar,
    /// <i>Microwave Engineering</i>, 4th ed., §2.3, from memory), a capacitance C = ℓ/(vZ), so its round trip is
    /// τ = 2ℓ/v = 2·Z·C. Null when that round trip is shorter than <paramref name="minimumBranchSeconds"/> (there the stub
    /// is the capacitance it looks like).
    /// </summary>
    internal static RunModel? AsTap(RunModel m, int index, double minimumBranchSeconds)
    {
        var e = m.Events[index];
        if (e.Element != RunModelElement.ShuntCapacitor) return null;
        double branch = 2 * RunModelBuilder.ImpedanceBefore(m, index) * e.Value;
        if (!(branch >= minimumBranchSeconds)) return null;
        var list = m.Events.ToList();
        list[index] = e with { Element = RunModelElement.Tap, Value = branch };
        return m.WithEvents(list);
    }

    /// <summary>Largest relative difference between the impedance before a narrow boundary pair and after it for the pair
    /// to count as an excursion that returns (a spot), rather than a change of line.</summary>
    internal const double ReturnRelativeTolerance = 0.2;

    /// <summary>
    /// The reverse of <see cref="Replace"/>: boundaries <paramref name="first"/> and <paramref name="first"/> + 1, at most
    /// <paramref name="maximumSeconds"/> apart and returning to within <see cref="ReturnRelativeTolerance"/> of the
    /// impedance before them, as the one lumped spot of the same reflection area (series L = (τ/2)(Z₁ − Z²/Z₁) for a higher
    /// Z₁, shunt C = (τ/2)(1/Z₁ − Z₁/Z²) for a lower one) at their centre, the later events moved earlier by the delay
    /// the spot adds beyond the section's own (see <see cref="SectionExcessDelaySeconds"/>). A fit that cannot place a
    /// few-rise-time excursion often makes it a narrow pair of extreme boundaries (ρ near ±1), which would read as an open
    /// or a short in the middle of a run. A pair that does not return, overshoots both lines and is at most
    /// <paramref name="maximumStepSeconds"/> wide is the spot and a step at one place (a connector where two cables meet):
    /// the spot of the section's excess reactance at the junction of Z and Z₂, L = (τ/2)(Z₁ − Z·Z₂/Z₁) (a short line of Z₁
    /// is series L (τ/2)Z₁ and shunt C (τ/2)/Z₁, and a shunt C at the junction reflects like a series L of −Z·Z₂·C, to
    /// first order in ωτ), followed by the step to Z₂. Null when the pair does not qualify.
    /// </summary>
    internal static RunModel? ToSpot(RunModel m, int first, double maximumSeconds, double maximumStepSeconds = 0)
    {
        if (first + 1 >= m.Events.Count) return null;
        RunModelEvent a = m.Events[first], b = m.Events[first + 1];
        if (a.Element != RunModelElement.Boundary || b.Element != RunModelElement.Boundary) return null;
        double tau = b.RoundTripSeconds - a.RoundTripSeconds;
        if (!(tau > 0) || tau > maximumSeconds) return null;
        double z = RunModelBuilder.ImpedanceBefore(m, first), z1 = a.Value;
        if (z1 == z) return null;
        if (Math.Abs(b.Value / z - 1) > ReturnRelativeTolerance)
        {
            // Only an excursion beyond both lines is a spot: a staircase (Z₁ between Z and Z₂) is two steps.
            bool overshoots = z1 > Math.Max(z, b.Value) || z1 < Math.Min(z, b.Value);
            return tau <= maximumStepSeconds && overshoots ? SpotAndStep(m, first, z, z1, b.Value, tau) : null;
        }
        var spot = z1 > z
            ? new RunModelEvent(RunModelElement.SeriesInductor, (a.RoundTripSeconds + b.RoundTripSeconds) / 2, tau / 2 * (z1 - z * z / z1))
            : new RunModelEvent(RunModelElement.ShuntCapacitor, (a.RoundTripSeconds + b.RoundTripSeconds) / 2, tau / 2 * (1 / z1 - z1 / (z * z)));
        if (!(spot.Value > 0) || !double.IsFinite(spot.Value)) return null;
        double delay = 2 * (SpotDelaySeconds(spot, z) - SectionExcessDelaySeconds(z1, z, tau));
        var list = m.Events.Select((e, k) => k > first + 1 ? e with { RoundTripSeconds = e.RoundTripSeconds - delay } : e).ToList();
        list.RemoveRange(first, 2);
        list.Insert(first, spot);
        // The line after the pair keeps the impedance the second boundary set only if it differs from Z; a spot returns
        // to Z exactly, so a later boundary's impedance is unchanged and the small difference is left to the fit.
        return m.WithEvents(list);
    }

    /// <summary>
    /// The one-way delay a section of <paramref name="z1"/> Ω and round trip <paramref name="tauSeconds"/> adds, at low
    /// frequencies, beyond that of the same length of the line of <paramref name="z"/> Ω it sits in, s. Over ℓ = vτ/2 a line
    /// of Z₁ has series L ℓZ₁/v and shunt C ℓ/(Z₁v); beyond the line of Z that is ΔL = (τ/2)(Z₁ − Z) and
    /// ΔC = (τ/2)(1/Z₁ − 1/Z), which delay what passes by ΔL/(2Z) + Z·ΔC/2 (see <see cref="SpotDelaySeconds"/>)
    /// = (τ/4)(Z₁/Z + Z/Z₁ − 2). That is second order in Z₁ − Z: a mild section delays nothing beyond its length, while a
    /// narrow extreme one (a spot the fit bent into a few-ohm stretch) delays nearly as much as the spot of the same
    /// reflection area, whose delay (τ/4)|Z/Z₁ − Z₁/Z| exceeds it by (τ/2)(1 − Z₁/Z) for a lower Z₁ and (τ/2)(1 − Z/Z₁)
    /// for a higher one: never more than the section's own one-way time.
    /// </summary>
    internal static double SectionExcessDelaySeconds(double z1, double z, double tauSeconds) => tauSeconds / 4 * (z1 / z + z / z1 - 2);

    /// <summary>Boundaries <paramref name="first"/> (to <paramref name="z1"/>) and the next (to <paramref name="z2"/>),
    /// <paramref name="tauSeconds"/> apart on a line of <paramref name="z"/>, as a spot and a step at their centre (see
    /// <see cref="ToSpot"/>); null when the spot vanishes. The later events keep their times: a spot this narrow delays them
    /// by a small part of the rise, left to the fit.</summary>
    private static RunModel? SpotAndStep(RunModel m, int first, double z, double z1, double z2, double tauSeconds)
    {
        double inductance = tauSeconds / 2 * (z1 - z * z2 / z1);
        if (!double.IsFinite(inductance) || inductance == 0) return null;
        double centre = (m.Events[first].RoundTripSeconds + m.Events[first + 1].RoundTripSeconds) / 2;
        var spot = inductance > 0
            ? new RunModelEvent(RunModelElement.SeriesInductor, centre, inductance)
            : new RunModelEvent(RunModelElement.ShuntCapacitor, centre, -inductance / (z * z2));
        var list = m.Events.ToList();
        list[first] = spot;
        list[first + 1] = m.Events[first + 1] with { RoundTripSeconds = centre };
        return m.WithEvents(list);
    }

    /// <summary>Widest cluster of events, in effective rise times, tried as spots by <see cref="ClusterAsSpots"/>: beyond
    /// it a section shows its flat top and two spots the dip between them, and the fit tells them apart unaided.</summary>
    internal const double SpotClusterMaximumRiseTimes = 4;

    /// <summary>Most events a cluster read as spots may hold.</summary>
    private const int SpotClusterMaximumEvents = 3;

    /// <summary>
    /// Clusters of two or three events from <paramref name="first"/> (boundaries and spots, at most
    /// <see cref="SpotClusterMaximumRiseTimes"/> effective rises from first to last, the line after them back within
    /// <see cref="ReturnRelativeTolerance"/> of the impedance before) read as two lumped spots, one at each end of the
    /// cluster, sharing its reflection area equally. Two equal spots a rise or two apart (the two connectors of a patch
    /// lead, two kinks) blur into a rise and a fall, often with a spot between, that the fit takes for a short section;
    /// the spots have no more parameters, and the criterion decides.
    /// </summary>
    internal static List<RunModel> ClusterAsSpots(RunModel m, int first, double effectiveRiseSeconds)
    {
        var candidates = new List<RunModel>();
        double z = RunModelBuilder.ImpedanceBefore(m, first);
        for (int last = first + 1; last < Math.Min(m.Events.Count, first + SpotClusterMaximumEvents); last++)
        {
            var cluster = m.Events.Skip(first).Take(last - first + 1).ToList();
            if (cluster.Any(e => e.Element is not (RunModelElement.Boundary or RunModelElement.ShuntCapacitor or RunModelElement.SeriesInductor))) break;
            if (cluster.All(e => IsReactive(e.Element))) continue;
            double span = cluster[^1].RoundTripSeconds - cluster[0].RoundTripSeconds;
            if (!(span > 0) || span > SpotClusterMaximumRiseTimes * effectiveRiseSeconds) break;
            if (Math.Abs(RunModelBuilder.ImpedanceBefore(m, last + 1) / z - 1) > ReturnRelativeTolerance) continue;
            double inductance = EquivalentSeriesInductance(m, first, last, z);
            if (!double.IsFinite(inductance) || inductance == 0) continue;
            var spot = inductance > 0
                ? new RunModelEvent(RunModelElement.SeriesInductor, 0, inductance / 2)
                : new RunModelEvent(RunModelElement.ShuntCapacitor, 0, -inductance / (z * z) / 2);
            // The spots delay what lies beyond by their time constants (see SpotDelaySeconds); the cluster's own spots
            // already did.
            double delay = 2 * (2 * SpotDelaySeconds(spot, z) - cluster.Where(e => IsReactive(e.Element)).Sum(e => SpotDelaySeconds(e, z)));
            var list = m.Events.Select((e, k) => k > last ? e with { RoundTripSeconds = e.RoundTripSeconds - delay } : e).ToList();
            list.RemoveRange(first, last - first + 1);
            list.InsertRange(first, [spot with { RoundTripSeconds = cluster[0].RoundTripSeconds }, spot with { RoundTripSeconds = cluster[^1].RoundTripSeconds }]);
            candidates.Add(m.WithEvents(list));
        }
        return candidates;
    }

    /// <summary>
    /// The series L with the same low-frequency reflection as events <paramref name="first"/>..<paramref name="last"/>
    /// on a line of <paramref name="z"/> Ω, H (negative for a net shunt C, which reflects like L = −Z²·C): each section
    /// between them counts (τ/2)(Z₁ − Z²/Z₁) (see <see cref="SectionImpedance"/>), each series L itself and each shunt C
    /// as −Z²·C.
    /// </summary>
    private static double EquivalentSeriesInductance(RunModel m, int first, int last, double z)
    {
        double total = 0;
        for (int k = first; k <= last; k++)
        {
            var e = m.Events[k];
            total += e.Element switch
            {
                RunModelElement.SeriesInductor => e.Value,
                RunModelElement.ShuntCapacitor => -z * z * e.Value,
                _ => 0,
            };
            if (k < last)
            {
                double zSection = RunModelBuilder.ImpedanceBefore(m, k + 1);
                double tau = m.Events[k + 1].RoundTripSeconds - e.RoundTripSeconds;
                total += tau / 2 * (zSection - z * z / zSection);
            }
        }
        return total;
    }

    /// <summary>
    /// The one-way delay a shunt C or series L on a line of <paramref name="z"/> Ω adds to what passes it, s: the
    /// low-frequency group delay of its transmission T = 1/(1 + jωτ), τ = Z·C/2 or L/(2Z).
    /// </summary>
    internal static double SpotDelaySeconds(RunModelEvent spot, double z) =>
        spot.Element == RunModelElement.ShuntCapacitor ? z * spot.Value / 2 : spot.Value / (2 * z);

    /// <summary>Widest pair of boundaries that do not return, in effective rise times, tried as a spot and a step: far
    /// below the resolution, where the pair cannot be a section the data resolve.</summary>
    internal const double StepSpotRiseTimes = 0.5;

    /// <summary>
    /// What a narrow pair of boundaries at <paramref name="first"/> may stand for (see <see cref="ToSpot"/>, at most two
    /// effective rises wide): the spot, and, for a capacitive one, the tap of the same admittance (see
    /// <see cref="AsTap"/>). Empty when the pair does not qualify.
    /// </summary>
    internal static List<RunModel> SpotCandidates(RunModel m, int first, double effectiveRiseSeconds)
    {
        if (ToSpot(m, first, 2 * effectiveRiseSeconds, StepSpotRiseTimes * effectiveRiseSeconds) is not RunModel spot) return [];
        var candidates = new List<RunModel> { spot };
        if (AsTap(spot, first, effectiveRiseSeconds) is RunModel tap) candidates.Add(tap);
        return candidates;
    }
}
