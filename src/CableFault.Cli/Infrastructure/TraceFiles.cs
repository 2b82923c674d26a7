using CableFault.Traces;

namespace CableFault.Cli.Infrastructure;

/// <summary>Loads a trace from any file type CableFault accepts, choosing the reader by extension.</summary>
public static class TraceFiles
{
    /// <summary>A loaded trace with the reader's warnings.</summary>
    public sealed record Loaded(Trace Trace, IReadOnlyList<string> Warnings, string Name);

    /// <summary>Reads CSV (any other extension is tried as CSV too).</summary>
    public static Loaded Load(FileInfo file)
    {
        var result = InputFiles.Read(file, "trace", TraceCsvReader.ReadWithWarnings);
        return new Loaded(result.Trace, result.Warnings, file.Name);
    }
}
