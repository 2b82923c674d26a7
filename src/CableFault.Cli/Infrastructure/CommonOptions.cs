using System.CommandLine;

namespace CableFault.Cli.Infrastructure;

/// <summary>Options shared by several verbs.</summary>
public static class CommonOptions
{
    /// <summary>--debug: show stack traces for internal errors.</summary>
    public static Option<bool> Debug { get; } = new("--debug")
    {
        Description = "Show the stack trace when CableFault itself fails (for bug reports).",
        Recursive = true,
    };

    /// <summary>--units m|ft.</summary>
    public static Option<string> Units() => new Option<string>("--units")
    {
        Description = "Distance unit for output: m (metres) or ft (feet).",
        DefaultValueFactory = _ => "m",
    }.AcceptOnlyFromAmong("m", "ft");

    /// <summary>--png FILE.</summary>
    public static Option<FileInfo?> Png(string what) => new("--png") { Description = $"Also write {what} as a PNG image to this file." };

    /// <summary>--svg FILE.</summary>
    public static Option<FileInfo?> Svg(string what) => new("--svg") { Description = $"Also write {what} as an SVG image to this file." };

    /// <summary>--cables FILE: user cable types.</summary>
    public static Option<FileInfo?> CableFile() => new("--cables")
    {
        Description = "A JSON file of your own cable types (see README), added to the built-in ones.",
    };
}
