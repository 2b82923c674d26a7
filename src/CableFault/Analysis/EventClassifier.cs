namespace CableFault.Analysis;

/// <summary>
/// Names each fitted event (DESIGN.md §4 vocabulary), gives its reflection coefficient and size, and says how sure
/// that is. Falls back to <see cref="EventKind.Unknown"/> when the evidence for the kind is weak.
/// </summary>
internal static class EventClassifier
{
    /// <summary>|ρ| from which a boundary is called an open or a short (common practice: a lossy line's far open
    /// rarely shows the full +1).</summary>
    internal const double EndReflection = 0.85;

    /// <summary>Smallest |ρ| of an impedance rise or drop that is listed as an event: 0.5 %, a quarter of an ohm on
    /// 50 Ω, well inside the ±2 Ω tolerance of a 50 Ω coax (common practice; the tolerance is from memory). Smaller steps
    /// are the cable's own variation, or a step generator settling slowly after its edge, not a place to dig.</summary>
    internal const double MinimumListedStepReflection = 0.005;

    /// <summary>Peak signature over noise below which the kind is not named (an event this faint is found, not read).</summary>
    internal const double MinimumKindSignalToNoise = 5;

    /// <summary>Relative standard error of the size above which the kind is not named: the data cannot tell its size to
    /// better than a factor e^0.5.</summary>
    internal const double MaximumLogSizeSigma = 0.5;

    /// <summary>Signal-to-noise scale of the confidence: 1 − e^(−SNR/5), so SNR 5 → 0.63, 10 → 0.86, 20 → 0.98.</summary>
    internal const double ConfidenceSignalToNoiseScale = 5;

    /// <summary>Rise times of record needed after the last lasting step before it is called a termination rather than
    /// a change of line that runs on past the record.</summary>
    internal const double TerminationTailRiseTimes = 10;

    /// <summary>Relative distance of a shunt resistance from the line impedance within which it is read as a tap into a
    /// matched branch (5 %: a terminated branch's resistor and cable Z₀ each hold a few per cent; common practice).</summary>
    internal const double MatchedBranchRelativeTolerance = 0.05;

    /// <summary>What the classifier is told about one event.</summary>
    /// <param name="Element">Its kind in the model.</param>
    /// <param name="Value">Its size (Ω after a boundary, F, H, Ω, s).</param>
    /// <param name="ImpedanceBeforeOhms">Line impedance before it, Ω.</param>
    /// <param name="LogSizeSigma">Standard error of ln(size).</param>
    /// <param name="PeakSignatureVolts">Largest |model with − model without|, V (signed).</param>
    /// <param name="IncidentLevelVolts">Height of the incident plateau at the port, V.</param>
    /// <param name="NoiseRmsVolts">Noise RMS of an analysed sample, V.</param>
    /// <param name="DeltaBic">BIC earned by the event.</param>
    /// <param name="IsLastOnMainLine">True when no other event whose kind can be named (see <see cref="IsWeak"/>) lies after
    /// it on the main line.</param>
    /// <param name="RecordAfterSeconds">Record length after the event, s.</param>
    /// <param name="RiseSeconds">Effective rise time, s.</param>
    /// <param name="LocalMisfitRatio">Local residual of the fit around the event over the noise RMS (about 1 where the
    /// model is right).</param>
    internal sealed record Input(RunModelElement Element, double Value, double ImpedanceBeforeOhms, double LogSizeSigma,
        double PeakSignatureVolts, double IncidentLevelVolts, double NoiseRmsVolts, double DeltaBic, bool IsLastOnMainLine,
        double RecordAfterSeconds, double RiseSeconds, double LocalMisfitRatio = 1);

