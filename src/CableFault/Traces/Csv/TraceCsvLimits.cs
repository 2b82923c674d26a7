namespace CableFault.Traces.Csv;

/// <summary>
/// Size limits applied while reading a trace CSV. The public defaults live on <see cref="TraceCsvReader"/>;
/// tests pass smaller limits to prove the reader stops at them without building huge inputs.
/// </summary>
internal readonly record struct TraceCsvLimits(long MaxInputBytes, int MaxSamples, int MaxLineChars)
{
    /// <summary>The documented defaults.</summary>
    public static TraceCsvLimits Default => new(
        TraceCsvReader.MaxInputBytes, TraceCsvReader.MaxSamples, TraceCsvReader.MaxLineChars);
}

/// <summary>Formatting of size limits for messages.</summary>
internal static class ByteCount
{
    /// <summary>"200 MB" for large counts, "1000 bytes" for small ones (decimal megabytes).</summary>
    public static string Describe(long bytes) =>
        bytes >= 1_000_000 ? $"{bytes / 1_000_000.0:0.#} MB" : $"{bytes} bytes";
}
