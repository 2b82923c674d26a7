using System.Globalization;
using System.Text;
using System.Text.RegularExpressions;

namespace CableFault.Traces;

/// <summary>
/// Writes a <see cref="Trace"/> as a trace CSV that <see cref="TraceCsvReader"/> reads back to the same samples:
/// metadata as <c># key=value</c> lines (sorted by key), the header <c>time_s,volts</c>, then one row per sample with
/// the time and value in round-trip ("R") format and the invariant culture, LF line ends.
/// </summary>
public static partial class TraceCsvWriter
{
    [GeneratedRegex(@"^[A-Za-z_][A-Za-z0-9_.\-]*$")]
    private static partial Regex KeyPattern();

    /// <summary>Writes <paramref name="trace"/> to <paramref name="writer"/> (not flushed or disposed).</summary>
    /// <exception cref="ArgumentException">A metadata key that is not identifier-like (letters, digits, '_', '-', '.'),
    /// or a value holding a line break or leading/trailing spaces, which the format cannot carry.</exception>
    public static void Write(Trace trace, TextWriter writer)
    {
        ArgumentNullException.ThrowIfNull(trace);
        ArgumentNullException.ThrowIfNull(writer);
        foreach (var (key, value) in trace.Metadata.OrderBy(kv => kv.Key.ToLowerInvariant(), StringComparer.Ordinal))
        {
            if (!KeyPattern().IsMatch(key))
                throw new ArgumentException($"Metadata key '{key}' cannot be written as '# key=value'.", nameof(trace));
            if (value.AsSpan().IndexOfAny('\r', '\n') >= 0 || value != value.Trim())
                throw new ArgumentException($"Metadata value for '{key}' has a line break or surrounding spaces.", nameof(trace));
            writer.Write("# ");
            writer.Write(key.ToLowerInvariant());
            writer.Write('=');
            writer.Write(value);
            writer.Write('\n');
        }
        writer.Write("time_s,volts\n");
        for (int i = 0; i < trace.Length; i++)
        {
            writer.Write(trace.TimeAt(i).ToString("R", CultureInfo.InvariantCulture));
            writer.Write(',');
            writer.Write(trace.SamplesVolts[i].ToString("R", CultureInfo.InvariantCulture));
            writer.Write('\n');
        }
    }

    /// <summary>Writes <paramref name="trace"/> to <paramref name="stream"/> as UTF-8 without a byte-order mark (stream left open).</summary>
    public static void Write(Trace trace, Stream stream)
    {
        ArgumentNullException.ThrowIfNull(stream);
        using var writer = new StreamWriter(stream, new UTF8Encoding(false), bufferSize: 64 * 1024, leaveOpen: true);
        Write(trace, writer);
    }
}
