using CableFault.Comparison;

namespace CableFault.Tests.Comparison;

/// <summary><see cref="PairImpedance.Estimate"/> against the port divider V_i = V_s·Z/(Z_s + Z) (DESIGN.md §2).</summary>
public class PairImpedanceTests
{
    [Theory]
    [InlineData(100, 100, 103)]
    [InlineData(100, 100, 95)]
    [InlineData(100, 50, 120)]
    [InlineData(50, 75, 48)]
    public void RecoversTheImpedanceFromTheStepRatio(double referenceOhms, double sourceOhms, double actualOhms)
    {
        // Forward: the divider gives both steps for one source voltage; the estimate inverts their ratio.
        double stepReference = referenceOhms / (sourceOhms + referenceOhms);
        double stepActual = actualOhms / (sourceOhms + actualOhms);
        double? estimate = PairImpedance.Estimate(stepActual / stepReference, referenceOhms, sourceOhms);
        Assert.NotNull(estimate);
        Assert.Equal(actualOhms, estimate!.Value, 1e-9 * actualOhms);
    }

    [Theory]
    [InlineData(0)]
    [InlineData(-1)]
    [InlineData(2.0)] // r ≥ 1 + Zs/Zref: no finite impedance gives a step that tall
    [InlineData(double.NaN)]
    public void ImpossibleRatiosGiveNoEstimate(double ratio) => Assert.Null(PairImpedance.Estimate(ratio, 100, 100));
}
