namespace CableFault;

/// <summary>
/// Raised for input the user can fix (a malformed file, an impossible option). The message is one line that
/// names where the problem is, what is wrong and what to do; the CLI prints it as is and exits with code 2.
/// </summary>
public class InputException : Exception
{
    /// <summary>Creates the exception with a one-line, user-facing message.</summary>
    public InputException(string message, Exception? inner = null) : base(message, inner) { }
}
