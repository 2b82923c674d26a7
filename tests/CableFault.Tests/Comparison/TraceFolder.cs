using CableFault.Traces;

namespace CableFault.Tests.Comparison;

/// <summary>A temporary folder for the CLI tests' trace files, deleted with the test class.</summary>
internal sealed class TraceFolder(string prefix) : IDisposable
{
    /// <summary>The folder's full path.</summary>
    internal string Folder { get; } = Directory.CreateTempSubdirectory(prefix).FullName;

    /// <summary>Writes <paramref name="trace"/> as CSV under <paramref name="name"/>; returns the file's path.</summary>
    internal string Write(string name, Trace trace)
    {
        string path = Path.Combine(Folder, name);
        using var writer = new StreamWriter(path);
        TraceCsvWriter.Write(trace, writer);
        return path;
    }

    public void Dispose() => Directory.Delete(Folder, recursive: true);
}
