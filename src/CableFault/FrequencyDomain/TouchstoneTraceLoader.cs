namespace CableFault.FrequencyDomain;

/// <summary>The front door for VNA data: reads a Touchstone file and converts it to a trace in one call.</summary>
public static class TouchstoneTraceLoader
{
    /// <summary>
    /// Reads S11 from <paramref name="reader"/> and converts it. Throws <see cref="InputException"/> with a one-line
    /// message for malformed files or impossible options. The trace's metadata carry <c>source=touchstone</c>,
    /// <c>transform</c>, <c>rise_s</c>, <c>alias_free_s</c>, <c>z0</c>, <c>kinds_resolved</c> and <c>file</c>.
    /// </summary>
    public static TouchstoneLoadResult Load(TextReader reader, string sourceName, FrequencyToTimeOptions? options = null,
        long maximumCharacters = TouchstoneReader.DefaultMaximumCharacters)
    {
        var data = TouchstoneReader.Read(reader, sourceName, maximumCharacters);
        var conversion = ReflectionToStepConverter.Convert(data, options, sourceName);
        var trace = conversion.Trace.WithMetadata("file", sourceName);
        var warnings = data.Warnings.Concat(conversion.Warnings).ToList();
        return new TouchstoneLoadResult(trace, warnings, data, conversion with { Trace = trace });
    }
}
