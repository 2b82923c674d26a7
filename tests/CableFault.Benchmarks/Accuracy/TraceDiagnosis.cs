using System.Globalization;
using CableFault;
using CableFault.Analysis;
using CableFault.Traces;

namespace CableFault.Benchmarks.Accuracy;

/// <summary>
/// `diagnose FILE VF Z0 [CABLE [SOURCE_OHMS]]`: locate one trace file with every hypothesis the model selection tries written out (the
/// <c>--only</c> diagnosis of the accuracy benchmark, for a trace that is not one of its cases).
/// </summary>
public static class TraceDiagnosis
{
    public static int Run(string[] args)
    {
        if (args.Length < 3)
        {
            Console.Error.WriteLine("diagnose: use diagnose FILE VF Z0 [CABLE [SOURCE_OHMS]]");
            return 2;
        }
        if (!double.TryParse(args[1], NumberStyles.Float, CultureInfo.InvariantCulture, out double vf)
            || !double.TryParse(args[2], NumberStyles.Float, CultureInfo.InvariantCulture, out double z0))
        {
            Console.Error.WriteLine($"diagnose: VF '{args[1]}' and Z0 '{args[2]}' must be numbers, e.g. diagnose trace.csv 0.66 50");
            return 2;
        }
        Trace trace;
        try
        {
            using var stream = File.OpenRead(args[0]);
            trace = TraceCsvReader.Read(stream, args[0]);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or InputException)
        {
            Console.Error.WriteLine($"diagnose: {e.Message}");
            return 2;
        }
        // Optional: a built-in cable type whose loss is told, and the instrument's source impedance, Ω.
        var cable = args.Length > 3 ? CableFault.Cables.CableLibrary.BuiltIn.Find(args[3]) : null;
        if (args.Length > 3 && cable is null)
        {
            Console.Error.WriteLine($"diagnose: unknown cable type '{args[3]}'; `cablefault cables` lists the built-in ones");
            return 2;
        }
        double source = 50;
        if (args.Length > 4 && !(double.TryParse(args[4], NumberStyles.Float, CultureInfo.InvariantCulture, out source) && source > 0))
        {
            Console.Error.WriteLine($"diagnose: source impedance '{args[4]}' must be a positive number of ohms, e.g. 50");
            return 2;
        }
        var loss = cable?.Medium.Loss;
        // As the CLI does: a run whose loss no cable type tells has it estimated from the trace.
        var options = new LocateOptions { VelocityFactor = vf, ImpedanceOhms = z0, Loss = loss, EstimateLoss = loss is null, SourceImpedanceOhms = source };
        // The detector's candidates, the selection's starting point.
        var characteristics = TraceConditioner.Characterise(trace);
        var aligned = TraceConditioner.Align(trace, characteristics);
        var profile = LayerPeeling.Profile(aligned, characteristics, z0, vf, options.Loss, options.SourceImpedanceOhms);
        foreach (var c in EventDetector.Detect(aligned, characteristics, profile))
            Console.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"  candidate {c.RoundTripSeconds * 1e9,9:0.00} ns  {c.Shape,-5} Δρ {c.ReflectionStep:+0.0000;-0.0000;0.0000}  SNR {c.SignalToNoise:0.0}  Z after {c.ImpedanceAfterOhms:0.0}"));
        // Warm the JIT first, so the elapsed times on each line are the analysis's own.
        Locator.Locate(trace, options);
        long before = RunModel.SimulationCount;
        var watch = System.Diagnostics.Stopwatch.StartNew();
        // Processor time beside the wall time: their ratio is how many cores the stage kept busy.
        var process = System.Diagnostics.Process.GetCurrentProcess();
        var cpuBefore = process.TotalProcessorTime;
        double CpuMilliseconds()
        {
            process.Refresh();
            return (process.TotalProcessorTime - cpuBefore).TotalMilliseconds;
        }
        ModelSelection.DebugTrace = m => Console.WriteLine(string.Create(CultureInfo.InvariantCulture,
            $"    [{watch.Elapsed.TotalMilliseconds,6:0} ms cpu {CpuMilliseconds(),6:0} ms {RunModel.SimulationCount - before,5} runs] {m}"));
        var result = Locator.Locate(trace, options);
        foreach (var e in result.Events)
            Console.WriteLine(string.Create(CultureInfo.InvariantCulture, $"  {e.DistanceMeters,9:0.000} m  {EventKindNames.ToJsonName(e.Kind),-18} ρ {e.Reflection:+0.000;-0.000;0.000}  conf {e.Confidence:0.00}"));
        Console.WriteLine(string.Create(CultureInfo.InvariantCulture, $"  {watch.Elapsed.TotalSeconds:0.000} s, {RunModel.SimulationCount - before} forward runs; {result.Fit.Message}"));
        foreach (var w in result.Warnings) Console.WriteLine("  warning: " + w);
        return 0;
    }
}
