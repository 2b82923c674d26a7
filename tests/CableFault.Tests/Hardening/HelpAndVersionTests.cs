using CableFault.Tests.Cli;

namespace CableFault.Tests.Hardening;

/// <summary>Every verb's --help shows an example; --version prints the version.</summary>
public class HelpAndVersionTests
{
    public static TheoryData<string> Verbs() => ["simulate", "cables", "locate", "calibrate", "convert", "report"];

    [Theory]
    [MemberData(nameof(Verbs))]
    public void Help_has_an_example_that_runs_the_verb(string verb)
    {
        var result = CliRunner.Run(verb, "--help");
        Assert.Equal(0, result.ExitCode);
        Assert.Contains("Example", result.Output);
        Assert.Contains($"cablefault {verb}", result.Output);
    }

    [Fact]
    public void Help_examples_name_files_that_exist_when_they_point_into_the_repository()
    {
        string root = CliRunner.RepositoryRoot();
        foreach (string verb in Verbs())
        {
            string help = CliRunner.Run(verb, "--help").Output;
            foreach (string word in help.Split([' ', '\n'], StringSplitOptions.RemoveEmptyEntries).Where(w => w.StartsWith("traces/", StringComparison.Ordinal)))
                Assert.True(File.Exists(Path.Combine(root, word)) || Directory.Exists(Path.Combine(root, word)), $"'{verb} --help' names {word}, which does not exist");
        }
    }

    [Fact]
    public void Version_prints_the_version()
    {
        var result = CliRunner.Run("--version");
        Assert.Equal(0, result.ExitCode);
        Assert.StartsWith(typeof(CableFault.Cli.CliApp).Assembly.GetName().Version!.ToString(3), result.Output);
    }
}
