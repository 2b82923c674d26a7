using System.CommandLine;
using CableFault.Cli.Commands;
using CableFault.Cli.Infrastructure;

namespace CableFault.Cli;

/// <summary>Builds the command tree and runs it with the exit-code contract of DESIGN.md §4:
/// 0 success, 1 a check ran and failed, 2 bad input or usage (one line on stderr, no stack trace), 3 internal error.</summary>
public static class CliApp
{
    /// <summary>Exit code: success.</summary>
    public const int Success = 0;
    /// <summary>Exit code: a check ran and did not pass.</summary>
    public const int CheckFailed = 1;
    /// <summary>Exit code: bad input or usage.</summary>
    public const int BadInput = 2;
    /// <summary>Exit code: a bug in CableFault (please report it).</summary>
    public const int InternalError = 3;

    /// <summary>The version of this build (informational version: number and commit).</summary>
    public static string Version { get; } =
        typeof(CliApp).Assembly.GetCustomAttributes(typeof(System.Reflection.AssemblyInformationalVersionAttribute), false)
            .OfType<System.Reflection.AssemblyInformationalVersionAttribute>().FirstOrDefault()?.InformationalVersion
        ?? typeof(CliApp).Assembly.GetName().Version?.ToString(3) ?? "unknown";

    /// <summary>Parses and runs one command line.</summary>
    public static int Run(string[] args, TextWriter output, TextWriter error)
    {
        if (args is ["--version"])
        {
            // The built-in option reports the entry assembly, which is the test host when the CLI runs in-process.
            output.WriteLine(Version);
            return Success;
        }
        var context = new CliContext(output, error, args.Contains("--debug"));
        var root = new RootCommand(
            "CableFault: turns a reflectometer step-response trace into fault locations in metres from the connector, with an honest ± figure.");
        root.Options.Add(CommonOptions.Debug);
        root.Subcommands.Add(SimulateCommand.Create(context));
        root.Subcommands.Add(CablesCommand.Create(context));
        root.Subcommands.Add(LocateCommand.Create(context));
        root.Subcommands.Add(CompareCommand.Create(context));
        root.Subcommands.Add(CalibrateCommand.Create(context));
        root.Subcommands.Add(ConvertCommand.Create(context));
        root.Subcommands.Add(ReportCommand.Create(context));
        root.Subcommands.Add(HistoryCommand.Create(context));

        if (args.Length > 0 && !args[0].StartsWith('-') && root.Subcommands.All(c => c.Name != args[0]))
        {
            error.WriteLine($"cablefault: unknown command '{args[0]}'; the commands are {string.Join(", ", root.Subcommands.Select(c => c.Name))} (see 'cablefault --help')");
            return BadInput;
        }
        if (args.Length == 0)
        {
            error.WriteLine($"cablefault: give a command: {string.Join(", ", root.Subcommands.Select(c => c.Name))} (see 'cablefault --help')");
            return BadInput;
        }
        ParseResult parsed = root.Parse(args);
        if (parsed.Errors.Count > 0)
        {
            error.WriteLine($"cablefault: {parsed.Errors[0].Message} (see 'cablefault {FirstVerb(args)}--help')");
            return BadInput;
        }
        try
        {
            return parsed.Invoke(new InvocationConfiguration { Output = output, Error = error, EnableDefaultExceptionHandler = false });
        }
        catch (Exception e)
        {
            return context.Fail(e);
        }
    }

    private static string FirstVerb(string[] args) =>
        args.Length > 0 && !args[0].StartsWith('-') ? args[0] + " " : "";
}
