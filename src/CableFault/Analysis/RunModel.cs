using CableFault.Cables;
using CableFault.Networks;
using CableFault.Simulation;

namespace CableFault.Analysis;

/// <summary>
/// The parametric model of a run: an incident step (amplitude, time offset, rise) launched into a chain of events at
/// round-trip times, each with a size. It turns into a <see cref="CableNetwork"/> and, through
/// <see cref="ForwardModel"/>, into the expected trace, so multiple reflections, transmission through earlier events
/// and loss are modelled rather than corrected for.
/// </summary>
/// <remarks>
/// The fit works on dimensionless parameters (see <see cref="ToVector"/>): times in units of the reference rise,
/// sizes as natural logarithms of value/scale so that they stay positive and a unit step is a similar change for all.
/// A boundary that is the last event is followed by a matched line of its impedance: for a step stimulus that is the
/// same as a resistive end of that many ohms.
/// </remarks>
internal sealed class RunModel
{
    /// <summary>Shortest segment the model builds, m: keeps events that LM pushes together or past each other valid.</summary>
    private const double MinimumSegmentMeters = 1e-6;

    /// <summary>Length of the stub that carries a matched end after the last event, m (any positive length will do).</summary>
    private const double TailMeters = 1e-3;

    /// <summary>Number of global parameters (amplitude, time offset, rise, level offset) at the start of the vector.</summary>
    internal const int GlobalParameterCount = 4;

    /// <summary>Indices of the amplitude, the time offset and the rise in <see cref="ToVector"/>.</summary>
    internal const int AmplitudeIndex = 0, TimeOffsetIndex = 1, RiseIndex = 2;

    /// <summary>Forward-model evaluations so far in this process (for cost measurements).</summary>
    internal static long SimulationCount;

    internal RunModel(RunModelContext context, double amplitudeVolts, double timeOffsetSeconds, double riseSeconds,
        IReadOnlyList<RunModelEvent> events, double offsetVolts = 0)
    {
        Context = context;
        OffsetVolts = offsetVolts;
        AmplitudeVolts = amplitudeVolts;
        TimeOffsetSeconds = timeOffsetSeconds;
        RiseSeconds = riseSeconds;
        Events = events.OrderBy(e => e.RoundTripSeconds).ToArray();
    }

    internal RunModelContext Context { get; }

    /// <summary>Incident step amplitude V_s/2, V.</summary>
    internal double AmplitudeVolts { get; }

    /// <summary>Level of the trace before the edge, V: the baseline the conditioning removed is an estimate from a few
    /// noisy samples, and a residual offset of a fraction of the noise would otherwise pass for a change of level.</summary>
    internal double OffsetVolts { get; }

    /// <summary>Where the incident edge's 50 % point lies on the aligned time axis, s (ideally 0).</summary>
    internal double TimeOffsetSeconds { get; }

    /// <summary>10–90 % rise of the instrument's Gaussian edge, s.</summary>
    internal double RiseSeconds { get; }

    /// <summary>Events in order of round-trip time (relative to the incident edge).</summary>
    internal IReadOnlyList<RunModelEvent> Events { get; }

    /// <summary>Largest estimated settling fraction, in units of its scale (10 %): beyond that the step is not a step.</summary>
    private const double SettlingFractionLimitScales = 10;

    /// <summary>Parameters of an estimated loss, at the end of <see cref="ToVector"/>.</summary>
    internal const int LossParameterCount = 2;

    /// <summary>Number of parameters in <see cref="ToVector"/>.</summary>
    internal int ParameterCount => GlobalParameterCount + Events.Sum(e => e.HasValue ? 2 : 1) + (Context.EstimateLoss ? LossParameterCount : 0)
        + (Context.EstimateSettling ? SettlingParameterCount : 0);

    /// <summary>Parameters of an estimated settling of the step, at the very end of <see cref="ToVector"/>.</summary>
    internal const int SettlingParameterCount = 2;

    /// <summary>The same run read with other cable settings.</summary>
    internal RunModel WithContext(RunModelContext context) =>
        new(context, AmplitudeVolts, TimeOffsetSeconds, RiseSeconds, Events, OffsetVolts);

    internal RunModel WithEvents(IEnumerable<RunModelEvent> events) =>
        new(Context, AmplitudeVolts, TimeOffsetSeconds, RiseSeconds, events.ToList(), OffsetVolts);

