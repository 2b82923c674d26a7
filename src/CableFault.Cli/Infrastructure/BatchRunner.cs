namespace CableFault.Cli.Infrastructure;

/// <summary>
/// Runs one piece of work per input file in parallel and keeps going past bad inputs: each failure becomes one line on
/// stderr and a failed outcome, the other inputs complete. Outcomes come back in input order whatever order they
/// finished in, so the output of a batch does not depend on timing.
/// </summary>
public static class BatchRunner
{
    /// <summary>What happened to one input.</summary>
    /// <typeparam name="T">The work's result.</typeparam>
    /// <param name="Path">The input as expanded from the command line.</param>
    /// <param name="Value">The result, or default when the input failed.</param>
    /// <param name="Error">The one-line problem (it names the input), or null on success.</param>
    /// <param name="Internal">True when the failure is a bug in CableFault rather than bad input.</param>
    public sealed record Outcome<T>(string Path, T? Value, string? Error, bool Internal)
    {
        /// <summary>True when the work completed.</summary>
        public bool Succeeded => Error is null;
    }

    /// <summary>Default degree of parallelism: one input per core (the work is CPU-bound).</summary>
    public static int DefaultDegree => Environment.ProcessorCount;

    /// <summary>Runs <paramref name="work"/> on every path with at most <paramref name="degree"/> at a time.</summary>
    /// <param name="paths">Inputs.</param>
    /// <param name="degree">Most inputs worked on at once (≥ 1).</param>
    /// <param name="work">The work for one input; gets the path and a sink for warning lines.</param>
    /// <param name="context">Streams and the --debug flag.</param>
    /// <param name="progress">Progress display (also carries the warning and error lines).</param>
    public static IReadOnlyList<Outcome<T>> Run<T>(IReadOnlyList<string> paths, int degree, Func<string, Action<string>, T> work,
        CliContext context, BatchProgress progress)
    {
        var outcomes = new Outcome<T>[paths.Count];
        Parallel.For(0, paths.Count, new ParallelOptions { MaxDegreeOfParallelism = Math.Max(1, degree) }, i =>
        {
            string path = paths[i];
            string name = Path.GetFileName(path) is { Length: > 0 } n ? n : path;
            try
            {
                var value = work(path, warning => progress.Line($"warning: {warning}"));
                outcomes[i] = new Outcome<T>(path, value, null, false);
            }
            catch (Exception e)
            {
                bool isInternal = e is not (InputException or IOException or UnauthorizedAccessException);
                string message = isInternal
                    ? $"{path}: internal error: {e.GetType().Name}: {e.Message.Split('\n')[0].Trim()} (please report it; run with --debug for details)"
                    : Named(e.Message, path, name);
                progress.Line($"cablefault: {message}{(isInternal ? "" : " (skipped)")}");
                if (isInternal && context.Debug) progress.Line(e.ToString());
                outcomes[i] = new Outcome<T>(path, default, message, isInternal);
            }
            progress.Finished(name, outcomes[i].Error is not null);
        });
        progress.Complete();
        return outcomes;
    }

    /// <summary>The message with the input's name in front unless it already names it.</summary>
    public static string Named(string message, string path, string name) =>
        message.Contains(name, StringComparison.Ordinal) || message.Contains(path, StringComparison.Ordinal) ? message : $"{path}: {message}";
}
