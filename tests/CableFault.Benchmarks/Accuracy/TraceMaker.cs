using CableFault.Simulation;
using CableFault.Traces;

namespace CableFault.Benchmarks.Accuracy;

/// <summary>Makes a case's trace with its simulator, then adds the case's seeded white Gaussian noise.</summary>
public static class TraceMaker
{
    /// <summary>The noisy trace: time zero at the incident edge's 50 % point, a 1 V incident step into Z_s = Z₀.</summary>
    public static Trace Make(AccuracyCase c, string? workFolder = null)
    {
        var clean = c.Source == TraceSource.Ngspice ? NgspiceTraces.Simulate(c, workFolder ?? Path.GetTempPath()) : SimulateModel(c);
        return AddNoise(clean, c.NoiseRmsVolts, c.NoiseSeed);
    }

    /// <summary>CableFault's forward model with the Gaussian (error-function) edge.</summary>
    public static Trace SimulateModel(AccuracyCase c) => ForwardModel.Simulate(c.Network, Settings(c));

    /// <summary>The instrument of a case, noise-free (noise is added by <see cref="AddNoise"/> for both simulators alike).</summary>
    public static InstrumentSettings Settings(AccuracyCase c) => new()
    {
        SourceImpedanceOhms = c.ImpedanceOhms,
        IncidentAmplitudeVolts = 1,
        RiseTimeSeconds = c.RiseSeconds,
        EdgeShape = EdgeShape.Gaussian,
        SampleIntervalSeconds = c.SampleIntervalSeconds,
        SampleCount = c.SampleCount,
        PreTriggerSeconds = c.PreTriggerSeconds,
    };

    /// <summary>Adds N(0, σ²) to every sample (Box–Muller on a seeded System.Random).</summary>
    public static Trace AddNoise(Trace trace, double rmsVolts, int seed)
    {
        if (rmsVolts <= 0) return trace;
        var rng = new Random(seed);
        var samples = new double[trace.Length];
        for (int i = 0; i < samples.Length; i++)
        {
            double u1 = 1 - rng.NextDouble(), u2 = rng.NextDouble();
            samples[i] = trace.SamplesVolts[i] + rmsVolts * Math.Sqrt(-2 * Math.Log(u1)) * Math.Cos(2 * Math.PI * u2);
        }
        return trace.WithSamples(samples);
    }
}
