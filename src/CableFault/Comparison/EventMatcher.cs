using CableFault.Analysis;

namespace CableFault.Comparison;

/// <summary>
/// Pairs the events of two traces of one run. Events keep their order along a cable, so the pairing is an
/// order-preserving alignment (dynamic programming, as for the edit distance of two sequences): leaving an event
/// unpaired costs 1, pairing two costs their distance apart over the window plus penalties for a different kind and
/// a different reflection, and pairs further apart than the window (which may grow with distance) are not allowed.
/// </summary>
internal static class EventMatcher
{
    private const double UnpairedCost = 1.0;
    private const double KindPenalty = 0.3;
    private const double ReflectionPenalty = 0.7;
    /// <summary>A reflection difference of this much (or more) takes the whole reflection penalty.</summary>
    private const double ReflectionScale = 0.25;

    /// <summary>Pairs as (baseline index or −1, current index or −1), in order along the run.</summary>
    internal static IReadOnlyList<(int Baseline, int Current)> Match(IReadOnlyList<LocatedEvent> baseline,
        IReadOnlyList<LocatedEvent> current, Func<double, double> windowMetersAt)
    {
        int n = baseline.Count, m = current.Count;
        var cost = new double[n + 1, m + 1];
        var step = new byte[n + 1, m + 1]; // 1 = baseline unpaired, 2 = current unpaired, 3 = paired
        for (int i = 1; i <= n; i++) { cost[i, 0] = i * UnpairedCost; step[i, 0] = 1; }
        for (int j = 1; j <= m; j++) { cost[0, j] = j * UnpairedCost; step[0, j] = 2; }
        for (int i = 1; i <= n; i++)
            for (int j = 1; j <= m; j++)
            {
                double best = cost[i - 1, j] + UnpairedCost; byte how = 1;
                if (cost[i, j - 1] + UnpairedCost < best) { best = cost[i, j - 1] + UnpairedCost; how = 2; }
                double pair = PairCost(baseline[i - 1], current[j - 1], windowMetersAt(baseline[i - 1].DistanceMeters));
                if (cost[i - 1, j - 1] + pair < best) { best = cost[i - 1, j - 1] + pair; how = 3; }
                cost[i, j] = best; step[i, j] = how;
            }
        var pairs = new List<(int, int)>();
        for (int i = n, j = m; i > 0 || j > 0;)
        {
            switch (step[i, j])
            {
                case 1: pairs.Add((i - 1, -1)); i--; break;
                case 2: pairs.Add((-1, j - 1)); j--; break;
                default: pairs.Add((i - 1, j - 1)); i--; j--; break;
            }
        }
        pairs.Reverse();
        return pairs;
    }

    private static double PairCost(LocatedEvent b, LocatedEvent c, double windowMeters)
    {
        double shift = Math.Abs(c.DistanceMeters - b.DistanceMeters);
        if (shift > windowMeters) return double.PositiveInfinity;
        // An event too faint to be named is not the same event as a named one that reflects far more: a break that
        // appears beside a faint bump of the reference is new, not the bump moved.
        if ((b.Kind == EventKind.Unknown) != (c.Kind == EventKind.Unknown) && Math.Abs(c.Reflection - b.Reflection) >= ReflectionScale)
            return double.PositiveInfinity;
        double kind = b.Kind == c.Kind ? 0 : KindPenalty;
        double reflection = ReflectionPenalty * Math.Min(1, Math.Abs(c.Reflection - b.Reflection) / ReflectionScale);
        return shift / windowMeters + kind + reflection;
    }
}
