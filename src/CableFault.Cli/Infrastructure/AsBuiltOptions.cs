using System.CommandLine;
using CableFault.Workflows;

namespace CableFault.Cli.Infrastructure;

/// <summary>The <c>--as-built FILE.json</c> option: the run's known features, so that they are not taken for faults.</summary>
public sealed class AsBuiltOptions
{
    /// <summary>--as-built.</summary>
    public Option<FileInfo?> File { get; } = new("--as-built")
    {
        Description = "As-built list of the run (JSON, schema cablefault-asbuilt/1; see README): its splices, connectors, taps, cable changes and end. " +
                      "Each event is marked expected (a listed feature) or UNEXPECTED, and listed features not found are named.",
    };

    /// <summary>Adds the option to <paramref name="command"/>.</summary>
    public void AddTo(Command command) => command.Options.Add(File);

    /// <summary>The list, or null when the option is absent; a bad file is a usage error naming it.</summary>
    public AsBuiltList? Load(ParseResult parsed) =>
        parsed.GetValue(File) is FileInfo file ? Load(file) : null;

    /// <summary>Reads <paramref name="file"/>.</summary>
    public static AsBuiltList Load(FileInfo file) => InputFiles.Read(file, "as-built", AsBuiltJson.Read);
}
