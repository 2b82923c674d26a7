namespace CableFault.Cli.Infrastructure;

/// <summary>The console streams and the error policy shared by every verb.</summary>
public sealed class CliContext(TextWriter output, TextWriter error, bool debug)
{
    /// <summary>Standard output (results).</summary>
    public TextWriter Output { get; } = output;

    /// <summary>Standard error (warnings, progress, errors).</summary>
    public TextWriter Error { get; } = error;

    /// <summary>True when --debug was given: internal errors show their stack trace.</summary>
    public bool Debug { get; } = debug;

    /// <summary>Prints a warning line on stderr.</summary>
    public void Warn(string message) => Error.WriteLine($"warning: {message}");

    /// <summary>Turns an exception into one stderr line and an exit code.</summary>
    public int Fail(Exception e)
    {
        switch (e)
        {
            case InputException input:
                Error.WriteLine($"cablefault: {input.Message}");
                return CliApp.BadInput;
            case OperationCanceledException:
                Error.WriteLine("cablefault: cancelled");
                return CliApp.BadInput;
            case IOException or UnauthorizedAccessException:
                Error.WriteLine($"cablefault: {e.Message}");
                return CliApp.BadInput;
            default:
                Error.WriteLine($"cablefault: internal error: {e.GetType().Name}: {FirstLine(e.Message)} (please report it; run with --debug for details)");
                if (Debug) Error.WriteLine(e.ToString());
                return CliApp.InternalError;
        }
    }

    private static string FirstLine(string text) => text.Split('\n')[0].Trim();
}
