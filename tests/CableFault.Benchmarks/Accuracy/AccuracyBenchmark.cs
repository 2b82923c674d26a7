// Accuracy benchmark of `locate` (issue: "Locate and classify faults by distance, with honest uncertainty").
//
// Run (Release). Time is almost all Locate: the default run took 18 min on the shared 2-core machine (load ~20) with
// Locate at a median 5 s per trace, and will shrink as Locate gets faster; `--cases 20` takes about 5 min.
//   dotnet run -c Release --project tests/CableFault.Benchmarks -- accuracy [--cases N] [--out FILE]
//       [--seed S] [--threads T] [--no-speed] [--native FILE]
//   --cases N    random runs in the main set (default 200; every 4th block of 10 by ngspice: 50 of 200);
//                the side tests scale with N (close pairs N/6, at least 10; matched-line, noise-only and matched-end
//                N/12, at least 5; matched-end: lossy runs into their own impedance, reported but not a target)
//   --out FILE   CSV with one row per true or reported event of every case (default accuracy-results.csv)
//   --no-speed   skip the whole-process timing of `cablefault locate`
//   --loss-scale F   tell locate each lossy run's loss times F (default 1; 0: no loss given, only VF and Z0)
//   --native FILE   also time this natively compiled cablefault executable (README, "A faster native build") on the
//                same traces, interleaved with the JIT runs
//   --locate-timeout S   cancel one Locate after S seconds (default 20) and count the run as failed (all its events
//                missed): a few many-event runs take minutes and would blow the time budget
//   --threads T  cases run side by side (default 2)
//   --only I,J   run only the cases with these indices and print each one's truth, result and fit (for diagnosis;
//                with the environment variable CF_TRACE=1 also every hypothesis the model selection tried)
//
// Prints a summary table to stdout: distance errors of matched events (median and 95th percentile, % of distance and
// units of u = v·t_rise/2), kind accuracy, missed and false events, the same for the naive method and the ratio, the
// close-pair resolution test, false events on noise-only and matched-line traces, and the speed figure, each against
// the issue's target.
using System.Collections.Concurrent;
using System.Diagnostics;
using System.Globalization;
using System.Text;
using CableFault.Analysis;
using CableFault.Cables;

namespace CableFault.Benchmarks.Accuracy;

/// <summary>The accuracy benchmark's driver: cases → traces → locate and the naive method → score → table and CSV.</summary>
public static class AccuracyBenchmark
{
    private const int DefaultCases = 200;

    private const int DefaultSeed = 20240611;

    /// <summary>Targets from the issue (VF known).</summary>
    private const double TargetP95Percent = 0.5, TargetKindAccuracy = 0.95, TargetResolvedFraction = 0.90, TargetSpeedSeconds = 0.5;

