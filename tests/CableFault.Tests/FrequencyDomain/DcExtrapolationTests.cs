using CableFault.Cables;
using CableFault.FrequencyDomain;
using CableFault.Networks;
using CableFault.Simulation;

namespace CableFault.Tests.FrequencyDomain;

/// <summary>
/// Γ(0) of a sweep that starts one step above DC is extrapolated. On a run with several strong echoes (and endless
/// internal re-reflections, since it is lossless and ends open) the estimate must still land on the true DC value.
/// </summary>
public class DcExtrapolationTests
{
    /// <summary>A lossless run ending in an open has Γ(0) = +1 exactly (at DC the line is a wire to an open circuit).</summary>
    private const double TrueDcReflection = 1.0;

    /// <summary>1 % of full scale: a 1 % DC error is a 10 mV ramp across the record, visible against 1 mV noise.</summary>
    private const double ToleranceOfFullScale = 0.01;

    [Fact]
    public void ExtrapolationFindsTheDcValueOfAMultiEchoRun()
    {
        var coax = new CableMedium(50, 0.66);
        var network = new CableNetwork(new NetworkBranch(
            new CableSegment(12, coax), new SeriesInductor(15e-9), new CableSegment(15, coax),
            new CableSegment(0.8, new CableMedium(30, 0.6)), new CableSegment(14, coax), RunEnd.Open));
        const int points = 2000;
        const double stepHz = 1e6;
        var frequencies = Enumerable.Range(1, points).Select(k => k * stepHz).ToArray();
        var data = new ReflectionData(frequencies, ForwardModel.ReflectionCoefficients(network, frequencies, 50), 50);

        var result = ReflectionToStepConverter.Convert(data, new FrequencyToTimeOptions(), "multi-echo.s1p");

        Assert.Equal(TrueDcReflection, result.DcReflection!.Value, ToleranceOfFullScale);
        var trace = result.Trace;
        // The settled level after the open is 1 + Γ(0) = 2 V (DESIGN.md §2, Z_s = Z0, 1 V incident).
        int late = trace.Length * 3 / 4;
        Assert.Equal(2.0, trace.SamplesVolts[late], 0.02);
    }
}
