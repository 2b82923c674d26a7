using System.Text.Json;
using CableFault.Cables;
using CableFault.Json;

namespace CableFault.Networks;

/// <summary>
/// Reads a run description (our own JSON schema, documented in the README):
/// <code>
/// { "name": "Mast feeder A",
///   "cables": [ { "designation": "MY-COAX", "z0_ohms": 50, "vf": 0.8 } ],      // optional extra types
///   "run": [
///     { "type": "segment", "length_m": 30, "cable": "RG-213" },
///     { "type": "segment", "length_m": 2, "z0_ohms": 40, "vf": 0.66, "loss": [ { "mhz": 100, "db_per_100m": 7 } ] },
///     { "type": "shunt_c", "capacitance_pf": 5 },   { "type": "series_l", "inductance_nh": 20 },
///     { "type": "shunt_r", "resistance_ohms": 200 }, { "type": "series_r", "resistance_ohms": 2 },
///     { "type": "junction", "branches": [ [ ...elements... ], [ ...elements... ] ] },
///     { "type": "end", "end": "open" | "short" | "matched" | "resistor" | "rc", "resistance_ohms": 75, "capacitance_pf": 10 } ] }
/// </code>
/// Every element may carry a "label". Lengths may be given as length_ft instead of length_m.
/// </summary>
public static class NetworkJson
{
    /// <summary>Largest network file accepted, bytes.</summary>
    public const long MaximumBytes = 4_000_000;

    /// <summary>Most elements accepted in one network (a guard against generated nonsense).</summary>
    public const int MaximumElements = 10_000;

    /// <summary>
    /// Longest segment accepted, m: 100 km. Reflectometer runs are metres to tens of kilometres; a longer segment is a
    /// unit slip or a corrupt number, and would ask the simulator for a record of impossible size.
    /// </summary>
    public const double MaximumSegmentLengthMeters = 100_000;

    /// <summary>
    /// Longest one-way delay accepted from the instrument to the farthest end, s: 1 ms (about 200 km of cable at VF
    /// 0.66). Bounds the record the simulator has to compute however many segments add up.
    /// </summary>
    public const double MaximumDelaySeconds = 1e-3;

    private static readonly string[] RootFields = ["name", "cables", "run", "description"];

    /// <summary>Reads and validates a network; every problem is reported at once as one <see cref="InputException"/>.</summary>
    public static CableNetwork Read(Stream stream, string sourceName, CableLibrary library)
    {
        using var document = JsonProblems.Parse(stream, sourceName, MaximumBytes);
        var root = document.RootElement;
        if (root.ValueKind != JsonValueKind.Object)
            throw new InputException($"{sourceName}: expected a JSON object with a \"run\" array of elements");
        var problems = new JsonProblems();
        problems.RejectUnknown(root, "$", RootFields);

        if (root.TryGetProperty("cables", out var cables))
        {
            var userTypes = new List<CableType>();
            if (cables.ValueKind != JsonValueKind.Array) problems.Add("cables", "expected an array of cable types");
            else
            {
                int i = 0;
                foreach (var cable in cables.EnumerateArray())
                {
                    string path = $"cables[{i++}]";
                    if (cable.ValueKind != JsonValueKind.Object) { problems.Add(path, "expected an object"); continue; }
                    var type = CableTypeJson.ReadOne(cable, path, problems);
                    if (type is not null) userTypes.Add(type);
                }
            }
            library = library.With(userTypes);
        }

        if (!root.TryGetProperty("run", out var run) || run.ValueKind != JsonValueKind.Array)
        {
            problems.Add("$", "'run' is missing or not an array; list the elements from the instrument outward");
            problems.ThrowIfAny(sourceName);
        }
        var state = new ReadState(library, problems);
        var branch = ReadBranch(run, "run", state, 0);
        string name = problems.Text(root, "name", "$", false) ?? "";
        problems.ThrowIfAny(sourceName);
        var network = new CableNetwork(branch!, name);
        double delay = network.LongestDelaySeconds();
        if (!(delay <= MaximumDelaySeconds))
        {
            problems.Add("run", $"the longest path is {delay * 1e6:G4} µs of cable one way, beyond the {MaximumDelaySeconds * 1e6:G3} µs limit (about 200 km); check the lengths and their units");
            problems.ThrowIfAny(sourceName);
        }
        var structural = network.Problems();
        if (structural.Count > 0)
        {
            foreach (var p in structural) problems.Add("network", p);
            problems.ThrowIfAny(sourceName);
        }
        return network;
    }

