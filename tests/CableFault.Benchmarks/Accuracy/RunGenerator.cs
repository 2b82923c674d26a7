using System.Globalization;
using CableFault.Analysis;
using CableFault.Cables;
using CableFault.Networks;

namespace CableFault.Benchmarks.Accuracy;

/// <summary>
/// Seeded random cable runs with their ground truth. All lengths are drawn in units of u = v·t_rise/2 (the resolution
/// unit) so that runs stay comparable across rise times.
/// </summary>
/// <remarks>
/// <para>Detectability rule (what a careful engineer would call visible): every true event's signature at the port must
/// be at least <see cref="MinimumSeenSize"/> of the incident step and at least <see cref="MinimumSeenOverNoise"/> times
/// the noise RMS; runs that break it are drawn again. The signature is estimated as
/// |ρ| (for a C or L: the peak of the exponentially modified Gaussian, the dip/bump τ seen through the Gaussian edge)
/// × the round-trip transmission through earlier events (1 − ρ² at a boundary, (1 − |ρ|)² at a shunt/series R or a tap)
/// × e^(−2α(f_k)d) with α at the edge's knee frequency f_k = 0.35/t_rise (common practice for an edge's bandwidth).</para>
/// <para>Events are at least <see cref="ClearGapUnits"/>·u apart, except one "close pair" in about a quarter of the runs
/// (a short section, or two equal lumped faults, 1–3 u apart). The first event is past <see cref="FirstEventUnits"/>·u,
/// clear of the blind zone (1.5 rise times of round trip, 1.5 u).</para>
/// </remarks>
public static class RunGenerator
{
    /// <summary>Smallest signature at the port, fraction of the incident step (−30 dB: a step of 30 mV on 1 V).</summary>
    public const double MinimumSeenSize = 0.03;

    /// <summary>Smallest signature over the noise RMS (15σ: a detector at 5σ finds it with room to spare for the edge
    /// spreading it over several samples).</summary>
    public const double MinimumSeenOverNoise = 15;

    /// <summary>Largest record, samples (the speed target's trace length).</summary>
    public const int MaximumSamples = 32768;

    /// <summary>Samples per rise time (Δt = t_rise/6: the edge is well sampled).</summary>
    public const double SamplesPerRise = 6;

    /// <summary>Least spacing of events that are not a close pair, in u.</summary>
    public const double ClearGapUnits = 6;

    /// <summary>Least distance of the first event, in u.</summary>
    public const double FirstEventUnits = 5;

    /// <summary>Longest ngspice LTRA record, s: LTRA's convolution is quadratic in the number of time steps.</summary>
    private const double LongestLtraSpanSeconds = 500e-9;

    private static readonly EventKind[] FeaturedKinds =
    [
        EventKind.Open, EventKind.Short, EventKind.ImpedanceRise, EventKind.ImpedanceDrop, EventKind.Capacitive,
        EventKind.Inductive, EventKind.PartialShort, EventKind.SeriesResistance, EventKind.Tap, EventKind.Termination,
    ];

    private static readonly double[] Impedances = [50, 75, 100];

    private abstract record Feature(double ExtentMeters);
    private sealed record Section(double Rho, double LengthMeters) : Feature(LengthMeters);
    private sealed record Lumped(EventKind Kind, double Size) : Feature(0);
    private sealed record LumpedPair(EventKind Kind, double Size, double SpacingMeters) : Feature(SpacingMeters);
    private sealed record Tap(double StubMeters) : Feature(0);

    /// <summary>A random run featuring <c>FeaturedKinds[index mod 10]</c> (so every kind is covered) plus 0–2 other faults.</summary>
    public static AccuracyCase Random(int index, int seed, TraceSource source)
    {
        var rng = new Random(seed);
        for (int attempt = 0; ; attempt++)
        {
            var c = TryRandom(index, rng, source);
            if (c is not null) return c;
            if (attempt > 500) throw new InvalidOperationException($"case {index}: no detectable run in 500 draws");
        }
    }