    /// <summary>Kind, reflection, impedance after, size and confidence.</summary>
    internal static (EventKind Kind, double Reflection, double? ImpedanceOhms, double? Value, double Confidence) Classify(Input e)
    {
        double z = e.ImpedanceBeforeOhms;
        double snr = Math.Abs(e.PeakSignatureVolts) / Math.Max(e.NoiseRmsVolts, 1e-300);
        // Posterior odds of "event" against "no event" with equal priors: exp(ΔBIC/2) (Kass & Raftery 1995, §4.1).
        double pReal = 1 / (1 + Math.Exp(-Math.Clamp(e.DeltaBic, -700, 700) / 2));
        // What the model leaves unexplained around the event counts as noise too: an event no larger than that misfit
        // may be the fit's way of soaking it up, while one far above it (an open end beside a poorly modelled wet
        // section) stays certain.
        double snrOverMisfit = snr / Math.Max(1, e.LocalMisfitRatio);
        double confidence = pReal * (1 - Math.Exp(-snrOverMisfit / ConfidenceSignalToNoiseScale));
        bool weak = IsWeak(e.Element, e.LogSizeSigma, e.PeakSignatureVolts, e.NoiseRmsVolts);

        (EventKind kind, double rho, double? impedance, double? value) = e.Element switch
        {
            RunModelElement.Open => (EventKind.Open, 1.0, (double?)null, (double?)null),
            RunModelElement.Short => (EventKind.Short, -1.0, null, null),
            RunModelElement.Boundary => Boundary(e, z),
            RunModelElement.ShuntCapacitor => (EventKind.Capacitive, e.PeakSignatureVolts / e.IncidentLevelVolts, null, e.Value),
            RunModelElement.SeriesInductor => (EventKind.Inductive, e.PeakSignatureVolts / e.IncidentLevelVolts, null, e.Value),
            // Shunt R across Z: ρ = −Z/(2R + Z); series R: ρ = R/(R + 2Z) (DESIGN.md §2).
            // A shunt of R = Z is a tap whose other branch is matched: the two cannot be told apart on a step trace, and a
            // tap is by far the likelier cause of exactly Z₀ across the line.
            RunModelElement.ShuntResistor when Math.Abs(e.Value / z - 1) <= MatchedBranchRelativeTolerance
                => (EventKind.Tap, -z / (2 * e.Value + z), null, e.Value),
            // A resistor with nothing after it but matched line (and plenty of record) loads the port exactly as a
            // resistive end of Z‖R or Z + R does, at every frequency: the run is read as ending there, as for a step.
            RunModelElement.ShuntResistor when EndsInResistance(e) => (EventKind.Termination, -z / (2 * e.Value + z), null, z * e.Value / (z + e.Value)),
            RunModelElement.SeriesResistor when EndsInResistance(e) => (EventKind.Termination, e.Value / (e.Value + 2 * z), null, z + e.Value),
            RunModelElement.ShuntResistor => (EventKind.PartialShort, -z / (2 * e.Value + z), null, e.Value),
            RunModelElement.SeriesResistor => (EventKind.SeriesResistance, e.Value / (e.Value + 2 * z), null, e.Value),
            // Two equal lines in parallel, Z/2 on a line of Z: ρ = −1/3 (DESIGN.md §2).
            RunModelElement.Tap => (EventKind.Tap, -1.0 / 3, null, null),
            _ => (EventKind.Unknown, double.NaN, null, null),
        };
        if (weak && kind is not (EventKind.Open or EventKind.Short)) kind = EventKind.Unknown;
        return (kind, rho, impedance, value, Math.Clamp(confidence, 0, 1));
    }

    /// <summary>
    /// |ρ| an impedance step or a lumped spot shows at the instrument's own rise, or null for other elements: a step
    /// (Z − Z_prev)/(Z + Z_prev); a shunt C or series L the peak of −τ·dv/dt on a Gaussian edge, τ/(σ√(2π)) = 1.0225·τ/t_r
    /// with τ = Z·C/2 or L/2Z (DESIGN.md §2). Smoothing of a long record would shrink a spot's fitted signature; this does not.
    /// </summary>
    internal static double? SeenReflection(RunModelElement element, double value, double impedanceBeforeOhms, double riseSeconds)
    {
        double z = impedanceBeforeOhms;
        double PeakOfSpot(double tau) => tau * Simulation.StimulusSpectrum.GaussianRiseInSigmas / (Math.Sqrt(2 * Math.PI) * riseSeconds);
        return element switch
        {
            RunModelElement.Boundary => (value - z) / (value + z),
            RunModelElement.ShuntCapacitor => PeakOfSpot(z * value / 2),
            RunModelElement.SeriesInductor => PeakOfSpot(value / (2 * z)),
            _ => null,
        };
    }

    /// <summary>True when the event is too faint, or its size too loosely known, for its kind to be named (it is then
    /// <see cref="EventKind.Unknown"/>, unless it is an open or a short).</summary>
    internal static bool IsWeak(RunModelElement element, double logSizeSigma, double peakSignatureVolts, double noiseRmsVolts)
    {
        double snr = Math.Abs(peakSignatureVolts) / Math.Max(noiseRmsVolts, 1e-300);
        bool sizeKnown = element is RunModelElement.Open or RunModelElement.Short || logSizeSigma <= MaximumLogSizeSigma;
        return snr < MinimumKindSignalToNoise || !sizeKnown;
    }

    /// <summary>True when nothing follows the event on the main line and the record runs on for at least
    /// <see cref="TerminationTailRiseTimes"/> rise times after it.</summary>
    private static bool EndsInResistance(Input e) => e.IsLastOnMainLine && e.RecordAfterSeconds >= TerminationTailRiseTimes * e.RiseSeconds;

    private static (EventKind, double, double?, double?) Boundary(Input e, double z)
    {
        // ρ = (Z − Z_prev)/(Z + Z_prev) (Pozar, Microwave Engineering, 4th ed., eq. 2.35).
        double rho = (e.Value - z) / (e.Value + z);
        if (rho >= EndReflection) return (EventKind.Open, rho, null, null);
        if (rho <= -EndReflection) return (EventKind.Short, rho, null, null);
        // A lasting step with nothing after it and plenty of record: the run ends in a resistance of that many ohms
        // (a matched line of Z behaves as a resistor Z for a step).
        if (EndsInResistance(e))
            return (EventKind.Termination, rho, null, e.Value);
        return (rho > 0 ? EventKind.ImpedanceRise : EventKind.ImpedanceDrop, rho, e.Value, null);
    }
}