    private sealed class ReadState(CableLibrary library, JsonProblems problems)
    {
        public CableLibrary Library { get; } = library;
        public JsonProblems Problems { get; } = problems;
        public int ElementCount { get; set; }
    }

    private static NetworkBranch? ReadBranch(JsonElement array, string path, ReadState state, int depth)
    {
        if (array.ValueKind != JsonValueKind.Array)
        {
            state.Problems.Add(path, "expected an array of elements");
            return null;
        }
        if (depth > NetworkValidator.MaximumJunctionDepth)
        {
            state.Problems.Add(path, $"junctions nested more than {NetworkValidator.MaximumJunctionDepth} deep");
            return null;
        }
        var elements = new List<NetworkElement>();
        int index = 0;
        foreach (var item in array.EnumerateArray())
        {
            string at = $"{path}[{index++}]";
            if (++state.ElementCount > MaximumElements)
            {
                state.Problems.Add(at, $"more than {MaximumElements} elements; split the description");
                return null;
            }
            var element = ReadElement(item, at, state, depth);
            if (element is not null) elements.Add(element);
        }
        return new NetworkBranch(elements);
    }

    private static readonly Dictionary<string, string[]> FieldsByType = new()
    {
        ["segment"] = ["type", "label", "length_m", "length_ft", "cable", "z0_ohms", "vf", "loss", "dc_loop_ohms_per_m"],
        ["shunt_c"] = ["type", "label", "capacitance_pf"],
        ["series_l"] = ["type", "label", "inductance_nh"],
        ["shunt_r"] = ["type", "label", "resistance_ohms"],
        ["series_r"] = ["type", "label", "resistance_ohms"],
        ["junction"] = ["type", "label", "branches"],
        ["end"] = ["type", "label", "end", "resistance_ohms", "capacitance_pf"],
    };

    private static NetworkElement? ReadElement(JsonElement item, string at, ReadState state, int depth)
    {
        var problems = state.Problems;
        if (item.ValueKind != JsonValueKind.Object)
        {
            problems.Add(at, "expected an object with a \"type\"");
            return null;
        }
        string? type = problems.Text(item, "type", at, required: true);
        if (type is null) return null;
        if (!FieldsByType.TryGetValue(type, out var fields))
        {
            problems.Add($"{at}.type", $"unknown element type '{type}'; expected one of {string.Join(", ", FieldsByType.Keys)}");
            return null;
        }
        problems.RejectUnknown(item, at, fields);
        string? label = problems.Text(item, "label", at, false);
        NetworkElement? element = type switch
        {
            "segment" => ReadSegment(item, at, state),
            "shunt_c" => problems.Number(item, "capacitance_pf", at, true, PlausibleRanges.MinimumCapacitancePf, PlausibleRanges.MaximumCapacitancePf) is double pf ? new ShuntCapacitor(pf * 1e-12) : null,
            "series_l" => problems.Number(item, "inductance_nh", at, true, PlausibleRanges.MinimumInductanceNh, PlausibleRanges.MaximumInductanceNh) is double nh ? new SeriesInductor(nh * 1e-9) : null,
            "shunt_r" => problems.Number(item, "resistance_ohms", at, true, PlausibleRanges.MinimumResistanceOhms, PlausibleRanges.MaximumResistanceOhms) is double r ? new ShuntResistor(r) : null,
            "series_r" => problems.Number(item, "resistance_ohms", at, true, PlausibleRanges.MinimumResistanceOhms, PlausibleRanges.MaximumResistanceOhms) is double r2 ? new SeriesResistor(r2) : null,
            "junction" => ReadJunction(item, at, state, depth),
            "end" => ReadEnd(item, at, problems),
            _ => null,
        };
        return element is null ? null : element with { Label = label };
    }