    private static AccuracyCase? TryRandom(int index, Random rng, TraceSource source)
    {
        var featured = FeaturedKinds[index % FeaturedKinds.Length];
        double z0 = Impedances[rng.Next(Impedances.Length)];
        double vf = Uniform(rng, 0.60, 0.85);
        bool lossy = rng.NextDouble() < 0.5;
        bool ltra = lossy && source == TraceSource.Ngspice;
        // LTRA time is quadratic in steps of σ/5: keep its edges slow (1–2 ns) and records short.
        double rise = ltra ? LogUniform(rng, 1e-9, 2e-9) : LogUniform(rng, 0.2e-9, 2e-9);
        double noise = Uniform(rng, 0, 2e-3);
        CableLossModel? loss = !lossy ? null
            : source == TraceSource.Ngspice ? new CableLossModel(0, 0, Uniform(rng, 0.02, 0.25))
            : CableLossModel.FromDatasheet(Uniform(rng, 2, 12), 100e6, dcResistanceOhmsPerMeter: Uniform(rng, 0, 0.05));
        var medium = new CableMedium(z0, vf, loss);
        double v = medium.VelocityMetersPerSecond;
        double u = v * rise / 2;
        double dt = rise / SamplesPerRise;
        double pre = 5 * rise + 2e-9;
        double span = ltra ? LongestLtraSpanSeconds : MaximumSamples * dt;
        double longest = Math.Min(300, v * (span - pre - 40 * rise) / 4);
        double shortest = Math.Max(30 * u, 2);
        if (longest < shortest * 1.5) return null;
        double endMeters = LogUniform(rng, shortest, longest);

        // The end of the run.
        RunEnd end = featured switch
        {
            EventKind.Open => RunEnd.Open,
            EventKind.Short => RunEnd.Short,
            EventKind.Termination => RunEnd.Resistor(ResistanceForRho(z0, RandomSign(rng) * Uniform(rng, 0.1, 0.8))),
            _ => rng.Next(ltra ? 3 : 4) switch
            {
                0 => RunEnd.Open,
                1 => RunEnd.Short,
                2 => RunEnd.Resistor(ResistanceForRho(z0, RandomSign(rng) * Uniform(rng, 0.1, 0.8))),
                _ => RunEnd.Matched,
            },
        };

        // The faults along the run.
        var features = new List<Feature>();
        if (featured is not (EventKind.Open or EventKind.Short or EventKind.Termination)) features.Add(RandomFeature(featured, rng, z0, rise, u));
        int extras = rng.Next(3);
        for (int i = 0; i < extras; i++)
            features.Add(RandomFeature(FeaturedKinds[2 + rng.Next(7)], rng, z0, rise, u));
        if (rng.NextDouble() < 0.25)
        {
            double spacing = Uniform(rng, 1, 3) * u;
            features.Add(rng.NextDouble() < 0.5
                ? new Section(RandomSign(rng) * Uniform(rng, 0.08, 0.3), spacing)
                : RandomPair(rng, z0, rise, spacing));
        }
        Shuffle(features, rng);

        // Stick-breaking placement: first event past FirstEventUnits·u, ClearGapUnits·u after each feature's extent.
        double fixedLength = FirstEventUnits * u + features.Sum(f => f.ExtentMeters + ClearGapUnits * u);
        double free = endMeters - fixedLength;
        if (free < 0) return null;
        var offsets = features.Select(_ => rng.NextDouble() * free).OrderBy(x => x).ToArray();
        var positions = new double[features.Count];
        double consumed = FirstEventUnits * u;
        for (int i = 0; i < features.Count; i++)
        {
            positions[i] = consumed + offsets[i];
            consumed += features[i].ExtentMeters + ClearGapUnits * u;
        }

        var built = Assemble(features, positions, end, endMeters, medium, z0, vf, loss, rise, u);
        if (built is null) return null;
        var (network, truth, echoes, branchEnds, words) = built.Value;
        if (truth.Any(t => t.SeenSize < MinimumSeenSize || t.SeenSize < MinimumSeenOverNoise * noise)) return null;
        double spanNeeded = pre + 2 * 2 * network.LongestDelaySeconds() + 40 * rise;
        int count = (int)Math.Ceiling(spanNeeded / dt);
        if (count > MaximumSamples) return null;
        count = Math.Max(count, 2048);
        return new AccuracyCase(index, "random", source, network, z0, vf, loss, rise, dt, count, noise, rng.Next(),
            truth, echoes, words, branchEnds);
    }

