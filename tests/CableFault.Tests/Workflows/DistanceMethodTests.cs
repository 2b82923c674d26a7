using CableFault.Analysis;
using CableFault.Cables;
using CableFault.Reporting;
using CableFault.Reporting.Locate;
using CableFault.Workflows;

namespace CableFault.Tests.Workflows;

/// <summary>The line that says how the distances were found names the workflow, the VF's origin and what was taken off.</summary>
public sealed class DistanceMethodTests
{
    private static readonly CableType Rg213 = CableLibrary.BuiltIn.Get("RG-213");

    [Fact]
    public void TheVfSourceAndTheLeadAreNamed()
    {
        var lead = new LaunchLead(2.0, 0.66);
        var options = lead.Shift(new LocateOptions { VelocityFactor = Rg213.VelocityFactor, VelocityFactorSource = "cable", VelocityFactorRelativeSigma = 0.02 });
        string text = DistanceMethod.Describe(options, Rg213, lead, DistanceUnit.Meters);
        Assert.StartsWith("single-ended, VF 0.660 from cable type RG-213 (±2 %)", text, StringComparison.Ordinal);
        Assert.Contains("launch lead 2.0 m (VF 0.66) removed", text, StringComparison.Ordinal);
        // The lead's own round trip is the whole offset: no other shift is claimed.
        Assert.DoesNotContain("reference plane", text, StringComparison.Ordinal);

        var shifted = options with { TimeZeroOffsetSeconds = options.TimeZeroOffsetSeconds + 1e-9 };
        Assert.Contains("reference plane moved 1 ns", DistanceMethod.Describe(shifted, Rg213, lead, DistanceUnit.Meters), StringComparison.Ordinal);
    }

    [Fact]
    public void AnAssumedVfIsCalledThatAndACalibratedTypeSaysOnWhat()
    {
        var assumed = new LocateOptions { VelocityFactor = 0.66, VelocityFactorSource = "default", VelocityFactorRelativeSigma = 0.10 };
        Assert.Contains("VF not known", DistanceMethod.Describe(assumed, null, null, DistanceUnit.Meters), StringComparison.Ordinal);

        var calibrated = Rg213 with { Designation = "SITE-COAX", Source = "calibrated on the known splice S2 at 12.00 m, VF ± 0.4 % (1 σ), 2026-12-02" };
        var options = new LocateOptions { VelocityFactor = 0.6601, VelocityFactorSource = "cable", VelocityFactorRelativeSigma = 0.02 };
        Assert.Contains("cable type SITE-COAX, calibrated on the known splice S2 at 12.00 m",
            DistanceMethod.Describe(options, calibrated, null, DistanceUnit.Meters), StringComparison.Ordinal);
    }

    [Fact]
    public void BothEndsNeedNoVf() =>
        Assert.Equal("both ends: x = L·t_A/(t_A + t_B) over L = 48.500 m ± 0.100 m (no VF needed)",
            DistanceMethod.BothEnds(48.5, 0.1, DistanceUnit.Meters));
}