    /// <summary>Scale of an event's size, so ln(value/scale) is of order one.</summary>
    internal static double ValueScale(RunModelElement element, RunModelContext c) => element switch
    {
        RunModelElement.Boundary or RunModelElement.ShuntResistor or RunModelElement.SeriesResistor => c.ImpedanceOhms,
        RunModelElement.ShuntCapacitor => c.ReferenceRiseSeconds / c.ImpedanceOhms,
        RunModelElement.SeriesInductor => c.ReferenceRiseSeconds * c.ImpedanceOhms,
        RunModelElement.Tap => c.ReferenceRiseSeconds,
        _ => 1,
    };

    /// <summary>
    /// Dimensionless parameters: [A/A_ref, δt₀/t_ref, ln(t_r/t_ref), offset/A_ref] then per event [t/t_ref, ln(value/scale)]
    /// (open and short have no size), then, when the loss is estimated, [k_c/k_ref, R_dc/R_ref] (see
    /// <see cref="RunModelContext"/>). The loss coefficients enter as their absolute values: linear, so that a lossless
    /// run is reachable (a logarithm would need −∞), and mirrored, so that they never turn negative and the fit does not
    /// stick at zero.
    /// </summary>
    internal double[] ToVector()
    {
        var c = Context;
        var u = new List<double>
        {
            AmplitudeVolts / c.ReferenceAmplitudeVolts,
            TimeOffsetSeconds / c.ReferenceRiseSeconds,
            Math.Log(RiseSeconds / c.ReferenceRiseSeconds),
            OffsetVolts / c.ReferenceAmplitudeVolts,
        };
        foreach (var e in Events)
        {
            u.Add(e.RoundTripSeconds / c.ReferenceRiseSeconds);
            if (e.HasValue) u.Add(Math.Log(e.Value / ValueScale(e.Element, c)));
        }
        if (c.EstimateLoss)
        {
            var loss = c.Loss ?? CableLossModel.Lossless;
            u.Add(loss.SkinLossNepersPerMeterPerRootHertz / RunModelContext.SkinLossScale);
            u.Add(loss.DcResistanceOhmsPerMeter / RunModelContext.DcResistanceScale);
        }
        if (c.EstimateSettling)
        {
            // The fraction is signed (a step may creep up or sag back); the time constant's logarithm, in rise times.
            u.Add(c.SettlingFraction / RunModelContext.SettlingFractionScale);
            u.Add(Math.Log(c.SettlingSeconds / c.ReferenceRiseSeconds));
        }
        return u.ToArray();
    }

    /// <summary>The model with the same event kinds and the sizes in <paramref name="u"/>.</summary>
    internal RunModel FromVector(IReadOnlyList<double> u)
    {
        var c = Context;
        var events = new List<RunModelEvent>(Events.Count);
        int k = GlobalParameterCount;
        foreach (var e in Events)
        {
            double t = u[k++] * c.ReferenceRiseSeconds;
            double value = e.HasValue ? Math.Exp(Math.Clamp(u[k++], -40, 40)) * ValueScale(e.Element, c) : double.NaN;
            events.Add(e with { RoundTripSeconds = t, Value = value });
        }
        if (c.EstimateLoss)
        {
            double skin = Math.Min(Math.Abs(u[k++]), RunModelContext.MaximumLossScales) * RunModelContext.SkinLossScale;
            double dc = Math.Min(Math.Abs(u[k++]), RunModelContext.MaximumLossScales) * RunModelContext.DcResistanceScale;
            c = c with { Loss = new CableLossModel(skin, 0, dc) };
        }
        if (c.EstimateSettling)
            c = c with
            {
                SettlingFraction = Math.Clamp(u[k++], -SettlingFractionLimitScales, SettlingFractionLimitScales) * RunModelContext.SettlingFractionScale,
                SettlingSeconds = Math.Exp(Math.Clamp(u[k], 0, 12)) * c.ReferenceRiseSeconds,
            };
        return new RunModel(c, u[0] * c.ReferenceAmplitudeVolts, u[1] * c.ReferenceRiseSeconds,
            Math.Exp(Math.Clamp(u[2], -5, 5)) * c.ReferenceRiseSeconds, events, u[3] * c.ReferenceAmplitudeVolts);
    }

