using System.Numerics;
using CableFault.Cables;
using CableFault.Networks;

namespace CableFault.Simulation;

/// <summary>
/// A network flattened into a post-order list of operations on a stack of impedance pairs (N, D) with Z = N / D,
/// so that the per-frequency loop allocates nothing. The pair form keeps opens (1, 0) and shorts (0, 1) exact.
/// </summary>
internal sealed class CompiledNetwork
{
    internal enum OpKind { Open, Short, Resistor, Matched, ResistorParallelCapacitor, Segment, ShuntC, ShuntR, SeriesL, SeriesR, Junction }

    internal readonly record struct Op(OpKind Kind, double Value, double Value2, int Medium, int Count);

    internal Op[] Ops { get; }
    internal CableMedium[] Media { get; }
    internal int MaxStackDepth { get; }

    internal CompiledNetwork(CableNetwork network)
    {
        var ops = new List<Op>();
        var media = new List<CableMedium>();
        int depth = 0, maxDepth = 0;
        Compile(network.Run, ops, media, ref depth, ref maxDepth);
        Ops = ops.ToArray();
        Media = media.ToArray();
        MaxStackDepth = Math.Max(1, maxDepth);
    }

    private static int MediumIndex(List<CableMedium> media, CableMedium medium)
    {
        int index = media.IndexOf(medium);
        if (index >= 0) return index;
        media.Add(medium);
        return media.Count - 1;
    }

    private static void Compile(NetworkBranch branch, List<Op> ops, List<CableMedium> media, ref int depth, ref int maxDepth)
    {
        var elements = branch.Elements;
        int last = elements.Count - 1;
        // The terminal element first (ends and junctions push a pair), then every other element outward-in.
        switch (elements[last])
        {
            case RunEnd end:
                int mediumBefore = -1;
                if (end.Kind == EndKind.Matched)
                {
                    var segment = elements.Take(last).OfType<CableSegment>().Last();
                    mediumBefore = MediumIndex(media, segment.Medium);
                }
                ops.Add(end.Kind switch
                {
                    EndKind.Open => new Op(OpKind.Open, 0, 0, -1, 0),
                    EndKind.Short => new Op(OpKind.Short, 0, 0, -1, 0),
                    EndKind.Resistor => new Op(OpKind.Resistor, end.ResistanceOhms, 0, -1, 0),
                    EndKind.Matched => new Op(OpKind.Matched, 0, 0, mediumBefore, 0),
                    EndKind.ResistorParallelCapacitor => new Op(OpKind.ResistorParallelCapacitor, end.ResistanceOhms, end.CapacitanceFarads, -1, 0),
                    _ => throw new InvalidOperationException($"Unhandled end kind {end.Kind}."),
                });
                depth++;
                maxDepth = Math.Max(maxDepth, depth);
                break;
            case Junction junction:
                foreach (var child in junction.Branches) Compile(child, ops, media, ref depth, ref maxDepth);
                ops.Add(new Op(OpKind.Junction, 0, 0, -1, junction.Branches.Count));
                depth -= junction.Branches.Count - 1;
                break;
            default:
                throw new InvalidOperationException("A branch must finish with an end or a junction; validate the network first.");
        }
        for (int i = last - 1; i >= 0; i--)
        {
            ops.Add(elements[i] switch
            {
                CableSegment s => new Op(OpKind.Segment, s.LengthMeters, 0, MediumIndex(media, s.Medium), 0),
                ShuntCapacitor c => new Op(OpKind.ShuntC, c.CapacitanceFarads, 0, -1, 0),
                ShuntResistor r => new Op(OpKind.ShuntR, r.ResistanceOhms, 0, -1, 0),
                SeriesInductor l => new Op(OpKind.SeriesL, l.InductanceHenries, 0, -1, 0),
                SeriesResistor r => new Op(OpKind.SeriesR, r.ResistanceOhms, 0, -1, 0),
                _ => throw new InvalidOperationException("Ends and junctions may only be the last element of a branch."),
            });
        }
    }
}
