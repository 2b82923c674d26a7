using System.Numerics;

namespace CableFault.Simulation;

/// <summary>
/// One cached sweep of a compiled network over a contour's bins, planned before it runs: the stack discipline of the
/// operations is fixed by the network, so every operation's arrays (and its cached per-bin tables) are known in advance,
/// and the operations can then run over any range of bins. Two disjoint ranges may run side by side
/// (<see cref="BinSplitting"/>); each bin sees the same operations in the same order as in one pass.
/// </summary>
/// <remarks>The arrays come from <see cref="SweepBuffers{T}"/>. The result pair belongs to the caller; the caller
/// disposes the sweep after the last <see cref="Run"/>, which gives back every other array.</remarks>
internal sealed class BinSweep : IDisposable
{
    /// <summary>One operation on the stack's arrays; a junction of k branches is k − 1 merges, each its own step.</summary>
    /// <param name="Op">The network operation.</param>
    /// <param name="OpIndex">Its index in the network.</param>
    /// <param name="N">The pair it writes (the stack's top after it).</param>
    /// <param name="D">See <paramref name="N"/>.</param>
    /// <param name="OtherN">A merge's second branch (read only), else null.</param>
    /// <param name="OtherD">See <paramref name="OtherN"/>.</param>
    /// <param name="Segment">A lossy segment's cached bins, else null.</param>
    /// <param name="MatchedZc">A matched end's Z_c per bin, else null.</param>
    /// <param name="TopAfter">The stack's top level after the step.</param>
    /// <param name="EndsOperation">True for the last step of its operation.</param>
    private readonly record struct Step(CompiledNetwork.Op Op, int OpIndex, Complex[] N, Complex[] D, Complex[]? OtherN,
        Complex[]? OtherD, SweepCache.SegmentBins? Segment, Complex[]? MatchedZc, int TopAfter, bool EndsOperation);

    private readonly CompiledNetwork _network;
    private readonly SweepCache.Grid _grid;
    private readonly List<Step> _steps = [];
    private readonly List<Complex[]> _released = [];

    /// <param name="network">The compiled run.</param>
    /// <param name="cache">Per-bin tables.</param>
    /// <param name="grid">The contour.</param>
    /// <param name="resumeFrom">Pairs recorded on <paramref name="grid"/> for a network that may share this one's first
    /// operations: those are not planned again (see <see cref="SweepSnapshots"/>).</param>
    internal BinSweep(CompiledNetwork network, SweepCache cache, SweepCache.Grid grid, SweepSnapshots? resumeFrom)
    {
        _network = network;
        _grid = grid;
        if (resumeFrom is not null && resumeFrom.Grid != grid)
            throw new ArgumentException("A sweep resumes only from pairs recorded on its own grid.", nameof(resumeFrom));
        int bins = grid.BinCount;
        var stackN = new Complex[network.MaxStackDepth + 1][];
        var stackD = new Complex[network.MaxStackDepth + 1][];
        int top = -1;
        int first = resumeFrom?.FirstDifference(network) ?? 0;
        if (first > 0) top = resumeFrom!.Restore(first, stackN, stackD);
        var ops = network.Ops;
        for (int index = first; index < ops.Length; index++)
        {
            var op = ops[index];
            switch (op.Kind)
            {
                case CompiledNetwork.OpKind.Open or CompiledNetwork.OpKind.Short or CompiledNetwork.OpKind.Resistor
                    or CompiledNetwork.OpKind.Matched or CompiledNetwork.OpKind.ResistorParallelCapacitor:
                    top++;
                    stackN[top] = SweepBuffers<Complex>.Rent(bins);
                    stackD[top] = SweepBuffers<Complex>.Rent(bins);
                    var zc = op.Kind == CompiledNetwork.OpKind.Matched ? cache.Medium(grid, network.Media[op.Medium]).Zc : null;
                    _steps.Add(new Step(op, index, stackN[top], stackD[top], null, null, null, zc, top, true));
                    break;
                case CompiledNetwork.OpKind.Junction:
                    for (int branch = 1; branch < op.Count; branch++)
                    {
                        // The merged pair goes to the lower level; the upper one is read, then free (after the run).
                        _steps.Add(new Step(op, index, stackN[top - 1], stackD[top - 1], stackN[top], stackD[top], null, null,
                            top - 1, branch == op.Count - 1));
                        _released.Add(stackN[top]);
                        _released.Add(stackD[top]);
                        top--;
                    }
                    break;
                default:
                    // A lossy segment carries its medium's bins; a lossless one is computed in place (no table).
                    var segment = op.Kind == CompiledNetwork.OpKind.Segment && !network.Media[op.Medium].IsLossless
                        ? cache.Segment(grid, network.Media[op.Medium], op.Value) : null;
                    _steps.Add(new Step(op, index, stackN[top], stackD[top], null, null, segment, null, top, true));
                    break;
            }
        }
        (N, D) = (stackN[0], stackD[0]);
    }

