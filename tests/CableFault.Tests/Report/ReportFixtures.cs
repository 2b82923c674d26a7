using AngleSharp.Dom;
using AngleSharp.Html.Parser;
using CableFault.Analysis;
using CableFault.Cables;
using CableFault.Comparison;
using CableFault.Networks;
using CableFault.Reporting;
using CableFault.Reporting.Html;
using CableFault.Simulation;
using CableFault.Traces;

namespace CableFault.Tests.Report;

/// <summary>
/// A run with known answers, simulated by the forward model: 25 m of 50 Ω line, a 3 m wet section at 35 Ω (an impedance
/// drop at 25 m, a rise back at 28 m), 12 m more of 50 Ω and an open end at 40 m. The truth is the network built here,
/// not anything the analysis or the renderer computes.
/// </summary>
internal static class ReportFixtures
{
    public const double VelocityFactor = 0.66;
    public const double DropMeters = 25, RiseMeters = 28, OpenMeters = 40;

    /// <summary>Run ID with markup in it: must show as text.</summary>
    public const string HostileRunId = "<script>alert(1)</script> & \"QB-7\"";

    private static Trace Simulate(bool wetSection, int seed)
    {
        var line = new CableMedium(50, VelocityFactor, null);
        var middle = new CableMedium(wetSection ? 35 : 50, VelocityFactor, null);
        var network = new CableNetwork(new NetworkBranch([
            new CableSegment(DropMeters, line), new CableSegment(RiseMeters - DropMeters, middle),
            new CableSegment(OpenMeters - RiseMeters, line), RunEnd.Open]), "report test run");
        var settings = InstrumentSettings.DefaultFor(network, 1e-9) with { NoiseRmsVolts = 1e-3, NoiseSeed = seed };
        return ForwardModel.Simulate(network, settings)
            .WithMetadata("vf", "0.66").WithMetadata("z0", "50")
            .WithMetadata("site", "Test yard 3").WithMetadata("technician", "A. Tester").WithMetadata("date", "2031-04-05T09:15")
            .WithMetadata("run", HostileRunId);
    }

    private static readonly Lazy<Trace> LazyTrace = new(() => Simulate(wetSection: true, seed: 7));

    /// <summary>The same run before the water got in: 40 m of sound 50 Ω line into the open end.</summary>
    private static readonly Lazy<Trace> LazyBaseline = new(() => Simulate(wetSection: false, seed: 8));

    private static readonly Lazy<CompareResult> LazyComparison = new(() =>
        RepairCheck.Compare(LazyBaseline.Value, Trace, new RepairCheckOptions { VelocityFactor = VelocityFactor, ImpedanceOhms = 50 }));

    /// <summary>The repair check of the wet run against its sound baseline.</summary>
    public static CompareResult Comparison => LazyComparison.Value;

    private static readonly Lazy<(LocateResult Result, CableSettings Settings)> LazyLocated = new(() =>
    {
        var settings = CableSettings.Resolve(Trace, null, null, null, null, CableLibrary.BuiltIn);
        return (Locator.Locate(Trace, settings.ToLocateOptions()), settings);
    });

    public static Trace Trace => LazyTrace.Value;
    public static LocateResult Result => LazyLocated.Value.Result;
    public static CableSettings Settings => LazyLocated.Value.Settings;

    public static ReportInput Input(DistanceUnit unit, JobSheet? job = null, RepairCheckPart? repair = null) => new(
        (job ?? JobSheet.Empty).Over(JobSheet.FromTrace(Trace)), "wet-section.csv", Result, Settings, unit,
        new DateTimeOffset(2031, 4, 5, 10, 0, 0, TimeSpan.Zero), "0.1.0-test", repair);

    public static IDocument Parse(string html) => new HtmlParser().ParseDocument(html);
}