    public static int Run(string[] args)
    {
        int cases = DefaultCases, seed = DefaultSeed, threads = 2;
        double timeoutSeconds = 20;
        string output = "accuracy-results.csv";
        bool speed = true;
        double lossScale = 1;
        string? native = null;
        HashSet<int>? only = null;
        for (int i = 0; i < args.Length; i++)
        {
            switch (args[i])
            {
                case "--cases": cases = int.Parse(args[++i], CultureInfo.InvariantCulture); break;
                case "--out": output = args[++i]; break;
                case "--seed": seed = int.Parse(args[++i], CultureInfo.InvariantCulture); break;
                case "--threads": threads = int.Parse(args[++i], CultureInfo.InvariantCulture); break;
                case "--no-speed": speed = false; break;
                case "--loss-scale":
                    if (i + 1 >= args.Length || !double.TryParse(args[++i], NumberStyles.Float, CultureInfo.InvariantCulture, out lossScale) || !(lossScale >= 0) || !double.IsFinite(lossScale))
                    {
                        Console.Error.WriteLine("accuracy: --loss-scale needs a number ≥ 0 (1: the run's own loss, 0: none told), e.g. --loss-scale 0");
                        return 2;
                    }
                    break;
                case "--native":
                    if (i + 1 >= args.Length || !File.Exists(args[i + 1]))
                    {
                        Console.Error.WriteLine($"accuracy: --native needs the path of a natively built cablefault executable{(i + 1 < args.Length ? $"; '{args[i + 1]}' does not exist" : "")} (README, \"A faster native build\")");
                        return 2;
                    }
                    native = args[++i];
                    break;
                case "--only": only = args[++i].Split(',').Select(x => int.Parse(x, CultureInfo.InvariantCulture)).ToHashSet(); speed = false; break;
                case "--locate-timeout": timeoutSeconds = double.Parse(args[++i], CultureInfo.InvariantCulture); break;
                default:
                    Console.Error.WriteLine($"accuracy: unknown argument '{args[i]}'; use [--cases N] [--out FILE] [--seed S] [--threads T] [--no-speed] [--native FILE] [--loss-scale F] [--locate-timeout S]");
                    return 2;
            }
        }
        var all = new List<AccuracyCase>();
        for (int i = 0; i < cases; i++)
            all.Add(RunGenerator.Random(i, seed + i, IsNgspice(i) ? TraceSource.Ngspice : TraceSource.Model));
        int closePairs = Math.Max(10, cases / 6), nothing = Math.Max(5, cases / 12);
        for (int i = 0; i < closePairs; i++) all.Add(RunGenerator.ClosePair(10_000 + i, seed + 10_000 + i));
        for (int i = 0; i < nothing; i++) all.Add(RunGenerator.NothingThere(20_000 + i, seed + 20_000 + i, noiseOnly: false));
        for (int i = 0; i < nothing; i++) all.Add(RunGenerator.NothingThere(30_000 + i, seed + 30_000 + i, noiseOnly: true));
        for (int i = 0; i < nothing; i++) all.Add(RunGenerator.MatchedEnd(40_000 + i, seed + 40_000 + i));
        if (only is not null) return CaseDiagnosis.Run(all.Where(c => only.Contains(c.Index)).ToList(), timeoutSeconds, lossScale);

        Console.WriteLine($"accuracy benchmark: {cases} random runs ({all.Count(c => c.Source == TraceSource.Ngspice)} by ngspice), " +
            $"{closePairs} close-pair, {nothing} matched-line and {nothing} noise-only traces; seed {seed}; {threads} thread(s)" +
            (lossScale == 1 ? "" : lossScale == 0 ? "; NO LOSS told to locate (VF and Z0 only)" : $"; loss told to locate ×{lossScale} of the run's"));
        var watch = Stopwatch.StartNew();
        long runsBefore = Interlocked.Read(ref RunModel.SimulationCount);
        var results = new ConcurrentBag<CaseResult>();
        int done = 0;
        // ngspice cases first: they are the slowest and run as separate processes.
        Parallel.ForEach(all.OrderBy(c => c.Source == TraceSource.Ngspice ? 0 : 1).ThenBy(c => c.Index),
            new ParallelOptions { MaxDegreeOfParallelism = threads }, c =>
            {
                results.Add(RunCase(c, timeoutSeconds, lossScale));
                int k = Interlocked.Increment(ref done);
                if (k % 50 == 0) Console.Error.WriteLine($"  {k}/{all.Count} cases, {watch.Elapsed.TotalSeconds:0} s");
            });
        var ordered = results.OrderBy(r => r.Case.Index).ToList();
        long forwardRuns = Interlocked.Read(ref RunModel.SimulationCount) - runsBefore;
        // The model runs are the cost of locate that does not depend on how busy the machine is.
        Console.WriteLine($"cases run in {watch.Elapsed.TotalSeconds:0.#} s; {forwardRuns} forward-model runs inside locate ({forwardRuns / (double)all.Count:0} per trace)");

        (IReadOnlyList<LocateSpeed.TraceSpeed> Traces, double AllProcessSeconds, double? AllNativeSeconds)? speedResult = null;
        if (speed)
        {
            string? cli = LocateSpeed.FindCli();
            if (cli is null) Console.WriteLine("speed: cablefault.dll not found beside the benchmark; build it with -c Release");
            else speedResult = LocateSpeed.Measure(cli, native);
        }

        Console.WriteLine(Summary.Render(ordered, speedResult, Commit()));
        using (var writer = new StreamWriter(output, false, new UTF8Encoding(false)))
            CsvOutput.Write(ordered, writer);
        Console.WriteLine($"per-event rows written to {Path.GetFullPath(output)}");
        return 0;
    }

