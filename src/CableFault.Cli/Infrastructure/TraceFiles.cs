using System.CommandLine;
using CableFault.FrequencyDomain;
using CableFault.Traces;

namespace CableFault.Cli.Infrastructure;

/// <summary>Loads a trace from any file type CableFault accepts, choosing the reader by extension.</summary>
public static class TraceFiles
{
    /// <summary>A loaded trace with the reader's warnings.</summary>
    public sealed record Loaded(Trace Trace, IReadOnlyList<string> Warnings, string Name);

    /// <summary>--window: the spectral window used when a Touchstone file is turned into a step response.</summary>
    public static Option<string> WindowOption() => new Option<string>("--window")
    {
        Description = "For Touchstone (.s1p/.s2p) input: window applied before the inverse transform: kaiser (default, β 6), hann or none.",
        DefaultValueFactory = _ => "kaiser",
    }.AcceptOnlyFromAmong("kaiser", "hann", "none");

    /// <summary>True for the extensions read as Touchstone.</summary>
    public static bool IsTouchstone(FileInfo file) =>
        file.Extension.Equals(".s1p", StringComparison.OrdinalIgnoreCase) || file.Extension.Equals(".s2p", StringComparison.OrdinalIgnoreCase);

    /// <summary>Reads CSV, or Touchstone (.s1p/.s2p) converted to a step response; any other extension is read as CSV.</summary>
    public static Loaded Load(FileInfo file, FrequencyToTimeOptions? transform = null)
    {
        if (IsTouchstone(file))
        {
            var result = InputFiles.Read(file, "Touchstone", (stream, name) =>
            {
                using var reader = new StreamReader(stream, detectEncodingFromByteOrderMarks: true);
                return TouchstoneTraceLoader.Load(reader, name, transform);
            });
            return new Loaded(result.Trace, result.Warnings, file.Name);
        }
        var csv = InputFiles.Read(file, "trace", TraceCsvReader.ReadWithWarnings);
        return new Loaded(csv.Trace, csv.Warnings, file.Name);
    }

    /// <summary>The transform options for a --window value.</summary>
    public static FrequencyToTimeOptions TransformFor(string? window) => new()
    {
        Window = window switch
        {
            "hann" => SpectralWindow.Hann,
            "none" => SpectralWindow.Rectangular,
            _ => SpectralWindow.Kaiser,
        },
    };
}