    private static Feature RandomFeature(EventKind kind, Random rng, double z0, double rise, double u) => kind switch
    {
        EventKind.ImpedanceRise => new Section(Uniform(rng, 0.05, 0.3), Uniform(rng, ClearGapUnits, 40) * u),
        EventKind.ImpedanceDrop => new Section(-Uniform(rng, 0.05, 0.3), Uniform(rng, ClearGapUnits, 40) * u),
        EventKind.Capacitive => new Lumped(kind, 2 * Uniform(rng, 0.3, 2) * rise / z0),
        EventKind.Inductive => new Lumped(kind, 2 * z0 * Uniform(rng, 0.3, 2) * rise),
        EventKind.PartialShort => new Lumped(kind, z0 * (1 / Uniform(rng, 0.05, 0.5) - 1) / 2),
        EventKind.SeriesResistance => SeriesResistor(rng, z0),
        EventKind.Tap => new Tap(Uniform(rng, 4, 20) * u),
        _ => throw new ArgumentOutOfRangeException(nameof(kind)),
    };

    private static Lumped SeriesResistor(Random rng, double z0)
    {
        double rho = Uniform(rng, 0.05, 0.5);
        return new Lumped(EventKind.SeriesResistance, 2 * z0 * rho / (1 - rho));
    }

    private static LumpedPair RandomPair(Random rng, double z0, double rise, double spacing)
    {
        var kinds = new[] { EventKind.Capacitive, EventKind.Inductive, EventKind.PartialShort, EventKind.SeriesResistance };
        var one = (Lumped)RandomFeature(kinds[rng.Next(kinds.Length)], rng, z0, rise, 1);
        return new LumpedPair(one.Kind, one.Size, spacing);
    }