    /// <summary>Every 4th block of 10 cases goes to ngspice: a block holds every featured kind once (case i features kind
    /// i mod 10), so ngspice sees every kind; 240 cases give 60 ngspice runs, 200 give 50.</summary>
    private static bool IsNgspice(int index) => index / 10 % 4 == 0;

    /// <summary>The loss locate is told: the run's own, every coefficient times <paramref name="scale"/> (a catalogue value
    /// that is off), or none when the scale is 0 (only VF and Z₀ given, as from --vf and --z0; locate then estimates it).</summary>
    internal static CableLossModel? StatedLoss(CableLossModel? loss, double scale) =>
        scale == 1 || loss is null ? loss
        : scale == 0 ? null
        : new CableLossModel(loss.SkinLossNepersPerMeterPerRootHertz * scale, loss.DielectricLossNepersPerMeterPerHertz * scale,
            loss.DcResistanceOhmsPerMeter * scale);

    private static CaseResult RunCase(AccuracyCase c, double timeoutSeconds, double lossScale)
    {
        using var cancel = new CancellationTokenSource(TimeSpan.FromSeconds(timeoutSeconds));
        var trace = TraceMaker.Make(c);
        var naive = NaiveLocator.Locate(trace, c.VelocityFactor).Select(d => new FoundEvent(d, null, double.NaN)).ToList();
        var naiveScore = Scoring.Score(c, naive);
        var options = new LocateOptions
        {
            VelocityFactor = c.VelocityFactor, ImpedanceOhms = c.ImpedanceOhms, SourceImpedanceOhms = c.ImpedanceOhms,
            Loss = StatedLoss(c.Loss, lossScale), EstimateLoss = lossScale == 0, CancellationToken = cancel.Token,
        };
        var watch = Stopwatch.StartNew();
        try
        {
            var result = Locator.Locate(trace, options);
            double seconds = watch.Elapsed.TotalSeconds;
            var found = result.Events.Select(e => new FoundEvent(e.DistanceMeters, e.Kind, e.Confidence)).ToList();
            return new CaseResult(c, Scoring.Score(c, found), naiveScore, seconds, null, null);
        }
        catch (InputException e)
        {
            return new CaseResult(c, Scoring.Score(c, []), naiveScore, watch.Elapsed.TotalSeconds, e.Message, null);
        }
        catch (OperationCanceledException)
        {
            return new CaseResult(c, Scoring.Score(c, []), naiveScore, watch.Elapsed.TotalSeconds, null,
                CaseResult.TimedOut + F($" after {timeoutSeconds:0.#} s"));
        }
        catch (Exception e) when (e is not OutOfMemoryException)
        {
            return new CaseResult(c, Scoring.Score(c, []), naiveScore, watch.Elapsed.TotalSeconds, null, e.GetType().Name + ": " + e.Message);
        }
    }

    private static string Commit()
    {
        try
        {
            var dir = new DirectoryInfo(AppContext.BaseDirectory);
            while (dir is not null && !File.Exists(Path.Combine(dir.FullName, "CableFault.sln"))) dir = dir.Parent;
            if (dir is null) return "unknown";
            var info = new ProcessStartInfo("git", ["log", "-1", "--format=%h %cd", "--date=iso"])
            {
                RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false, WorkingDirectory = dir.FullName,
            };
            using var git = Process.Start(info)!;
            string text = git.StandardOutput.ReadToEnd().Trim();
            git.WaitForExit();
            return git.ExitCode == 0 ? text : "unknown";
        }
        catch (InvalidOperationException)
        {
            return "unknown";
        }
        catch (System.ComponentModel.Win32Exception)
        {
            return "unknown";
        }
    }

    private static string F(FormattableString s) => s.ToString(CultureInfo.InvariantCulture);
}