    /// <summary>
    /// Which parameters a partial fit frees: the incident edge's (amplitude, time offset, rise, level offset), the time and
    /// size of events <paramref name="firstEvent"/>..<paramref name="lastEvent"/> (clamped to the events there are), and,
    /// when <paramref name="withLoss"/> and the loss is estimated, its two coefficients.
    /// </summary>
    internal bool[] FreeMask(int firstEvent, int lastEvent, bool withLoss)
    {
        var free = new bool[ParameterCount];
        for (int g = 0; g < GlobalParameterCount; g++) free[g] = true;
        for (int i = Math.Max(0, firstEvent); i <= Math.Min(Events.Count - 1, lastEvent); i++)
        {
            int k = TimeParameterIndex(i);
            free[k] = true;
            if (Events[i].HasValue) free[k + 1] = true;
        }
        int settling = Context.EstimateSettling ? SettlingParameterCount : 0;
        if (withLoss && Context.EstimateLoss)
            for (int k = free.Length - settling - LossParameterCount; k < free.Length - settling; k++) free[k] = true;
        for (int k = free.Length - settling; k < free.Length; k++) free[k] = true;
        return free;
    }

    /// <summary>Index of event <paramref name="eventIndex"/>'s time parameter in <see cref="ToVector"/>.</summary>
    internal int TimeParameterIndex(int eventIndex)
    {
        int k = GlobalParameterCount;
        for (int i = 0; i < eventIndex; i++) k += Events[i].HasValue ? 2 : 1;
        return k;
    }

    /// <summary>The run as a network (the times are relative to the incident edge).</summary>
    internal CableNetwork ToNetwork() => new(Branch(0, 0, Context.ImpedanceOhms, new Dictionary<double, CableMedium>()));

    /// <summary>The branch from event <paramref name="start"/> on, starting at round trip <paramref name="startTime"/> on a
    /// line of <paramref name="impedance"/> Ω.</summary>
    /// <param name="start">Index of the first event in this branch.</param>
    /// <param name="startTime">Round-trip time where the branch starts, s.</param>
    /// <param name="impedance">Line impedance at the branch start, Ω.</param>
    /// <param name="media">One medium per impedance, shared by its segments: the compiled network then evaluates the
    /// cable's propagation (square roots and powers per frequency) once per impedance rather than once per segment.</param>
    private NetworkBranch Branch(int start, double startTime, double impedance, Dictionary<double, CableMedium> media)
    {
        var c = Context;
        CableMedium Medium(double z)
        {
            if (!media.TryGetValue(z, out var medium)) media[z] = medium = c.Medium(z);
            return medium;
        }
        double v = c.VelocityMetersPerSecond;
        var elements = new List<NetworkElement>();
        double previous = startTime;
        for (int i = start; i < Events.Count; i++)
        {
            var e = Events[i];
            double length = Math.Max((e.RoundTripSeconds - previous) * v / 2, MinimumSegmentMeters);
            previous = Math.Max(previous, e.RoundTripSeconds);
            elements.Add(new CableSegment(length, Medium(impedance)));
            switch (e.Element)
            {
                case RunModelElement.Boundary: impedance = e.Value; break;
                case RunModelElement.ShuntCapacitor: elements.Add(new ShuntCapacitor(e.Value)); break;
                case RunModelElement.SeriesInductor: elements.Add(new SeriesInductor(e.Value)); break;
                case RunModelElement.ShuntResistor: elements.Add(new ShuntResistor(e.Value)); break;
                case RunModelElement.SeriesResistor: elements.Add(new SeriesResistor(e.Value)); break;
                case RunModelElement.Open: elements.Add(RunEnd.Open); return new NetworkBranch(elements);
                case RunModelElement.Short: elements.Add(RunEnd.Short); return new NetworkBranch(elements);
                case RunModelElement.Tap:
                    var main = Branch(i + 1, previous, impedance, media);
                    var side = new NetworkBranch(
                        new CableSegment(Math.Max(e.Value * v / 2, MinimumSegmentMeters), Medium(impedance)), RunEnd.Open);
                    elements.Add(new Junction([main, side]));
                    return new NetworkBranch(elements);
            }
        }
        elements.Add(new CableSegment(TailMeters, Medium(impedance)));
        elements.Add(c.ResistiveEnd ? RunEnd.Resistor(impedance) : RunEnd.Matched);
        return new NetworkBranch(elements);
    }