    /// <summary>Builds the network from the far end back (a tap's junction ends its branch) and walks it forward for
    /// the truth.</summary>
    private static (CableNetwork, List<TruthEvent>, List<double>, List<double>, string)? Assemble(List<Feature> features, double[] positions,
        RunEnd end, double endMeters, CableMedium medium, double z0, double vf, CableLossModel? loss, double rise, double u)
    {
        var truth = new List<TruthEvent>();
        var echoes = new List<double>();
        var branchEnds = new List<double>();
        var words = new List<string>();
        double transmission = 1;
        double alpha = Attenuation(loss, z0, 0.35 / rise);
        double Seen(double size, double d) => Math.Abs(size) * transmission * Math.Exp(-2 * alpha * d);

        // Forward walk: a list of (segment-or-element) pieces per level; a tap opens a new level.
        var levels = new List<List<NetworkElement>> { new() };
        var stubs = new List<double>();
        double at = 0;
        void Cable(double toMeters, double impedance)
        {
            if (toMeters - at > 1e-9) levels[^1].Add(new CableSegment(toMeters - at, impedance == z0 ? medium : new CableMedium(impedance, vf, loss)));
            at = toMeters;
        }
        for (int i = 0; i < features.Count; i++)
        {
            double p = positions[i];
            Cable(p, z0);
            switch (features[i])
            {
                case Section s:
                {
                    double z1 = z0 * (1 + s.Rho) / (1 - s.Rho);
                    var first = s.Rho > 0 ? EventKind.ImpedanceRise : EventKind.ImpedanceDrop;
                    var second = s.Rho > 0 ? EventKind.ImpedanceDrop : EventKind.ImpedanceRise;
                    truth.Add(new TruthEvent(p, first, F($"section {z1:0.#} Ω × {s.LengthMeters:0.###} m"), Seen(s.Rho, p)));
                    transmission *= 1 - s.Rho * s.Rho;
                    Cable(p + s.LengthMeters, z1);
                    truth.Add(new TruthEvent(p + s.LengthMeters, second, F($"end of {z1:0.#} Ω section"), Seen(s.Rho, p + s.LengthMeters)));
                    transmission *= 1 - s.Rho * s.Rho;
                    words.Add(F($"{z1:0.#} Ω section {p:0.###}–{p + s.LengthMeters:0.###} m"));
                    break;
                }
                case Lumped l:
                    AddLumped(l.Kind, l.Size, p);
                    break;
                case LumpedPair pair:
                    AddLumped(pair.Kind, pair.Size, p);
                    Cable(p + pair.SpacingMeters, z0);
                    AddLumped(pair.Kind, pair.Size, p + pair.SpacingMeters);
                    break;
                case Tap t:
                    truth.Add(new TruthEvent(p, EventKind.Tap, F($"tap, open branch {t.StubMeters:0.###} m"), Seen(1.0 / 3, p)));
                    transmission *= 4.0 / 9;
                    for (int k = 1; k <= 3; k++) echoes.Add(p + k * t.StubMeters);
                    branchEnds.Add(p + t.StubMeters);
                    words.Add(F($"tap at {p:0.###} m (open branch {t.StubMeters:0.###} m)"));
                    stubs.Add(t.StubMeters);
                    levels.Add(new List<NetworkElement>());
                    break;
            }
        }
        Cable(endMeters, z0);
        levels[^1].Add(end);
        switch (end.Kind)
        {
            case EndKind.Open: truth.Add(new TruthEvent(endMeters, EventKind.Open, "open end", Seen(1, endMeters))); break;
            case EndKind.Short: truth.Add(new TruthEvent(endMeters, EventKind.Short, "short end", Seen(1, endMeters))); break;
            case EndKind.Resistor:
                double rho = (end.ResistanceOhms - z0) / (end.ResistanceOhms + z0);
                truth.Add(new TruthEvent(endMeters, EventKind.Termination, F($"end in {end.ResistanceOhms:0.#} Ω"), Seen(rho, endMeters)));
                break;
        }
        // A shunt or series resistor, or a step to a new impedance, with nothing after it but a matched line is, seen from
        // the port, the resistive load R‖Z, R + Z or Z at that point for every frequency: the same input impedance, so the
        // same trace, as a resistor termination there. Either name is right (and is scored so).
        if (end.Kind == EndKind.Matched && truth.Count > 0
            && truth[^1].Kind is EventKind.PartialShort or EventKind.SeriesResistance or EventKind.ImpedanceRise or EventKind.ImpedanceDrop)
            truth[^1] = truth[^1] with { EquivalentKind = EventKind.Termination };
        words.Add(end.Kind switch
        {
            EndKind.Resistor => F($"{endMeters:0.###} m to {end.ResistanceOhms:0.#} Ω"),
            _ => F($"{endMeters:0.###} m to {end.Kind.ToString().ToLowerInvariant()}"),
        });

        // First-order echoes between events: j's reflection bounced back by i arrives as if from 2·d_j − d_i.
        for (int i = 0; i < truth.Count; i++)
            for (int j = i + 1; j < truth.Count; j++)
                echoes.Add(2 * truth[j].DistanceMeters - truth[i].DistanceMeters);

        // From the far end back: each tap level becomes a junction of (rest of the main line, its open stub).
        var branch = new NetworkBranch(levels[^1]);
        for (int level = levels.Count - 2; level >= 0; level--)
        {
            var stub = new NetworkBranch(new CableSegment(stubs[level], medium), RunEnd.Open);
            branch = new NetworkBranch(levels[level].Append(new Junction([branch, stub])).ToList());
        }
        var network = new CableNetwork(branch, "accuracy");
        if (network.Problems().Count > 0) return null;
        string cable = F($"Z0 {z0} Ω, VF {vf:0.###}, u = {u * 1000:0.#} mm{(loss is { IsLossless: false } ? F($", loss {loss.AttenuationDbPer100m(100e6):0.#} dB/100 m @100 MHz + {loss.DcResistanceOhmsPerMeter:0.###} Ω/m") : "")}");
        return (network, truth, echoes, branchEnds, cable + ": " + string.Join("; ", words));

        void AddLumped(EventKind kind, double size, double p)
        {
            switch (kind)
            {
                case EventKind.Capacitive:
                    levels[^1].Add(new ShuntCapacitor(size));
                    truth.Add(new TruthEvent(p, kind, F($"shunt C {size * 1e12:0.#} pF"), Seen(PeakOfLumped(z0 * size / 2, rise), p)));
                    words.Add(F($"{size * 1e12:0.#} pF at {p:0.###} m"));
                    break;
                case EventKind.Inductive:
                    levels[^1].Add(new SeriesInductor(size));
                    truth.Add(new TruthEvent(p, kind, F($"series L {size * 1e9:0.#} nH"), Seen(PeakOfLumped(size / (2 * z0), rise), p)));
                    words.Add(F($"{size * 1e9:0.#} nH at {p:0.###} m"));
                    break;
                case EventKind.PartialShort:
                {
                    levels[^1].Add(new ShuntResistor(size));
                    double rho = z0 / (2 * size + z0);
                    truth.Add(new TruthEvent(p, kind, F($"shunt R {size:0.#} Ω"), Seen(rho, p)));
                    transmission *= (1 - rho) * (1 - rho);
                    words.Add(F($"shunt {size:0.#} Ω at {p:0.###} m"));
                    break;
                }
                case EventKind.SeriesResistance:
                {
                    levels[^1].Add(new SeriesResistor(size));
                    double rho = size / (size + 2 * z0);
                    truth.Add(new TruthEvent(p, kind, F($"series R {size:0.#} Ω"), Seen(rho, p)));
                    transmission *= (1 - rho) * (1 - rho);
                    words.Add(F($"series {size:0.#} Ω at {p:0.###} m"));
                    break;
                }
            }
        }
    }

    /// <summary>Two equal reflections 0.5 u apart (a two-step impedance staircase, ρ equal at both steps) on a lossless
    /// line ending matched; the noise puts each step 40 dB over the noise RMS (|ρ|/σ = 100).</summary>
    public static AccuracyCase ClosePair(int index, int seed)
    {
        var rng = new Random(seed);
        double z0 = 50, vf = Uniform(rng, 0.60, 0.85);
        double rise = LogUniform(rng, 0.2e-9, 2e-9);
        var medium = new CableMedium(z0, vf);
        double u = medium.VelocityMetersPerSecond * rise / 2;
        double rho = RandomSign(rng) * Uniform(rng, 0.05, 0.2);
        double z1 = z0 * (1 + rho) / (1 - rho), z2 = z1 * (1 + rho) / (1 - rho);
        double d1 = Math.Max(Uniform(rng, 10, 100) * u, 1);
        double d2 = d1 + 0.5 * u;
        double endMeters = d2 + 40 * u;
        var network = new CableNetwork(new NetworkBranch(
            new CableSegment(d1, medium), new CableSegment(d2 - d1, new CableMedium(z1, vf)),
            new CableSegment(endMeters - d2, new CableMedium(z2, vf)), RunEnd.Matched), "close pair");
        var kind = rho > 0 ? EventKind.ImpedanceRise : EventKind.ImpedanceDrop;
        var truth = new List<TruthEvent>
        {
            new(d1, kind, F($"step to {z1:0.#} Ω"), Math.Abs(rho)),
            // The second step runs into a matched line: a resistor termination of Z₂ there gives the same trace.
            new(d2, kind, F($"step to {z2:0.#} Ω"), Math.Abs(rho) * (1 - rho * rho), EventKind.Termination),
        };
        double dt = rise / SamplesPerRise, pre = 5 * rise + 2e-9;
        int count = Math.Max(2048, (int)Math.Ceiling((pre + 4 * network.LongestDelaySeconds() + 40 * rise) / dt));
        return new AccuracyCase(index, "close-pair", TraceSource.Model, network, z0, vf, null, rise, dt, count,
            Math.Abs(rho) / 100, rng.Next(), truth, [], F($"Z0 50 Ω, VF {vf:0.###}, u = {u * 1000:0.#} mm: {z0}→{z1:0.#}→{z2:0.#} Ω at {d1:0.###} and {d2:0.###} m, matched at {endMeters:0.###} m"));
    }

    /// <summary>A run with nothing on it: a cable ending matched (lossless or lossy), or, for "noise-only", the step into
    /// a matched load at the port. Noise 0–2 mV RMS. Any located event is false.</summary>
    public static AccuracyCase NothingThere(int index, int seed, bool noiseOnly)
    {
        var rng = new Random(seed);
        double z0 = Impedances[rng.Next(Impedances.Length)], vf = Uniform(rng, 0.60, 0.85);
        double rise = LogUniform(rng, 0.2e-9, 2e-9);
        bool lossy = !noiseOnly && rng.NextDouble() < 0.5;
        var loss = lossy ? CableLossModel.FromDatasheet(Uniform(rng, 2, 12), 100e6, dcResistanceOhmsPerMeter: Uniform(rng, 0, 0.05)) : null;
        var medium = new CableMedium(z0, vf, loss);
        double u = medium.VelocityMetersPerSecond * rise / 2;
        double length = Math.Max(Uniform(rng, 20, 400) * u, 1);
        var network = noiseOnly
            ? new CableNetwork(new NetworkBranch(new CableSegment(1e-6, medium), RunEnd.Matched), "noise only")
            : new CableNetwork(new NetworkBranch(new CableSegment(length, medium), RunEnd.Matched), "matched line");
        double dt = rise / SamplesPerRise, pre = 5 * rise + 2e-9;
        int count = Math.Max(2048, (int)Math.Ceiling((pre + 4 * network.LongestDelaySeconds() + 40 * rise) / dt));
        return new AccuracyCase(index, noiseOnly ? "noise-only" : "matched-line", TraceSource.Model, network, z0, vf, loss,
            rise, dt, count, Uniform(rng, 0, 2e-3), rng.Next(), [], [],
            noiseOnly ? F($"Z0 {z0} Ω: step into a matched load at the port") : F($"Z0 {z0} Ω, VF {vf:0.###}{(lossy ? ", lossy" : "")}: {length:0.###} m to matched"));
    }

    /// <summary>A lossy run that ends in a resistor of its own impedance (a terminator, a camera): no step where it ends,
    /// only the turn of the lossy line's creep (see CableFault's MatchedLossyEnd). The truth is a termination there; the
    /// cable and record are drawn as for <see cref="NothingThere"/>, the loss always present. Scored on its own
    /// ("matched-end"), not in the main set's figures.</summary>
    public static AccuracyCase MatchedEnd(int index, int seed)
    {
        var rng = new Random(seed);
        double z0 = Impedances[rng.Next(Impedances.Length)], vf = Uniform(rng, 0.60, 0.85);
        double rise = LogUniform(rng, 0.2e-9, 2e-9);
        var loss = CableLossModel.FromDatasheet(Uniform(rng, 2, 12), 100e6, dcResistanceOhmsPerMeter: Uniform(rng, 0, 0.05));
        var medium = new CableMedium(z0, vf, loss);
        double u = medium.VelocityMetersPerSecond * rise / 2;
        double length = Math.Max(Uniform(rng, 20, 400) * u, 1);
        var network = new CableNetwork(new NetworkBranch(new CableSegment(length, medium), RunEnd.Resistor(z0)), "matched end");
        double dt = rise / SamplesPerRise, pre = 5 * rise + 2e-9;
        int count = Math.Max(2048, (int)Math.Ceiling((pre + 4 * network.LongestDelaySeconds() + 40 * rise) / dt));
        var truth = new List<TruthEvent> { new(length, EventKind.Termination, F($"resistor of {z0} Ω"), 0) };
        return new AccuracyCase(index, "matched-end", TraceSource.Model, network, z0, vf, loss, rise, dt, count,
            Uniform(rng, 0, 2e-3), rng.Next(), truth, [], F($"Z0 {z0} Ω, VF {vf:0.###}, u = {u * 1000:0.#} mm, {loss.AttenuationDbPer100m(100e6):0.#} dB/100 m @100 MHz + {loss.DcResistanceOhmsPerMeter:0.###} Ω/m: {length:0.###} m to a {z0} Ω resistor"));
    }

    /// <summary>Peak of the dip/bump V_i·e^(−t/τ) seen through a Gaussian edge of 10–90 % rise t_r (σ = t_r/2.5631), over
    /// V_i: the exponentially modified Gaussian e^(σ²/2τ² − t/τ)·Φ((t − σ²/τ)/σ), maximised over t on a fine grid.</summary>
    public static double PeakOfLumped(double tauSeconds, double riseSeconds)
    {
        double sigma = riseSeconds / 2.5631031310892007;
        double best = 0;
        for (int i = -400; i <= 2000; i++)
        {
            double t = i * sigma / 100;
            double exponent = sigma * sigma / (2 * tauSeconds * tauSeconds) - t / tauSeconds;
            double value = Math.Exp(exponent) * NormalCdf((t - sigma * sigma / tauSeconds) / sigma);
            if (double.IsFinite(value)) best = Math.Max(best, value);
        }
        return Math.Min(best, 1);
    }

    private static double NormalCdf(double x) => 0.5 * MathNet.Numerics.SpecialFunctions.Erfc(-x / Math.Sqrt(2));

    /// <summary>α(f) = k_c√f + k_d·f + R/(2Z₀), Np/m (low-loss line; Pozar, Microwave Engineering, 4th ed., §2.7).</summary>
    private static double Attenuation(CableLossModel? loss, double z0, double frequencyHz) => loss is null ? 0
        : loss.SkinLossNepersPerMeterPerRootHertz * Math.Sqrt(frequencyHz) + loss.DielectricLossNepersPerMeterPerHertz * frequencyHz
          + loss.DcResistanceOhmsPerMeter / (2 * z0);

    private static double ResistanceForRho(double z0, double rho) => z0 * (1 + rho) / (1 - rho);

    private static double Uniform(Random rng, double lo, double hi) => lo + (hi - lo) * rng.NextDouble();

    private static double LogUniform(Random rng, double lo, double hi) => Math.Exp(Uniform(rng, Math.Log(lo), Math.Log(hi)));

    private static double RandomSign(Random rng) => rng.NextDouble() < 0.5 ? -1 : 1;

    private static void Shuffle<T>(List<T> list, Random rng)
    {
        for (int i = list.Count - 1; i > 0; i--)
        {
            int j = rng.Next(i + 1);
            (list[i], list[j]) = (list[j], list[i]);
        }
    }

    private static string F(FormattableString s) => s.ToString(CultureInfo.InvariantCulture);
}
