namespace CableFault.Cli.Infrastructure;

/// <summary>
/// Turns the paths given on the command line into the list of input files: a file stands for itself, a folder for the
/// trace files directly inside it (<c>*.csv</c>, <c>*.s1p</c>, <c>*.s2p</c>, sorted by name), and a path whose file
/// name holds <c>*</c> or <c>?</c> for the files it matches (for shells that do not expand globs, and quoted globs).
/// A path that matches nothing is kept, so that reading it reports the problem for that one input.
/// </summary>
public static class BatchInputs
{
    /// <summary>Extensions taken from a folder.</summary>
    public static IReadOnlyList<string> TraceExtensions { get; } = [".csv", ".s1p", ".s2p"];

    /// <summary>True when the arguments name exactly one plain file (no folder, no pattern): the single-trace mode.</summary>
    public static bool IsSingleFile(IReadOnlyList<string> arguments) =>
        arguments.Count == 1 && !HasWildcard(arguments[0]) && !Directory.Exists(arguments[0]);

    /// <summary>The input files in command-line order (within a folder or pattern, by name); duplicates removed.</summary>
    public static IReadOnlyList<string> Expand(IReadOnlyList<string> arguments)
    {
        var files = new List<string>();
        var seen = new HashSet<string>(OperatingSystem.IsWindows() ? StringComparer.OrdinalIgnoreCase : StringComparer.Ordinal);
        foreach (string argument in arguments)
        {
            foreach (string file in ExpandOne(argument))
                if (seen.Add(Path.GetFullPath(file))) files.Add(file);
        }
        return files;
    }

    private static IEnumerable<string> ExpandOne(string argument)
    {
        if (Directory.Exists(argument))
        {
            var inside = Directory.EnumerateFiles(argument)
                .Where(f => TraceExtensions.Contains(Path.GetExtension(f).ToLowerInvariant()))
                .Order(StringComparer.Ordinal)
                .ToList();
            return inside.Count > 0 ? inside : [argument]; // an empty folder is reported as a bad input
        }
        if (!HasWildcard(argument)) return [argument];

        string folder = Path.GetDirectoryName(argument) is { Length: > 0 } d ? d : ".";
        string pattern = Path.GetFileName(argument);
        if (HasWildcard(folder) || !Directory.Exists(folder)) return [argument];
        var matches = Directory.EnumerateFiles(folder, pattern, new EnumerationOptions { MatchCasing = MatchCasing.PlatformDefault })
            .Select(f => folder == "." && !argument.StartsWith("." + Path.DirectorySeparatorChar, StringComparison.Ordinal) ? Path.GetFileName(f) : f)
            .Order(StringComparer.Ordinal)
            .ToList();
        return matches.Count > 0 ? matches : [argument];
    }

    /// <summary>Why an expanded input cannot be a trace file before it is opened (an empty folder, a pattern that
    /// matched nothing), or null; missing and unreadable files are reported by the reader.</summary>
    public static string? ProblemBeforeReading(string path)
    {
        if (Directory.Exists(path)) return $"{path}: folder holds no trace files (*.csv, *.s1p, *.s2p); name the files or another folder";
        if (HasWildcard(path) && !File.Exists(path)) return $"{path}: matches no file; check the pattern and the folder";
        return null;
    }

    private static bool HasWildcard(string path) => path.IndexOfAny(['*', '?']) >= 0;
}
