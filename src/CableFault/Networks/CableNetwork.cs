namespace CableFault.Networks;

/// <summary>A cable run as seen from the instrument port: a tree of branches that starts at the connector.</summary>
/// <param name="Run">The branch attached to the instrument port.</param>
/// <param name="Name">Name of the run, for display.</param>
public sealed record CableNetwork(NetworkBranch Run, string Name = "")
{
    /// <summary>Every problem in the network, each naming where it is; empty when valid.</summary>
    public IReadOnlyList<string> Problems() => NetworkValidator.Problems(this);

    /// <summary>The longest one-way delay from the port to any end, s (used to size default records).</summary>
    public double LongestDelaySeconds() => Longest(Run, segment => segment.DelaySeconds);

    /// <summary>The longest physical path from the port to any end, m.</summary>
    public double LongestPathMeters() => Longest(Run, segment => segment.LengthMeters);

    /// <summary>The largest sum of a per-segment quantity along any path from the port to an end.</summary>
    private static double Longest(NetworkBranch branch, Func<CableSegment, double> quantity)
    {
        double total = 0;
        foreach (var element in branch.Elements)
        {
            if (element is CableSegment segment) total += quantity(segment);
            if (element is Junction junction && junction.Branches.Count > 0)
                total += junction.Branches.Max(b => Longest(b, quantity));
        }
        return total;
    }
}