    /// <summary>The input impedance pair per bin once every range has run (arrays at least BinCount long).</summary>
    internal Complex[] N { get; }

    /// <inheritdoc cref="N"/>
    internal Complex[] D { get; }

    /// <summary>Runs every operation on bins [<paramref name="from"/>, <paramref name="to"/>); a range that does not start
    /// at bin 0 must start at a multiple of <see cref="BinSplitting.Alignment"/> to give one pass's bits.</summary>
    internal void Run(int from, int to)
    {
        foreach (var step in _steps) Execute(step, from, to);
    }

    /// <summary>Runs every operation on all bins, and keeps the top pair after each in <paramref name="record"/>.</summary>
    internal void RunRecording(SweepSnapshots record)
    {
        foreach (var step in _steps)
        {
            Execute(step, 0, _grid.BinCount);
            if (step.EndsOperation) record.Record(step.OpIndex, step.TopAfter, step.N, step.D);
        }
    }

    /// <summary>Gives back the arrays of merged branches (not the result pair).</summary>
    public void Dispose()
    {
        foreach (var array in _released) SweepBuffers<Complex>.Return(array);
        _released.Clear();
    }

    private void Execute(in Step step, int from, int to)
    {
        var op = step.Op;
        Complex[] n = step.N, d = step.D;
        var grid = _grid;
        Complex S(int k) => new(grid.Sigma, k * grid.DOmega);
        switch (op.Kind)
        {
            case CompiledNetwork.OpKind.Open: n.AsSpan(from, to - from).Fill(Complex.One); d.AsSpan(from, to - from).Clear(); break;
            case CompiledNetwork.OpKind.Short: n.AsSpan(from, to - from).Clear(); d.AsSpan(from, to - from).Fill(Complex.One); break;
            case CompiledNetwork.OpKind.Resistor: n.AsSpan(from, to - from).Fill(op.Value); d.AsSpan(from, to - from).Fill(Complex.One); break;
            case CompiledNetwork.OpKind.Matched:
                step.MatchedZc.AsSpan(from, to - from).CopyTo(n.AsSpan(from));
                d.AsSpan(from, to - from).Fill(Complex.One);
                break;
            case CompiledNetwork.OpKind.ResistorParallelCapacitor:
                n.AsSpan(from, to - from).Fill(op.Value);
                for (int k = from; k < to; k++) d[k] = 1 + S(k) * op.Value * op.Value2;
                break;
            case CompiledNetwork.OpKind.ShuntC:
                for (int k = from; k < to; k++) d[k] += ComplexMath.Multiply(S(k) * op.Value, n[k]);
                break;
            case CompiledNetwork.OpKind.ShuntR:
                for (int k = from; k < to; k++) d[k] += n[k] / op.Value;
                break;
            case CompiledNetwork.OpKind.SeriesL:
                for (int k = from; k < to; k++) n[k] += ComplexMath.Multiply(S(k) * op.Value, d[k]);
                break;
            case CompiledNetwork.OpKind.SeriesR:
                for (int k = from; k < to; k++) n[k] += op.Value * d[k];
                break;
            case CompiledNetwork.OpKind.Segment:
                if (step.Segment is not { } segment)
                {
                    NetworkEvaluator.ApplyLosslessSegment(n, d, grid, _network.Media[op.Medium], op.Value, from, to);
                    break;
                }
                Complex[] a = segment.A, b = segment.B, c = segment.C;
                int k0 = from;
                for (; k0 < Math.Min(to, segment.SmallBins); k0++) NetworkEvaluator.Apply(n, d, k0, a[k0], b[k0], c[k0]);
                Complex[] e = segment.E, zc = segment.Medium.Zc, inverseZc = segment.Medium.InverseZc;
                for (int k = k0; k < to; k++) NetworkEvaluator.ApplyTravellingWaves(n, d, k, e[k], zc[k], inverseZc[k]);
                break;
            case CompiledNetwork.OpKind.Junction:
                Complex[] n2 = step.OtherN!, d2 = step.OtherD!;
                for (int k = from; k < to; k++)
                {
                    Complex nn = ComplexMath.Multiply(n[k], n2[k]);
                    Complex dd = ComplexMath.Multiply(d[k], n2[k]) + ComplexMath.Multiply(d2[k], n[k]);
                    NetworkEvaluator.Normalise(ref nn, ref dd);
                    n[k] = nn;
                    d[k] = dd;
                }
                break;
        }
    }
}
