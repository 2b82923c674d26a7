namespace CableFault.Comparison;

/// <summary>
/// Estimates the Z₀ of one run from the height of its incident step relative to a reference run's, both captured with
/// the same instrument and step. The port is a divider (DESIGN.md §2): the incident step on a line of Z is
/// V_i = V_s·Z/(Z_s + Z).
/// </summary>
public static class PairImpedance
{
    /// <summary>
    /// Z of the current run, Ω, from r = V_i,current / V_i,reference:
    /// Z = r·Z_ref·Z_s / (Z_s + Z_ref·(1 − r)) (solving r = [Z(Z_s + Z_ref)] / [Z_ref(Z_s + Z)] for Z). Null when the
    /// inputs are not positive and finite or the ratio implies no finite impedance (r ≥ 1 + Z_s/Z_ref).
    /// </summary>
    /// <param name="amplitudeRatio">r, dimensionless (&gt; 0). Requires the same source step on both captures: a 0.1 %
    /// drift of the step between them reads as about (1 + Z_ref/Z_s)·0.1 % of Z.</param>
    /// <param name="referenceImpedanceOhms">Z_ref, Ω (&gt; 0).</param>
    /// <param name="sourceImpedanceOhms">Instrument source impedance Z_s, Ω (&gt; 0).</param>
    public static double? Estimate(double amplitudeRatio, double referenceImpedanceOhms, double sourceImpedanceOhms)
    {
        if (!(amplitudeRatio > 0) || !double.IsFinite(amplitudeRatio)) return null;
        if (!(referenceImpedanceOhms > 0) || !(sourceImpedanceOhms > 0)) return null;
        if (!double.IsFinite(referenceImpedanceOhms) || !double.IsFinite(sourceImpedanceOhms)) return null;
        double denominator = sourceImpedanceOhms + referenceImpedanceOhms * (1 - amplitudeRatio);
        if (!(denominator > 0)) return null;
        return amplitudeRatio * referenceImpedanceOhms * sourceImpedanceOhms / denominator;
    }
}
