using CableFault.Cables;

namespace CableFault.Cli.Infrastructure;

/// <summary>Builds the cable library from the built-ins plus an optional user file.</summary>
public static class CableOptions
{
    /// <summary>Environment variable naming a default user cable file.</summary>
    public const string CableFileVariable = "CABLEFAULT_CABLES";

    /// <summary>The library: built-ins, then the file from --cables (or $CABLEFAULT_CABLES).</summary>
    public static CableLibrary Library(FileInfo? userFile)
    {
        string? path = userFile?.FullName ?? Environment.GetEnvironmentVariable(CableFileVariable);
        if (string.IsNullOrWhiteSpace(path)) return CableLibrary.BuiltIn;
        var types = InputFiles.Read(new FileInfo(path), "cable", CableTypeJson.Read);
        return CableLibrary.BuiltIn.With(types);
    }
}
