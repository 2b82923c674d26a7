using CableFault.Networks;

namespace CableFault.Workflows;

/// <summary>
/// The same run seen from its far end: the chain of segments and lumped parts in reverse order, the old far-end load
/// replaced by the instrument and the old connector end left as the given new far end (usually open, as when the
/// instrument is carried to the other end). Every lumped part here is a symmetric two-port, so reversing the order is
/// exact. Junctions are not supported: a branch has no single "other end".
/// </summary>
public static class NetworkReversal
{
    /// <summary>The reversed run; the far-end load of <paramref name="network"/> (if any) is dropped.</summary>
    /// <exception cref="ArgumentException">The run holds a junction.</exception>
    public static CableNetwork Reverse(CableNetwork network, RunEnd newFarEnd)
    {
        ArgumentNullException.ThrowIfNull(network);
        ArgumentNullException.ThrowIfNull(newFarEnd);
        var elements = network.Run.Elements;
        if (elements.Any(e => e is Junction))
            throw new ArgumentException("only a linear run (no junctions) can be reversed", nameof(network));
        var chain = elements.Where(e => e is not RunEnd).Reverse().Append(newFarEnd).ToList();
        string name = string.IsNullOrWhiteSpace(network.Name) ? network.Name : network.Name.Trim() + " (from the far end)";
        return new CableNetwork(new NetworkBranch(chain), name);
    }
}
