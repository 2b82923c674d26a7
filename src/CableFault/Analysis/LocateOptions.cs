using CableFault.Cables;

namespace CableFault.Analysis;

/// <summary>What <see cref="Locator.Locate"/> needs to know about the cable and the instrument.</summary>
public sealed record LocateOptions
{
    /// <summary>Velocity factor v/c of the cable, in (0, 1].</summary>
    public required double VelocityFactor { get; init; }

    /// <summary>Relative standard uncertainty of the VF, ≥ 0. Default 0.02 (2 %: a catalogue or default VF; common
    /// practice); smaller after calibration on a run of known length.</summary>
    public double VelocityFactorRelativeSigma { get; init; } = 0.02;

    /// <summary>Where the VF came from: option, metadata, cable, calibrated or default.</summary>
    public string VelocityFactorSource { get; init; } = "default";

    /// <summary>Characteristic impedance Z₀ of the cable at the connector, Ω (&gt; 0). Default 50.</summary>
    public double ImpedanceOhms { get; init; } = 50;

    /// <summary>Instrument source impedance Z_s, Ω (&gt; 0). Default 50.</summary>
    public double SourceImpedanceOhms { get; init; } = 50;

    /// <summary>Cable loss model; null when not known (lossless, unless <see cref="EstimateLoss"/>).</summary>
    public CableLossModel? Loss { get; init; }

    /// <summary>When <see cref="Loss"/> is null, estimate the cable's loss (skin effect and loop DC resistance) from the
    /// trace in the model fit rather than take the cable as lossless: a lossy cable fitted as lossless leaves a misfit
    /// that the fit explains with invented events. Default false.</summary>
    public bool EstimateLoss { get; init; }

    /// <summary>Fit a slow first-order settling of the instrument's step (part and time constant) when the trace shows one
    /// the information criterion accepts, and read every echo with it (see SettlingEstimation). Off by default: on traces
    /// without such a creep the probe can take an early event's misfit for one (benchmark: 4 extra false events in 200
    /// runs), so it is for instruments known to creep. Default false.</summary>
    public bool EstimateSettling { get; init; }

    /// <summary>While the loss is estimated, start the model selection that follows on the cores the probe leaves idle,
    /// and keep it when the probe finds no loss (the result is the same either way; see Speculation). Turn it off where
    /// traces are already worked on side by side (a batch): there it would only take cores from the others. Default true.</summary>
    public bool SelectAheadOfLossProbe { get; init; } = true;

    /// <summary>Let a model run that nothing else runs beside (a fit's serial steps) spread its frequency bins over the
    /// cores; the result is the same bits either way. Turn it off where traces are already worked on side by side (a
    /// batch). Default true.</summary>
    public bool SplitRunsAcrossCores { get; init; } = true;

    /// <summary>Round-trip time from the incident edge's 50 % point to the reference plane, s (e.g. a launch lead's
    /// delay found by calibration); distances are measured from there. Null means zero.</summary>
    public double? TimeZeroOffsetSeconds { get; init; }

    /// <summary>Refine the candidates with the parametric model fit (true) or report them as detected (false).</summary>
    public bool RefineWithModel { get; init; } = true;

    /// <summary>Progress 0…1, optional.</summary>
    public IProgress<double>? Progress { get; init; }

    /// <summary>Distances in the warnings in feet instead of metres (what the user asked to see); the results stay in
    /// metres.</summary>
    public bool WarningsInFeet { get; init; }

    /// <summary>A distance for a warning, in the unit of <see cref="WarningsInFeet"/>, with its symbol.</summary>
    internal string WarningDistance(double meters, string format = "0.###") => WarningsInFeet
        ? (meters / PhysicalConstants.MetersPerFoot).ToString(format, System.Globalization.CultureInfo.InvariantCulture) + " ft"
        : meters.ToString(format, System.Globalization.CultureInfo.InvariantCulture) + " m";

    /// <summary>Cancels a long analysis.</summary>
    public CancellationToken CancellationToken { get; init; }

    /// <summary>Every problem with the options, each as a sentence naming the option; empty when valid.</summary>
    public IReadOnlyList<string> Problems()
    {
        var problems = new List<string>();
        if (!(VelocityFactor > 0 && VelocityFactor <= 1)) problems.Add($"velocity factor {VelocityFactor} must be in (0, 1]; give --vf, e.g. 0.66");
        if (!(VelocityFactorRelativeSigma >= 0) || !double.IsFinite(VelocityFactorRelativeSigma)) problems.Add($"VF uncertainty {VelocityFactorRelativeSigma} must be zero or positive");
        if (!(ImpedanceOhms > 0) || !double.IsFinite(ImpedanceOhms)) problems.Add($"cable impedance {ImpedanceOhms} Ω must be a positive number; give --z0, e.g. 50");
        if (!(SourceImpedanceOhms > 0) || !double.IsFinite(SourceImpedanceOhms)) problems.Add($"source impedance {SourceImpedanceOhms} Ω must be a positive number");
        if (TimeZeroOffsetSeconds is double t && !double.IsFinite(t)) problems.Add("time-zero offset must be a finite number of seconds");
        return problems;
    }
}
