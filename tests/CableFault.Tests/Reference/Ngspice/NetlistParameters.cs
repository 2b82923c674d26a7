using System.Globalization;

namespace CableFault.Tests.Reference.Ngspice;

/// <summary>
/// The plain numeric <c>.param name=value</c> entries of a netlist (names lower-cased). Entries whose value is an
/// expression in braces are ngspice's business and are skipped. The C# side builds its network from these, so the
/// netlist file is the single place the numbers live.
/// </summary>
internal static class NetlistParameters
{
    internal static IReadOnlyDictionary<string, double> Read(string netlistPath)
    {
        var values = new Dictionary<string, double>(StringComparer.OrdinalIgnoreCase);
        foreach (string raw in File.ReadLines(netlistPath))
        {
            string line = raw.Trim();
            if (!line.StartsWith(".param", StringComparison.OrdinalIgnoreCase)) continue;
            foreach (string field in line[".param".Length..].Split((char[]?)null, StringSplitOptions.RemoveEmptyEntries))
            {
                int eq = field.IndexOf('=');
                if (eq <= 0) continue;
                if (double.TryParse(field[(eq + 1)..], NumberStyles.Float, CultureInfo.InvariantCulture, out double v))
                    values[field[..eq]] = v;
            }
        }
        return values;
    }

    internal static double Get(this IReadOnlyDictionary<string, double> values, string name) =>
        values.TryGetValue(name, out double v) ? v : throw new KeyNotFoundException($"the netlist has no numeric .param {name}");
}
