namespace CableFault.FrequencyDomain;

/// <summary>Settings of the frequency-to-time conversion. Defaults suit a VNA sweep set up for low-pass use.</summary>
public sealed record FrequencyToTimeOptions
{
    /// <summary>Transform mode. Default automatic.</summary>
    public TransformMode Mode { get; init; } = TransformMode.Automatic;

    /// <summary>Spectral window. Default Kaiser (with β = 6): sidelobes near −44 dB; 10–90 % rise ≈ 0.99/f_max against 0.45/f_max unwindowed.</summary>
    public SpectralWindow Window { get; init; } = SpectralWindow.Kaiser;

    /// <summary>Kaiser shape β = πα (0 … 20); used only with <see cref="SpectralWindow.Kaiser"/>. Default 6.</summary>
    public double KaiserBeta { get; init; } = 6;

    /// <summary>
    /// Time oversampling: the inverse FFT length M is the smallest power of two ≥ 2·K·this (K = top harmonic), so the
    /// sample interval is Δt = 1/(M·Δf) ≤ 1/(2·f_max·this). Range 1 … 64; default 4 (about 6–12 samples per rise).
    /// </summary>
    public int TimeOversampling { get; init; } = 4;

    /// <summary>Pre-trigger shown before time zero, in equivalent rise times (0 … 100). Default 5.</summary>
    public double PreTriggerRiseTimes { get; init; } = 5;

    /// <summary>
    /// Low-pass mode is possible when the harmonic bins below the first measured frequency (DC included) number at most
    /// this many; they are extrapolated. Range 1 … 64; default 4.
    /// </summary>
    public int MaximumExtrapolatedBins { get; init; } = 4;

    /// <summary>Incident step amplitude into Z_ref, V (≠ 0). Default 1 V: an open then reads 2 V, a short 0 V.</summary>
    public double IncidentAmplitudeVolts { get; init; } = 1.0;

    /// <summary>Largest inverse FFT accepted (2²⁴ points, 128 MiB of doubles).</summary>
    public const int MaximumTransformLength = 1 << 24;

    /// <summary>Every problem with the options, each as a sentence; empty when valid.</summary>
    public IReadOnlyList<string> Problems()
    {
        var problems = new List<string>();
        if (!Enum.IsDefined(Mode)) problems.Add($"transform mode {Mode} is unknown");
        if (!Enum.IsDefined(Window)) problems.Add($"window {Window} is unknown");
        if (!(KaiserBeta >= 0 && KaiserBeta <= 20)) problems.Add($"Kaiser β {KaiserBeta} must be between 0 and 20");
        if (TimeOversampling < 1 || TimeOversampling > 64) problems.Add($"time oversampling {TimeOversampling} must be between 1 and 64");
        if (!(PreTriggerRiseTimes >= 0 && PreTriggerRiseTimes <= 100)) problems.Add($"pre-trigger {PreTriggerRiseTimes} rise times must be between 0 and 100");
        if (MaximumExtrapolatedBins < 1 || MaximumExtrapolatedBins > 64) problems.Add($"extrapolated bins {MaximumExtrapolatedBins} must be between 1 and 64");
        if (IncidentAmplitudeVolts == 0 || !double.IsFinite(IncidentAmplitudeVolts)) problems.Add($"step amplitude {IncidentAmplitudeVolts} V must be a non-zero number");
        return problems;
    }
}
