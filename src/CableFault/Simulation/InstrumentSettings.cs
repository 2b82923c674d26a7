namespace CableFault.Simulation;

/// <summary>
/// The reflectometer as a source V_s(t) behind Z_s plus a sampler. The incident step amplitude is what the
/// source delivers into a load equal to Z_s (V_s / 2), so a matched run shows a flat step of that height.
/// </summary>
public sealed record InstrumentSettings
{
    /// <summary>Source impedance Z_s, Ω (&gt; 0). Default 50 Ω.</summary>
    public double SourceImpedanceOhms { get; init; } = 50;

    /// <summary>Incident step amplitude into a load equal to Z_s, V (≠ 0). Default 1 V.</summary>
    public double IncidentAmplitudeVolts { get; init; } = 1.0;

    /// <summary>10–90 % rise time of the stimulus at the port, s (&gt; 0). Default 1 ns.</summary>
    public double RiseTimeSeconds { get; init; } = 1e-9;

    /// <summary>Shape of the stimulus transition.</summary>
    public EdgeShape EdgeShape { get; init; } = EdgeShape.Gaussian;

    /// <summary>Sample interval, s (&gt; 0). Default 100 ps.</summary>
    public double SampleIntervalSeconds { get; init; } = 100e-12;

    /// <summary>Number of samples in the record (2 … <see cref="MaximumSampleCount"/>). Default 4096.</summary>
    public int SampleCount { get; init; } = 4096;

    /// <summary>Time recorded before the incident edge's 50 % point at the port, s (≥ 0). Default 5 ns.</summary>
    public double PreTriggerSeconds { get; init; } = 5e-9;

    /// <summary>Part of the incident step that arrives slowly, as a first-order settling after the fast edge (a real
    /// step generator creeps on by a per cent or so): the step is (1 − a)·fast + a·fast∗(1 − e^(−t/τ)), i.e. E(s) times
    /// 1 − a + a/(1 + sτ). Default 0 (an edge that settles at once).</summary>
    public double SettlingFraction { get; init; }

    /// <summary>Time constant τ of <see cref="SettlingFraction"/>, s (&gt; 0 when the fraction is not 0).</summary>
    public double SettlingTimeConstantSeconds { get; init; }

    /// <summary>RMS of white Gaussian noise added to each sample, V (≥ 0). Default 0.</summary>
    public double NoiseRmsVolts { get; init; }

    /// <summary>Seed for the noise generator, so that a simulation is repeatable.</summary>
    public int NoiseSeed { get; init; } = 1;

    /// <summary>Largest record the simulator accepts (16 Mi samples ≈ 128 MiB of doubles).</summary>
    public const int MaximumSampleCount = 1 << 24;

    /// <summary>Record duration (N − 1)·Δt, s.</summary>
    public double DurationSeconds => (SampleCount - 1) * SampleIntervalSeconds;

    /// <summary>Every problem with the settings, each as a sentence; empty when valid.</summary>
    public IReadOnlyList<string> Problems()
    {
        var problems = new List<string>();
        if (!(SourceImpedanceOhms > 0) || !double.IsFinite(SourceImpedanceOhms)) problems.Add($"source impedance {SourceImpedanceOhms} Ω must be a positive number");
        if (IncidentAmplitudeVolts == 0 || !double.IsFinite(IncidentAmplitudeVolts)) problems.Add($"step amplitude {IncidentAmplitudeVolts} V must be a non-zero number");
        if (!(RiseTimeSeconds > 0) || !double.IsFinite(RiseTimeSeconds)) problems.Add($"rise time {RiseTimeSeconds} s must be a positive number");
        if (!(SampleIntervalSeconds > 0) || !double.IsFinite(SampleIntervalSeconds)) problems.Add($"sample interval {SampleIntervalSeconds} s must be a positive number");
        if (SampleCount < 2 || SampleCount > MaximumSampleCount) problems.Add($"sample count {SampleCount} must be between 2 and {MaximumSampleCount}");
        if (!(PreTriggerSeconds >= 0) || !double.IsFinite(PreTriggerSeconds)) problems.Add($"pre-trigger time {PreTriggerSeconds} s must be zero or positive");
        if (!(NoiseRmsVolts >= 0) || !double.IsFinite(NoiseRmsVolts)) problems.Add($"noise {NoiseRmsVolts} V RMS must be zero or positive");
        if (!double.IsFinite(SettlingFraction) || (SettlingFraction != 0 && !(SettlingTimeConstantSeconds > 0 && double.IsFinite(SettlingTimeConstantSeconds))))
            problems.Add($"settling {SettlingFraction} over {SettlingTimeConstantSeconds} s: the fraction must be a number and its time constant positive");
        return problems;
    }

    /// <summary>
    /// Defaults sized for a network: Δt = rise/8 (so the edge is well sampled), a record covering 2.5 longest round
    /// trips plus the pre-trigger (room for the far-end echo and one re-reflection), at least 1024 samples.
    /// </summary>
    public static InstrumentSettings DefaultFor(Networks.CableNetwork network, double riseTimeSeconds = 1e-9)
    {
        double dt = riseTimeSeconds / 8;
        double pre = Math.Max(5e-9, 5 * riseTimeSeconds);
        double span = pre + 2.5 * 2 * network.LongestDelaySeconds() + 10 * riseTimeSeconds;
        int count = (int)Math.Clamp(Math.Ceiling(span / dt), 1024, MaximumSampleCount);
        if (count == MaximumSampleCount) dt = span / (count - 1);
        return new InstrumentSettings { RiseTimeSeconds = riseTimeSeconds, SampleIntervalSeconds = dt, SampleCount = count, PreTriggerSeconds = pre };
    }
}
