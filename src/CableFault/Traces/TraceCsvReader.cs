using System.Text;
using CableFault.Traces.Csv;

namespace CableFault.Traces;

/// <summary>
/// Reads a trace CSV (DESIGN §4 "Trace CSV") into a <see cref="Trace"/>.
/// </summary>
/// <remarks>
/// <para>Accepted: <c>#</c> comment lines anywhere, <c># key=value</c> metadata (keys lower-cased, values trimmed);
/// non-numeric preamble lines before the data, the last of which is the header when it names a time or signal
/// column; comma, semicolon or tab delimiters (from the first data row); a decimal comma with semicolon or tab
/// delimiters; quoted fields; a trailing delimiter; LF, CRLF or CR line ends; UTF-8, or UTF-16/UTF-32 with a
/// byte-order mark (Stream overloads).</para>
/// <para>Header units: time as <c>time_s</c>, <c>time_ns</c>, <c>time (s)</c>, <c>time [ns]</c>, <c>t_ps</c>,
/// <c>t/us</c> or a bare unit (<c>s ms us ns ps</c>); signal as <c>volts</c>, <c>v</c>, <c>mv</c>,
/// <c>voltage (V)</c>, any name with a voltage unit (<c>CH1 (mV)</c>), or a reflection coefficient (<c>rho</c>,
/// <c>reflection</c>, <c>mrho</c>) kept in the volts slot with metadata <c>unit=rho</c>.</para>
/// <para>Assumed, with a warning: no header means two columns, seconds then volts; a header name with no unit
/// (<c>time</c>) means seconds or volts; a truncated last line is dropped; sample times off a uniform grid by
/// less than <see cref="MaxStepDeviation"/> per step are resampled.</para>
/// <para>Read as they are, without a warning: times that sit on a uniform grid to within the rounding of their printed
/// digits ("1.234567e-06" is exact to half a picosecond), however large that rounding is against the step.</para>
/// <para>Refused with <see cref="InputException"/> (one line: source, line, problem, remedy): empty file, no numeric
/// rows, one column, NaN or infinity, time not increasing, duplicate times, gaps, values beyond
/// <see cref="MaxAbsVolts"/> or times beyond <see cref="MaxAbsTimeSeconds"/>, fewer than two samples, input beyond
/// <see cref="MaxInputBytes"/>, <see cref="MaxSamples"/> or <see cref="MaxLineChars"/>.</para>
/// </remarks>
public static class TraceCsvReader
{
    /// <summary>
    /// Largest input accepted, in bytes (characters for a <see cref="TextReader"/>): 200 MB. A seekable stream longer
    /// than this is refused before any byte is read; other input is counted as it streams and refused at the limit.
    /// At about 20 bytes per row this is some ten million samples, far beyond a reflectometer record (thousands to a
    /// few hundred thousand points), while the reader's working memory stays below about 0.5 GB.
    /// </summary>
    public const long MaxInputBytes = 200_000_000;

    /// <summary>
    /// Largest number of samples accepted: 10 million. The reader keeps time, value and line number per sample
    /// (20 bytes), so this bounds its lists to about 200 MB plus growth slack.
    /// </summary>
    public const int MaxSamples = 10_000_000;

    /// <summary>Longest line accepted, in characters: 65 536. Guards against binary input with no line breaks.</summary>
    public const int MaxLineChars = 65_536;

    /// <summary>
    /// Largest relative difference between one time step and the median step that is still treated as jitter and
    /// resampled: 0.01 (1 %). Sampler time-base jitter and times printed with 4–6 significant digits stay well inside
    /// it; a missing sample shows as a 100 % step and two records spliced together as anything, so the margin between
    /// repairable jitter and a real gap is wide. Moving a sample by 1 % of a step changes its value by at most about
    /// 1 % of the sample-to-sample change, below the noise of a trace sampled finely enough to show its edges.
    /// </summary>
    public const double MaxStepDeviation = 0.01;

    /// <summary>
    /// Largest sample magnitude accepted, in volts (or rho): 1e6. Reflectometer ports see volts, not megavolts; larger
    /// values are a unit mix-up or a corrupt number.
    /// </summary>
    public const double MaxAbsVolts = 1e6;

    /// <summary>
    /// Largest |time| accepted, in seconds: 1. The round trip on 100 km of cable at VF 0.66 is about 1 ms, so a time
    /// beyond a second almost always means nanoseconds written under a seconds header.
    /// </summary>
    public const double MaxAbsTimeSeconds = 1.0;

    /// <summary>Reads a trace; warnings are dropped (use <see cref="ReadWithWarnings(TextReader, string)"/> to see them).</summary>
    /// <param name="reader">The text; read to its end, not disposed.</param>
    /// <param name="sourceName">Name used in messages, usually the file name.</param>
    public static Trace Read(TextReader reader, string sourceName) => ReadWithWarnings(reader, sourceName).Trace;

    /// <summary>Reads a trace from bytes (UTF-8, or as the byte-order mark says); warnings are dropped.</summary>
    /// <param name="stream">The bytes; read to the end, not disposed.</param>
    /// <param name="sourceName">Name used in messages, usually the file name.</param>
    public static Trace Read(Stream stream, string sourceName) => ReadWithWarnings(stream, sourceName).Trace;

    /// <summary>Reads a trace and reports what was assumed or repaired.</summary>
    public static TraceReadResult ReadWithWarnings(TextReader reader, string sourceName) =>
        ReadWithWarnings(reader, sourceName, TraceCsvLimits.Default);

    /// <summary>Reads a trace from bytes and reports what was assumed or repaired.</summary>
    public static TraceReadResult ReadWithWarnings(Stream stream, string sourceName) =>
        ReadWithWarnings(stream, sourceName, TraceCsvLimits.Default);

    internal static TraceReadResult ReadWithWarnings(TextReader reader, string sourceName, TraceCsvLimits limits)
    {
        ArgumentNullException.ThrowIfNull(reader);
        ArgumentNullException.ThrowIfNull(sourceName);
        return new TraceCsvParser(sourceName, limits).Parse(reader);
    }

    internal static TraceReadResult ReadWithWarnings(Stream stream, string sourceName, TraceCsvLimits limits)
    {
        ArgumentNullException.ThrowIfNull(stream);
        ArgumentNullException.ThrowIfNull(sourceName);
        if (stream.CanSeek && stream.Length - stream.Position > limits.MaxInputBytes)
            throw new InputException(
                $"{sourceName}: {ByteCount.Describe(stream.Length - stream.Position)}, larger than the {ByteCount.Describe(limits.MaxInputBytes)} limit for a trace CSV; decimate or crop the record before loading it.");

        using var limited = new ByteLimitStream(stream, limits.MaxInputBytes, sourceName);
        // Invalid UTF-8 becomes U+FFFD and then fails as "not a number" with its line, rather than as a decoder fault.
        using var text = new StreamReader(limited, new UTF8Encoding(false, false), detectEncodingFromByteOrderMarks: true,
            bufferSize: 16 * 1024, leaveOpen: false);
        return ReadWithWarnings(text, sourceName, limits);
    }
}
