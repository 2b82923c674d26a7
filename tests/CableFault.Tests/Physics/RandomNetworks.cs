using CableFault.Cables;
using CableFault.Networks;

namespace CableFault.Tests.Physics;

/// <summary>Seeded generator of random passive cable networks for the property tests.</summary>
internal sealed class RandomNetworks
{
    private readonly Random _random;
    private readonly bool _lossless;

    /// <param name="seed">Fixed seed, so every run checks the same networks.</param>
    /// <param name="lossless">Only lossless media, reactive parts and open/short ends (no R, no matched end).</param>
    internal RandomNetworks(int seed, bool lossless)
    {
        _random = new Random(seed);
        _lossless = lossless;
    }

    private double Uniform(double lo, double hi) => lo + (hi - lo) * _random.NextDouble();

    private double LogUniform(double lo, double hi) => Math.Exp(Uniform(Math.Log(lo), Math.Log(hi)));

    internal CableMedium Medium()
    {
        double z0 = Uniform(25, 150), vf = Uniform(0.5, 0.95);
        if (_lossless || _random.Next(3) == 0) return new CableMedium(z0, vf);
        var loss = new CableLossModel(LogUniform(1e-7, 1e-5), _random.Next(2) == 0 ? 0 : LogUniform(1e-12, 1e-10),
            _random.Next(2) == 0 ? 0 : LogUniform(1e-3, 0.5));
        return new CableMedium(z0, vf, loss);
    }

    internal CableNetwork Network() => new(Branch(0));

    private NetworkBranch Branch(int depth)
    {
        var elements = new List<NetworkElement>();
        int count = _random.Next(1, 4);
        for (int i = 0; i < count; i++)
        {
            elements.Add(new CableSegment(LogUniform(0.3, 200), Medium()));
            if (_random.Next(2) == 0) elements.Add(Lumped());
        }
        if (elements[^1] is not CableSegment) elements.Add(new CableSegment(LogUniform(0.3, 200), Medium()));
        if (depth < 2 && _random.Next(3) == 0)
        {
            int branches = _random.Next(2, 4);
            elements.Add(new Junction(Enumerable.Range(0, branches).Select(_ => Branch(depth + 1)).ToArray()));
        }
        else
        {
            elements.Add(End());
        }
        return new NetworkBranch(elements);
    }

    private NetworkElement Lumped()
    {
        int kinds = _lossless ? 2 : 4;
        return _random.Next(kinds) switch
        {
            0 => new ShuntCapacitor(LogUniform(1e-13, 1e-9)),
            1 => new SeriesInductor(LogUniform(1e-10, 1e-6)),
            2 => new ShuntResistor(LogUniform(1, 1e5)),
            _ => new SeriesResistor(LogUniform(0.1, 1e3)),
        };
    }

    private RunEnd End()
    {
        int kinds = _lossless ? 2 : 5;
        return _random.Next(kinds) switch
        {
            0 => RunEnd.Open,
            1 => RunEnd.Short,
            2 => RunEnd.Matched,
            3 => RunEnd.Resistor(LogUniform(1, 1e4)),
            _ => new RunEnd(EndKind.ResistorParallelCapacitor, LogUniform(1, 1e4), LogUniform(1e-13, 1e-9)),
        };
    }
}
