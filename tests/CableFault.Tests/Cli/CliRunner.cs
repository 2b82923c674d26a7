using CableFault.Cli;

namespace CableFault.Tests.Cli;

/// <summary>Runs the CLI in-process and captures its streams.</summary>
internal static class CliRunner
{
    internal sealed record Result(int ExitCode, string Output, string Error);

    internal static Result Run(params string[] args)
    {
        var output = new StringWriter();
        var error = new StringWriter();
        int code = CliApp.Run(args, output, error);
        return new Result(code, output.ToString(), error.ToString());
    }

    /// <summary>The repository root (where CableFault.sln is), for the shipped demo files.</summary>
    internal static string RepositoryRoot()
    {
        var dir = new DirectoryInfo(AppContext.BaseDirectory);
        while (dir is not null && !File.Exists(Path.Combine(dir.FullName, "CableFault.sln"))) dir = dir.Parent;
        return dir?.FullName ?? throw new InvalidOperationException("repository root not found");
    }
}
