namespace CableFault.Benchmarks.Accuracy;

/// <summary>What both methods did with one case.</summary>
/// <param name="Case">The case.</param>
/// <param name="Locate">Score of <c>locate</c> (every true event missed when it refused or failed).</param>
/// <param name="Naive">Score of the naive method.</param>
/// <param name="LocateSeconds">In-process time of Locator.Locate, s.</param>
/// <param name="Refusal">The InputException message when <c>locate</c> refused the trace, else null.</param>
/// <param name="Failure">Any other exception from <c>locate</c> (a bug), else null.</param>
public sealed record CaseResult(AccuracyCase Case, List<ScoredEvent> Locate, List<ScoredEvent> Naive, double LocateSeconds,
    string? Refusal, string? Failure)
{
    /// <summary>Start of <see cref="Failure"/> when Locate was cancelled at the time limit.</summary>
    public const string TimedOut = "timed out";

    /// <summary>True when Locate was cancelled at the time limit.</summary>
    public bool IsTimedOut => Failure?.StartsWith(TimedOut, StringComparison.Ordinal) == true;
}
