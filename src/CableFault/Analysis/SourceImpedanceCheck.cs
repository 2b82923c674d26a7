using System.Globalization;

namespace CableFault.Analysis;

/// <summary>
/// Whether the trace reads better with a 50 Ω instrument than with the source impedance taken. Most reflectometers are
/// 50 Ω (common practice); on 75 Ω or 100 Ω cable, a source taken to match the cable when it does not turns every echo
/// that returns to the instrument into a second echo (ρ_s = (50 − 75)/(50 + 75) = −0.2 on 75 Ω: Pozar, <i>Microwave
/// Engineering</i>, 4th ed., eq. 2.35), which the fit reads as an event at twice the distance, and scales every
/// impedance beyond. When the selected model has an event at two or three times an earlier one's round trip, it is
/// refitted with a 50 Ω source (its step's amplitude rescaled so that the first plateau stays where it is), with every
/// event and without those returns; a better criterion is said in a warning.
/// The reading is not changed: the instrument's impedance is the technician's to state. On lossy cable the mismatch
/// shows instead as a step at the port, inside the blind zone; <see cref="ConnectorStepHint"/> names it there.
/// </summary>
internal static class SourceImpedanceCheck
{
    /// <summary>The source impedance tried, Ω: that of most reflectometers (common practice).</summary>
    internal const double CommonSourceOhms = 50;

    /// <summary>Share of the criterion the 50 Ω reading must gain besides the evidence margin (as for the context probes).</summary>
    private const double RelativeMargin = 0.05;

    /// <summary>The warning, or null when the source taken is already 50 Ω, or the trace does not read better with it.</summary>
    internal static string? Warning(ModelSelection.Result selection, FitData data, double effectiveRiseSeconds, CancellationToken cancellation)
    {
        var m = selection.Fit.Model;
        var c = m.Context;
        if (Math.Abs(c.SourceImpedanceOhms / CommonSourceOhms - 1) < 0.1) return null;
        // The first plateau is 2A·Z₀/(Z_s + Z₀) (DESIGN.md §2): keep it with the new Z_s. Read twice: with every event,
        // and without those at two or three times an earlier event's round trip (what the instrument's own reflection
        // makes of an echo, which the model with the taken source had to put there as events).
        double amplitude = m.AmplitudeVolts * (CommonSourceOhms + c.ImpedanceOhms) / (c.SourceImpedanceOhms + c.ImpedanceOhms);
        bool IsReturn(RunModelEvent e) => m.Events.Any(earlier => earlier.RoundTripSeconds < e.RoundTripSeconds - effectiveRiseSeconds
            && Enumerable.Range(2, 2).Any(k => Math.Abs(e.RoundTripSeconds - k * earlier.RoundTripSeconds) < effectiveRiseSeconds));
        var context = c with { SourceImpedanceOhms = CommonSourceOhms };
        RunModel Fifty(IEnumerable<RunModelEvent> events) =>
            new(context, amplitude, m.TimeOffsetSeconds, m.RiseSeconds, events.ToList(), m.OffsetVolts);
        // Without such an event there is nothing the instrument's reflection would explain (a step it makes at the port
        // is named where the blind zone is reported): no refit, which keeps the check off most runs.
        if (!m.Events.Any(IsReturn)) return null;
        var starts = new List<RunModel> { Fifty(m.Events), Fifty(m.Events.Where(e => !IsReturn(e))) };
        var fits = ModelFitter.FitEach(starts, data, selection.VarianceVolts2, cancellation: cancellation);
        var bics = fits.Select(f => ModelSelection.Criterion(f, data, selection.VarianceVolts2)).ToArray();
        double taken = ModelSelection.Criterion(selection.Fit, data, selection.VarianceVolts2);
        ModelSelection.DebugTrace?.Invoke($"source check: bic {string.Join(" / ", bics.Select(b => b.ToString("0.0", CultureInfo.InvariantCulture)))} with 50 Ω against {taken:0.0} with {c.SourceImpedanceOhms:0.#} Ω");
        // Without the returns, the 50 Ω reading explains events the other needed (the usual way a source mismatch
        // shows: a 150 Ω end 30 m out read with a 75 Ω source gains an "end" at 60 m, and gives it up for 15 of the
        // criterion at 50 Ω); with every event kept, it must do better by the probes' relative margin too.
        bool better = bics[1] < taken - ModelSelection.EvidenceMargin
            || bics[0] < taken - Math.Max(ModelSelection.EvidenceMargin, RelativeMargin * Math.Abs(taken));
        if (!better) return null;
        return string.Create(CultureInfo.InvariantCulture,
            $"the trace reads better with a {CommonSourceOhms:0} Ω instrument than with the {c.SourceImpedanceOhms:0.#} Ω taken: if yours is {CommonSourceOhms:0} Ω, give its source impedance (--source-ohms {CommonSourceOhms:0}). As read, an echo that returns to the instrument comes back again and may show as an event at twice its distance, and every impedance beyond reads {c.SourceImpedanceOhms / CommonSourceOhms:0.##} times what it is.");
    }

    /// <summary>Instrument source impedances common in the trade, Ω: 50 Ω (RF and general) and 75 Ω (video and CATV)
    /// reflectometers (common practice).</summary>
    private static readonly double[] CommonSources = [50, 75];

    /// <summary>
    /// A step at the connector that is just what an instrument of another common impedance shows on this cable: the
    /// model takes the instrument as <paramref name="sourceOhms"/> and the step as the cable's, so a
    /// source of Z_s·(1 − ρ)/(1 + ρ) would read the same cable without it (ρ = (Z − Z_s)/(Z + Z_s), Pozar,
    /// <i>Microwave Engineering</i>, 4th ed., eq. 2.35). Left so, every impedance and size beyond is read on a scale
    /// that is off by that ratio (a 75 Ω camera on 75 Ω cable, measured with a 50 Ω instrument taken for 75 Ω, read as
    /// 112 Ω). Empty unless the implied source is within 4 % of a common one and 10 % from the one assumed.
    /// </summary>
    internal static string ConnectorStepHint(LocatedEvent inside, double sourceOhms)
    {
        if (inside.Kind is not (EventKind.ImpedanceRise or EventKind.ImpedanceDrop)) return "";
        double implied = sourceOhms * (1 - inside.Reflection) / (1 + inside.Reflection);
        double common = CommonSources.MinBy(c => Math.Abs(implied / c - 1));
        if (Math.Abs(implied / common - 1) > 0.04 || Math.Abs(common / sourceOhms - 1) < 0.1) return "";
        return string.Create(CultureInfo.InvariantCulture,
            $" It is just what a {common:0} Ω instrument shows on this cable: if yours is {common:0} Ω, give its source impedance (--source-ohms {common:0}), or every impedance beyond reads {sourceOhms / common:0.##} times what it is, and every lumped size is off with it.");
    }
}