    private static CableSegment? ReadSegment(JsonElement item, string at, ReadState state)
    {
        var problems = state.Problems;
        double? meters = problems.Number(item, "length_m", at, false, 0, MaximumSegmentLengthMeters, exclusiveMin: true);
        double? feet = problems.Number(item, "length_ft", at, false, 0, Math.Floor(MaximumSegmentLengthMeters / PhysicalConstants.MetersPerFoot), exclusiveMin: true);
        if (meters is null && feet is null && !item.TryGetProperty("length_m", out _) && !item.TryGetProperty("length_ft", out _))
            problems.Add(at, "'length_m' (or 'length_ft') is missing");
        if (meters is not null && feet is not null) problems.Add(at, "give length_m or length_ft, not both");
        double? length = meters ?? feet * PhysicalConstants.MetersPerFoot;

        string? cableName = problems.Text(item, "cable", at, false);
        CableType? cable = null;
        if (cableName is not null)
        {
            cable = state.Library.Find(cableName);
            if (cable is null)
                problems.Add($"{at}.cable", $"unknown cable type '{cableName}'; run 'cablefault cables' to list them or define it under \"cables\"");
            else if (item.TryGetProperty("z0_ohms", out _) || item.TryGetProperty("vf", out _))
                problems.Add(at, "give either 'cable' or inline z0_ohms/vf, not both");
        }
        else
        {
            cable = CableTypeJson.ReadOne(item, at, problems, defaultDesignation: "inline");
        }
        if (length is null || cable is null) return null;
        return new CableSegment(length.Value, cable.Medium, cableName is null ? null : cable.Designation);
    }

    private static Junction? ReadJunction(JsonElement item, string at, ReadState state, int depth)
    {
        if (!item.TryGetProperty("branches", out var branches) || branches.ValueKind != JsonValueKind.Array)
        {
            state.Problems.Add(at, "'branches' is missing; a junction needs an array of two or more branches");
            return null;
        }
        var list = new List<NetworkBranch>();
        int b = 0;
        foreach (var branch in branches.EnumerateArray())
        {
            var parsed = ReadBranch(branch, $"{at}.branches[{b++}]", state, depth + 1);
            if (parsed is not null) list.Add(parsed);
        }
        return new Junction(list);
    }

    private static RunEnd? ReadEnd(JsonElement item, string at, JsonProblems problems)
    {
        string? kind = problems.Text(item, "end", at, required: true);
        switch (kind)
        {
            case null: return null;
            case "open": return RunEnd.Open;
            case "short": return RunEnd.Short;
            case "matched": return RunEnd.Matched;
            case "resistor":
                return problems.Number(item, "resistance_ohms", at, true, PlausibleRanges.MinimumResistanceOhms, PlausibleRanges.MaximumResistanceOhms) is double r ? RunEnd.Resistor(r) : null;
            case "rc":
                double? rr = problems.Number(item, "resistance_ohms", at, true, PlausibleRanges.MinimumResistanceOhms, PlausibleRanges.MaximumResistanceOhms);
                double? pf = problems.Number(item, "capacitance_pf", at, true, PlausibleRanges.MinimumCapacitancePf, PlausibleRanges.MaximumCapacitancePf);
                return rr is null || pf is null ? null : new RunEnd(EndKind.ResistorParallelCapacitor, rr.Value, pf.Value * 1e-12);
            default:
                problems.Add($"{at}.end", $"unknown end '{kind}'; expected open, short, matched, resistor or rc");
                return null;
        }
    }
}
