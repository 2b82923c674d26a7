using System.Globalization;
using CableFault.Cables;
using CableFault.Traces;

namespace CableFault.Analysis;

/// <summary>
/// The cable settings a measurement is read with, and where each came from. The precedence is the one of the
/// command-line contract: explicit option, else trace metadata, else the named cable type, else a default with a warning.
/// </summary>
/// <param name="VelocityFactor">VF used for distances.</param>
/// <param name="VelocityFactorSource">option | metadata | cable | calibrated | default.</param>
/// <param name="VelocityFactorRelativeSigma">1-σ relative uncertainty of the VF (δVF/VF), which becomes δd/d.</param>
/// <param name="ImpedanceOhms">Cable Z₀, Ω.</param>
/// <param name="ImpedanceSource">option | metadata | cable | default.</param>
/// <param name="SourceImpedanceOhms">Instrument source impedance, Ω.</param>
/// <param name="Loss">Cable loss model, or null when unknown (the locate fit then estimates it).</param>
/// <param name="Cable">The cable type, when one was named.</param>
/// <param name="Warnings">What the user should know about these choices.</param>
public sealed record CableSettings(
    double VelocityFactor, string VelocityFactorSource, double VelocityFactorRelativeSigma,
    double ImpedanceOhms, string ImpedanceSource, double SourceImpedanceOhms,
    CableLossModel? Loss, CableType? Cable, IReadOnlyList<string> Warnings)
{
    /// <summary>VF assumed when nothing says otherwise: solid polyethylene, the commonest dielectric (common practice).</summary>
    public const double DefaultVelocityFactor = 0.66;

    /// <summary>Z₀ assumed when nothing says otherwise, Ω.</summary>
    public const double DefaultImpedanceOhms = 50;

    /// <summary>
    /// Relative VF uncertainty when the VF is only the default: installed cables span roughly 0.60–0.88, so ±10 % (1 σ)
    /// is an honest figure (common practice).
    /// </summary>
    public const double DefaultVelocityFactorRelativeSigma = 0.10;

    /// <summary>
    /// Relative VF uncertainty of a nominal cable-type or user-given VF: data sheets state VF to about ±2–3 %, and
    /// production spread is of that order (common practice).
    /// </summary>
    public const double NominalVelocityFactorRelativeSigma = 0.02;

    /// <summary>Resolves the settings for one trace.</summary>
    /// <param name="trace">The trace (its metadata is consulted).</param>
    /// <param name="velocityFactorOption">--vf, or null.</param>
    /// <param name="impedanceOption">--z0, or null.</param>
    /// <param name="cableOption">--cable designation, or null.</param>
    /// <param name="sourceImpedanceOption">--source-ohms, or null.</param>
    /// <param name="library">Cable types to resolve names against.</param>
    /// <param name="velocityFactorRelativeSigmaOption">--vf-uncertainty (relative), or null.</param>
    public static CableSettings Resolve(Trace trace, double? velocityFactorOption, double? impedanceOption, string? cableOption,
        double? sourceImpedanceOption, CableLibrary library, double? velocityFactorRelativeSigmaOption = null)
    {
        var warnings = new List<string>();
        string? cableName = cableOption ?? trace.MetadataOrNull("cable");
        CableType? cable = null;
        if (cableName is not null)
        {
            cable = library.Find(cableName);
            if (cable is null)
            {
                if (cableOption is not null) library.Get(cableName); // throws the listing error
                warnings.Add($"trace metadata names cable '{cableName}', which is not a known type; ignoring it");
            }
        }

        double vf; string vfSource; double vfSigma;
        if (velocityFactorOption is double v) { vf = v; vfSource = "option"; vfSigma = NominalVelocityFactorRelativeSigma; }
        else if (Number(trace, "vf") is double mv) { vf = mv; vfSource = trace.MetadataOrNull("vf_source") == "calibrated" ? "calibrated" : "metadata"; vfSigma = Number(trace, "vf_sigma") ?? NominalVelocityFactorRelativeSigma; }
        else if (cable is not null) { vf = cable.VelocityFactor; vfSource = "cable"; vfSigma = NominalVelocityFactorRelativeSigma; }
        else
        {
            vf = DefaultVelocityFactor; vfSource = "default"; vfSigma = DefaultVelocityFactorRelativeSigma;
            warnings.Add($"no velocity factor given (--vf, trace metadata or --cable): assuming {DefaultVelocityFactor} (solid PE); distances may be off by ±{DefaultVelocityFactorRelativeSigma:P0} or more");
        }
        if (velocityFactorRelativeSigmaOption is double sigma) vfSigma = sigma;
        if (!(vf > 0 && vf <= 1)) throw new InputException($"velocity factor {vf.ToString(CultureInfo.InvariantCulture)} (from {vfSource}) must be between 0 and 1, e.g. 0.66");
        if (!(vfSigma >= 0 && vfSigma < 1)) throw new InputException($"VF uncertainty {vfSigma.ToString(CultureInfo.InvariantCulture)} must be a fraction between 0 and 1, e.g. 0.02 for 2 %");

        double z0; string z0Source;
        if (impedanceOption is double z) { z0 = z; z0Source = "option"; }
        else if (Number(trace, "z0") is double mz) { z0 = mz; z0Source = "metadata"; }
        else if (cable is not null) { z0 = cable.ImpedanceOhms; z0Source = "cable"; }
        else
        {
            z0 = DefaultImpedanceOhms; z0Source = "default";
            warnings.Add($"no cable impedance given (--z0, trace metadata or --cable): assuming {DefaultImpedanceOhms} Ω; impedances and fault sizes scale with it");
        }
        if (!(z0 > 0) || !double.IsFinite(z0)) throw new InputException($"cable impedance {z0.ToString(CultureInfo.InvariantCulture)} Ω (from {z0Source}) must be a positive number, e.g. 50");

        double source = sourceImpedanceOption ?? Number(trace, "source_ohms") ?? z0;
        if (!(source > 0) || !double.IsFinite(source)) throw new InputException($"source impedance {source.ToString(CultureInfo.InvariantCulture)} Ω must be a positive number");

        return new CableSettings(vf, vfSource, vfSigma, z0, z0Source, source, cable?.Loss, cable, warnings);
    }

    private static double? Number(Trace trace, string key)
    {
        string? text = trace.MetadataOrNull(key);
        if (text is null) return null;
        if (double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out double value) && double.IsFinite(value)) return value;
        throw new InputException($"trace metadata '{key}={text}' is not a number; fix the '# {key}=' line or give the value as an option");
    }

    /// <summary>Options for <see cref="Locator"/> built from these settings; a loss that no setting gives is estimated
    /// from the trace (see <see cref="LocateOptions.EstimateLoss"/>).</summary>
    public LocateOptions ToLocateOptions() => new()
    {
        EstimateLoss = Loss is null,
        VelocityFactor = VelocityFactor,
        VelocityFactorRelativeSigma = VelocityFactorRelativeSigma,
        VelocityFactorSource = VelocityFactorSource,
        ImpedanceOhms = ImpedanceOhms,
        SourceImpedanceOhms = SourceImpedanceOhms,
        Loss = Loss,
    };
}
