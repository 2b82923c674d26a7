using System.Collections.Immutable;

namespace CableFault.Traces;

/// <summary>
/// A reflectometer step-response record: port voltage sampled on a uniform time grid.
/// Immutable; the samples are copied on construction so a caller's array never aliases a trace.
/// </summary>
/// <remarks>
/// Time zero is the instant the incident edge passes the reference plane (the instrument connector)
/// once the trace has been aligned; a raw trace may put zero anywhere, and <see cref="StartTimeSeconds"/>
/// is often negative (pre-trigger samples).
/// </remarks>
public sealed class Trace
{
    /// <summary>Creates a trace. Throws <see cref="ArgumentException"/> on a non-positive or non-finite interval,
    /// fewer than two samples, or a non-finite sample.</summary>
    /// <param name="startTimeSeconds">Time of the first sample, in seconds.</param>
    /// <param name="sampleIntervalSeconds">Uniform spacing of the samples, in seconds (&gt; 0).</param>
    /// <param name="samplesVolts">Port voltage, in volts.</param>
    /// <param name="metadata">Free key/value metadata (<c>vf</c>, <c>z0</c>, <c>cable</c>, <c>run</c>, ...); keys are case-insensitive.</param>
    public Trace(double startTimeSeconds, double sampleIntervalSeconds, IEnumerable<double> samplesVolts,
        IReadOnlyDictionary<string, string>? metadata = null)
    {
        if (!double.IsFinite(startTimeSeconds))
            throw new ArgumentException("Start time must be finite.", nameof(startTimeSeconds));
        if (!(sampleIntervalSeconds > 0) || !double.IsFinite(sampleIntervalSeconds))
            throw new ArgumentException("Sample interval must be a positive, finite number of seconds.", nameof(sampleIntervalSeconds));
        var samples = samplesVolts.ToImmutableArray();
        if (samples.Length < 2)
            throw new ArgumentException("A trace needs at least two samples.", nameof(samplesVolts));
        for (int i = 0; i < samples.Length; i++)
            if (!double.IsFinite(samples[i]))
                throw new ArgumentException($"Sample {i} is not a finite number.", nameof(samplesVolts));
        StartTimeSeconds = startTimeSeconds;
        SampleIntervalSeconds = sampleIntervalSeconds;
        SamplesVolts = samples;
        Metadata = (metadata ?? new Dictionary<string, string>())
            .ToImmutableDictionary(StringComparer.OrdinalIgnoreCase);
    }

    /// <summary>Time of the first sample, in seconds.</summary>
    public double StartTimeSeconds { get; }

    /// <summary>Spacing between samples, in seconds.</summary>
    public double SampleIntervalSeconds { get; }

    /// <summary>Port voltage, in volts.</summary>
    public ImmutableArray<double> SamplesVolts { get; }

    /// <summary>Metadata from the file or the simulator (case-insensitive keys).</summary>
    public ImmutableDictionary<string, string> Metadata { get; }

    /// <summary>Number of samples.</summary>
    public int Length => SamplesVolts.Length;

    /// <summary>Time of the last sample, in seconds.</summary>
    public double EndTimeSeconds => StartTimeSeconds + (Length - 1) * SampleIntervalSeconds;

    /// <summary>Record duration (last sample time minus first), in seconds.</summary>
    public double DurationSeconds => (Length - 1) * SampleIntervalSeconds;

    /// <summary>Time of sample <paramref name="index"/>, in seconds.</summary>
    public double TimeAt(int index) => StartTimeSeconds + index * SampleIntervalSeconds;

    /// <summary>All sample times, in seconds.</summary>
    public double[] TimesSeconds()
    {
        var times = new double[Length];
        for (int i = 0; i < times.Length; i++) times[i] = TimeAt(i);
        return times;
    }

    /// <summary>A copy of this trace with the time axis shifted so that <paramref name="timeZeroSeconds"/> becomes zero.</summary>
    public Trace WithTimeZeroAt(double timeZeroSeconds) =>
        new(StartTimeSeconds - timeZeroSeconds, SampleIntervalSeconds, SamplesVolts, Metadata);

    /// <summary>A copy with other samples on the same grid.</summary>
    public Trace WithSamples(IEnumerable<double> samplesVolts) =>
        new(StartTimeSeconds, SampleIntervalSeconds, samplesVolts, Metadata);

    /// <summary>A copy with one metadata entry added or replaced.</summary>
    public Trace WithMetadata(string key, string value) =>
        new(StartTimeSeconds, SampleIntervalSeconds, SamplesVolts, Metadata.SetItem(key, value));

    /// <summary>Metadata value for <paramref name="key"/>, or null.</summary>
    public string? MetadataOrNull(string key) => Metadata.TryGetValue(key, out var v) ? v : null;
}
