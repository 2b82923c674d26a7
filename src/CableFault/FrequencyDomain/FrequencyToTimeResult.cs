using CableFault.Traces;

namespace CableFault.FrequencyDomain;

/// <summary>The time-domain view of reflection data, with the figures that bound what it can show.</summary>
public sealed record FrequencyToTimeResult
{
    /// <summary>
    /// The trace. Low-pass: port voltage v(t) for an incident step of the chosen amplitude into Z_ref, time zero at the
    /// reference plane (0 V before, 1 V matched, 2 V open, 0 V short for 1 V). Band-pass: |windowed impulse response|,
    /// scaled so that one isolated reflection of size |ρ| peaks at |ρ|·amplitude.
    /// </summary>
    public required Trace Trace { get; init; }

    /// <summary>The mode actually used (never <see cref="TransformMode.Automatic"/>).</summary>
    public required TransformMode Mode { get; init; }

    /// <summary>True in low-pass mode; false in band-pass mode, where an open cannot be told from a short.</summary>
    public required bool KindsDistinguishable { get; init; }

    /// <summary>
    /// Equivalent 10–90 % rise time of the transform's own edge, s (low-pass: the windowed step of the incident edge;
    /// band-pass: the full width at half amplitude of the impulse, the nearest equivalent).
    /// </summary>
    public required double RiseTimeSeconds { get; init; }

    /// <summary>Full width at half amplitude of the windowed impulse, s: two equal reflections closer than about this merge.</summary>
    public required double ImpulseWidthSeconds { get; init; }

    /// <summary>Alias-free round-trip time T = 1/Δf, s: echoes later than T fold back. One-way distance = VF·c·T/2.</summary>
    public required double AliasFreeRoundTripSeconds { get; init; }

    /// <summary>Frequency step Δf of the grid transformed, Hz.</summary>
    public required double FrequencyStepHz { get; init; }

    /// <summary>Highest frequency used, Hz.</summary>
    public required double MaximumFrequencyHz { get; init; }

    /// <summary>Γ(0) used in low-pass mode (measured or extrapolated), else null.</summary>
    public double? DcReflection { get; init; }

    /// <summary>True when the data were resampled onto a uniform grid by cubic spline.</summary>
    public bool Resampled { get; init; }

    /// <summary>Window used.</summary>
    public required SpectralWindow Window { get; init; }

    /// <summary>Things the user should know (extrapolation, resampling, mode chosen).</summary>
    public required IReadOnlyList<string> Warnings { get; init; }
}