    /// <summary>The samples of a model the simulator cannot run (see <see cref="Simulate"/>), V: far beyond any trace.</summary>
    private const double UnreachableVolts = 1e6;

    /// <summary>Largest internal transform a fit's model may need, as a multiple of the one its window needs with the
    /// edge at time zero and the measured rise. A fit moves the edge by a few rise times and its rise by tens of per
    /// cent, which changes the length by well under two; a step that needs sixteen times as much has left the trace.</summary>
    internal const long MaximumTransformGrowth = 16;

    private static double[] Unreachable(FitData data)
    {
        var samples = new double[data.Samples.Length];
        Array.Fill(samples, UnreachableVolts);
        return samples;
    }

    /// <summary>The settings of this run with the edge at time zero and the measured (reference) rise.</summary>
    private InstrumentSettings ReferenceSettings(FitData data) => Settings(data, Context.ReferenceRiseSeconds, 0);

    /// <summary>
    /// The model's samples at the fit data's sample times. The data were low-passed by a Gaussian of σ_g, which for a
    /// Gaussian edge is the same as an edge of σ = √(σ_r² + σ_g²): the filter is folded into the stimulus exactly.
    /// </summary>
    /// <param name="data">The samples' times and low-pass.</param>
    /// <param name="resumeFrom">Pairs recorded at a nearby model (<see cref="Snapshot"/>), or null.</param>
    internal double[] Simulate(FitData data, SweepSnapshots? resumeFrom = null)
    {
        Interlocked.Increment(ref SimulationCount);
        double[] samples;
        var settings = Settings(data);
        // A trial step far off (the edge moved far from the window, or its rise near a bound) can ask for an internal
        // transform many times the one the window needs at the measured rise: minutes and gigabytes for one run, or
        // beyond the simulator's limit. Such a model is no reading of the trace: a level far from any trace makes the fit
        // reject the step, as it rejects any step that fits worse.
        if (ForwardModel.TransformLength(settings) > MaximumTransformGrowth * ForwardModel.TransformLength(ReferenceSettings(data)))
            return Unreachable(data);
        try
        {
            samples = ForwardModel.SimulateSamples(new CompiledNetwork(ToNetwork()), settings, data.Cache,
                ForwardModel.FitMaximumUndamping, resumeFrom);
        }
        catch (InputException)
        {
            return Unreachable(data);
        }
        if (OffsetVolts != 0)
            for (int i = 0; i < samples.Length; i++) samples[i] += OffsetVolts;
        return samples;
    }

    /// <summary>The run's impedance pairs after each network operation on the contour <see cref="Simulate"/> uses, so
    /// that the runs of a Jacobian's columns (each one parameter away) evaluate only the operations they change. The
    /// caller disposes it.</summary>
    internal SweepSnapshots Snapshot(FitData data) =>
        ForwardModel.Snapshot(new CompiledNetwork(ToNetwork()), Settings(data), data.Cache, ForwardModel.FitMaximumUndamping);

    private InstrumentSettings Settings(FitData data) => Settings(data, RiseSeconds, TimeOffsetSeconds);

    private InstrumentSettings Settings(FitData data, double riseSeconds, double timeOffsetSeconds)
    {
        double sigmaRise = riseSeconds / 2.5631031310892007;
        double sigma = Math.Sqrt(sigmaRise * sigmaRise + data.FilterSigmaSeconds * data.FilterSigmaSeconds);
        return new InstrumentSettings
        {
            SourceImpedanceOhms = Context.SourceImpedanceOhms,
            IncidentAmplitudeVolts = AmplitudeVolts == 0 ? 1e-30 : AmplitudeVolts,
            RiseTimeSeconds = sigma * 2.5631031310892007,
            EdgeShape = EdgeShape.Gaussian,
            SampleIntervalSeconds = data.IntervalSeconds,
            SampleCount = data.Samples.Length,
            // Negative when the data start after the incident edge (a window cut from the middle of the record): the
            // forward model then starts its samples that long after the edge.
            PreTriggerSeconds = timeOffsetSeconds - data.StartTimeSeconds,
            SettlingFraction = Context.SettlingFraction,
            SettlingTimeConstantSeconds = Context.SettlingSeconds,
        };
    }
}
