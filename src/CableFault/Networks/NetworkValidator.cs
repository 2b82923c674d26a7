namespace CableFault.Networks;

/// <summary>Checks a network and reports every problem at once, each with the path of the element (run[2].branches[1][0]).</summary>
public static class NetworkValidator
{
    /// <summary>Maximum nesting of junctions accepted; deeper trees are almost certainly a mistake.</summary>
    public const int MaximumJunctionDepth = 64;

    /// <summary>Every problem, empty when the network can be simulated.</summary>
    public static IReadOnlyList<string> Problems(CableNetwork network)
    {
        var problems = new List<string>();
        CheckBranch(network.Run, "run", 0, problems);
        return problems;
    }

    private static void CheckBranch(NetworkBranch branch, string path, int depth, List<string> problems)
    {
        if (depth > MaximumJunctionDepth)
        {
            problems.Add($"{path}: junctions nested more than {MaximumJunctionDepth} deep");
            return;
        }
        if (branch.Elements.Count == 0)
        {
            problems.Add($"{path}: branch is empty; it needs at least an end");
            return;
        }
        for (int i = 0; i < branch.Elements.Count; i++)
        {
            string at = $"{path}[{i}]";
            bool isLast = i == branch.Elements.Count - 1;
            switch (branch.Elements[i])
            {
                case CableSegment s:
                    if (!(s.LengthMeters > 0) || !double.IsFinite(s.LengthMeters))
                        problems.Add($"{at}: segment length {s.LengthMeters} m must be a positive number");
                    break;
                case ShuntCapacitor c:
                    RequirePositive(c.CapacitanceFarads, "capacitance", "F", at, problems);
                    break;
                case SeriesInductor l:
                    RequirePositive(l.InductanceHenries, "inductance", "H", at, problems);
                    break;
                case ShuntResistor r:
                    RequirePositive(r.ResistanceOhms, "resistance", "Ω", at, problems);
                    break;
                case SeriesResistor r:
                    RequirePositive(r.ResistanceOhms, "resistance", "Ω", at, problems);
                    break;
                case RunEnd end:
                    if (!isLast) problems.Add($"{at}: an end must be the last element of its branch");
                    if (end.Kind is EndKind.Resistor or EndKind.ResistorParallelCapacitor)
                        RequirePositive(end.ResistanceOhms, "end resistance", "Ω", at, problems);
                    if (end.Kind is EndKind.ResistorParallelCapacitor)
                        RequirePositive(end.CapacitanceFarads, "end capacitance", "F", at, problems);
                    if (end.Kind is EndKind.Matched && !branch.Elements.Take(i).OfType<CableSegment>().Any())
                        problems.Add($"{at}: a matched end needs a cable segment before it in the same branch, to match to");
                    break;
                case Junction junction:
                    if (!isLast) problems.Add($"{at}: a junction must be the last element of its branch; put what follows into one of its branches");
                    if (junction.Branches.Count < 2) problems.Add($"{at}: a junction needs two or more branches, found {junction.Branches.Count}");
                    for (int b = 0; b < junction.Branches.Count; b++)
                        CheckBranch(junction.Branches[b], $"{at}.branches[{b}]", depth + 1, problems);
                    break;
                default:
                    problems.Add($"{at}: unknown element");
                    break;
            }
            if (isLast && branch.Elements[i] is not RunEnd and not Junction)
                problems.Add($"{path}: branch does not finish with an end or a junction; add an end (open, short, matched, resistor)");
        }
    }

    private static void RequirePositive(double value, string what, string unit, string at, List<string> problems)
    {
        if (!(value > 0) || !double.IsFinite(value))
            problems.Add($"{at}: {what} {value} {unit} must be a positive number");
    }
}
