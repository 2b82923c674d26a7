using CableFault.Tests.Cli;

namespace CableFault.Tests.Hardening;

/// <summary>
/// Every bad file in Corpus/ goes through every verb that reads that kind of file, in-process: traces (csv/,
/// touchstone/) through locate, convert, calibrate and report; run descriptions (network/) through simulate. Each run must end
/// with exit code 2 (DESIGN.md §4), exactly one line on stderr that names the file, and no stack trace.
/// </summary>
public class CorpusCliTests
{
    private static readonly string CorpusFolder = Path.Combine(AppContext.BaseDirectory, "Corpus");

    private static IEnumerable<string> Files(string kind) =>
        Directory.GetFiles(Path.Combine(CorpusFolder, kind)).Order(StringComparer.Ordinal);

    public static TheoryData<string, string> TraceCases()
    {
        var data = new TheoryData<string, string>();
        foreach (string kind in new[] { "csv", "touchstone" })
            foreach (string file in Files(kind))
                foreach (string verb in new[] { "locate", "convert", "calibrate", "report" })
                    data.Add(Path.GetRelativePath(CorpusFolder, file), verb);
        return data;
    }

    public static TheoryData<string> NetworkCases()
    {
        var data = new TheoryData<string>();
        foreach (string file in Files("network")) data.Add(Path.GetRelativePath(CorpusFolder, file));
        return data;
    }

    [Theory]
    [MemberData(nameof(TraceCases))]
    public void Bad_trace_gives_one_clean_line_and_exit_code_2(string file, string verb)
    {
        string path = Path.Combine(CorpusFolder, file);
        string[] args = verb switch
        {
            "convert" => [verb, path, "-o", Path.Combine(Path.GetTempPath(), $"cf-never-written-{Guid.NewGuid():N}.csv")],
            "calibrate" => [verb, path, "--length", "10"],
            "report" => [verb, path, "-o", Path.Combine(Path.GetTempPath(), $"cf-never-written-{Guid.NewGuid():N}.html")],
            _ => [verb, path],
        };

        var result = CliRunner.Run(args);

        AssertOneCleanLine(result, Path.GetFileName(file));
        Assert.Equal("", result.Output);
    }

    [Theory]
    [MemberData(nameof(NetworkCases))]
    public void Bad_network_gives_one_clean_line_and_exit_code_2(string file)
    {
        var result = CliRunner.Run("simulate", Path.Combine(CorpusFolder, file), "--samples", "256");

        AssertOneCleanLine(result, Path.GetFileName(file));
        Assert.Equal("", result.Output);
    }

    [Fact]
    public void Each_kind_of_corpus_has_the_cases_the_issue_asks_for()
    {
        // Guard against the corpus quietly shrinking: the kinds of damage named in the hardening issue.
        string[] touchstone = ["missing-option-line", "empty", "binary-garbage", "single-point", "nan-value", "huge-frequency",
            "huge-magnitude", "utf16-no-bom", "bom-crlf-bad-number", "truncated-last-line"];
        string[] network = ["empty", "binary-garbage", "deep-nesting", "very-deep-nesting", "negative-length", "unknown-kind",
            "nan-length", "huge-length", "utf16-with-bom", "bom-crlf-negative-length", "truncated"];
        var presentTouchstone = Files("touchstone").Select(Path.GetFileNameWithoutExtension).ToHashSet();
        var presentNetwork = Files("network").Select(Path.GetFileNameWithoutExtension).ToHashSet();
        Assert.All(touchstone, name => Assert.Contains(name, presentTouchstone));
        Assert.All(network, name => Assert.Contains(name, presentNetwork));
    }

    internal static void AssertOneCleanLine(CliRunner.Result result, string fileName)
    {
        Assert.True(result.ExitCode == 2, $"exit code {result.ExitCode}, stderr: {result.Error}");
        string[] lines = result.Error.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.True(lines.Length == 1, $"expected one stderr line, got {lines.Length}:\n{result.Error}");
        Assert.DoesNotContain("   at ", result.Error);
        Assert.DoesNotContain("Exception", result.Error);
        Assert.DoesNotContain("internal error", result.Error);
        Assert.Contains(fileName, result.Error);
    }
}
