using System.Diagnostics;
using System.Globalization;
using CableFault.Analysis;

namespace CableFault.Benchmarks.Accuracy;

/// <summary>`accuracy --only I,J`: each chosen case's truth beside what locate reported, with the fit's message, its time
/// and the number of forward-model runs it took — for finding out why a case fails.</summary>
public static class CaseDiagnosis
{
    public static int Run(IReadOnlyList<AccuracyCase> cases, double timeoutSeconds, double lossScale = 1)
    {
        foreach (var c in cases)
        {
            var trace = TraceMaker.Make(c);
            Console.WriteLine(F($"case {c.Index} ({c.Source}, {(c.IsLossy ? "lossy" : "lossless")}): Z0 {c.ImpedanceOhms} Ω, VF {c.VelocityFactor:0.000}, rise {c.RiseSeconds * 1e9:0.###} ns, noise {c.NoiseRmsVolts * 1e3:0.##} mV, u = {c.ResolutionMeters:0.####} m, {c.SampleCount} samples of {c.SampleIntervalSeconds * 1e12:0.###} ps, {c.PreTriggerSeconds * 1e9:0.###} ns before the edge, noise seed {c.NoiseSeed}"));
            Console.WriteLine("  " + c.Description);
            foreach (var t in c.Truth)
                Console.WriteLine(F($"  truth  {t.DistanceMeters,10:0.####} m  {EventKindNames.ToJsonName(t.Kind),-18} {t.Element} (seen {t.SeenSize:0.###})"));
            using var cancel = new CancellationTokenSource(TimeSpan.FromSeconds(timeoutSeconds));
            long before = Interlocked.Read(ref RunModel.SimulationCount);
            var watch = Stopwatch.StartNew();
            if (Environment.GetEnvironmentVariable("CF_TRACE") == "1") ModelSelection.DebugTrace = m => Console.WriteLine("    " + m);
            try
            {
                var result = Locator.Locate(trace, new LocateOptions
                {
                    VelocityFactor = c.VelocityFactor, ImpedanceOhms = c.ImpedanceOhms, SourceImpedanceOhms = c.ImpedanceOhms,
                    Loss = AccuracyBenchmark.StatedLoss(c.Loss, lossScale), EstimateLoss = lossScale == 0, CancellationToken = cancel.Token,
                });
                double seconds = watch.Elapsed.TotalSeconds;
                foreach (var e in result.Events)
                    Console.WriteLine(F($"  found  {e.DistanceMeters,10:0.####} m  {EventKindNames.ToJsonName(e.Kind),-18} ρ {e.Reflection:+0.000;-0.000;0.000} Z {e.ImpedanceOhms:0.#} value {e.Value:G4} conf {e.Confidence:0.00}"));
                Console.WriteLine(F($"  {seconds:0.###} s, {Interlocked.Read(ref RunModel.SimulationCount) - before} forward runs; {result.Fit.Message}"));
                foreach (var w in result.Warnings) Console.WriteLine("  warning: " + w);
            }
            catch (Exception e) when (e is InputException or OperationCanceledException)
            {
                Console.WriteLine("  " + e.GetType().Name + ": " + e.Message);
            }
            Console.WriteLine();
        }
        return 0;
    }

    private static string F(FormattableString s) => s.ToString(CultureInfo.InvariantCulture);
}
