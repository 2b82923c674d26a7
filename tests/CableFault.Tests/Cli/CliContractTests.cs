namespace CableFault.Tests.Cli;

/// <summary>The exit-code and stderr contract of DESIGN.md §4: bad input → one line on stderr, exit 2, no stack trace.</summary>
public class CliContractTests : IDisposable
{
    private readonly string _folder = Directory.CreateTempSubdirectory("cf-cli-").FullName;

    public void Dispose() => Directory.Delete(_folder, recursive: true);

    private static void AssertOneCleanErrorLine(CliRunner.Result result)
    {
        Assert.Equal(2, result.ExitCode);
        string[] lines = result.Error.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.Single(lines);
        Assert.DoesNotContain("   at ", result.Error);
        Assert.DoesNotContain("Exception", result.Error);
    }

    [Fact]
    public void UnknownVerbIsUsageError() => AssertOneCleanErrorLine(CliRunner.Run("frobnicate"));

    [Fact]
    public void MissingNetworkFileIsInputError()
    {
        var result = CliRunner.Run("simulate", Path.Combine(_folder, "nope.json"));
        AssertOneCleanErrorLine(result);
        Assert.Contains("nope.json", result.Error);
    }

    [Fact]
    public void BadNetworkIsInputErrorNamingTheProblem()
    {
        string path = Path.Combine(_folder, "bad.json");
        File.WriteAllText(path, """{ "run": [ { "type": "segment", "length_m": -1, "cable": "RG-58" }, { "type": "end", "end": "open" } ] }""");
        var result = CliRunner.Run("simulate", path);
        AssertOneCleanErrorLine(result);
        Assert.Contains("run[0].length_m", result.Error);
    }

    [Fact]
    public void BadOptionValueIsUsageError()
    {
        string path = Path.Combine(_folder, "ok.json");
        File.WriteAllText(path, """{ "run": [ { "type": "segment", "length_m": 1, "cable": "RG-58" }, { "type": "end", "end": "open" } ] }""");
        AssertOneCleanErrorLine(CliRunner.Run("simulate", path, "--rise-time-ns", "fast"));
        AssertOneCleanErrorLine(CliRunner.Run("simulate", path, "--rise-time-ns", "-1"));
    }

    [Fact]
    public void FailedWriteLeavesTheExistingFileIntact()
    {
        string network = Path.Combine(_folder, "ok.json");
        File.WriteAllText(network, """{ "run": [ { "type": "segment", "length_m": 1, "cable": "RG-58" }, { "type": "end", "end": "open" } ] }""");
        string output = Path.Combine(_folder, "keep.csv");
        File.WriteAllText(output, "precious");
        // An impossible setting fails before anything is written: the old file must survive untouched.
        var result = CliRunner.Run("simulate", network, "-o", output, "--samples", "1");
        Assert.Equal(2, result.ExitCode);
        Assert.Equal("precious", File.ReadAllText(output));
        Assert.Single(Directory.GetFiles(_folder, "*keep.csv*"));
    }

    [Fact]
    public void CablesListsBuiltInTypesWithUnits()
    {
        var result = CliRunner.Run("cables");
        Assert.Equal(0, result.ExitCode);
        Assert.Contains("RG-58", result.Output);
        Assert.Contains("Z0 (Ω)", result.Output);
        Assert.Contains("dB/100m@100MHz", result.Output);
    }
}
