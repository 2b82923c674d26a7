using CableFault.Traces;
using MathNet.Numerics.Interpolation;

namespace CableFault.Tests.Reference.Ngspice;

/// <summary>
/// A netlist written by a test rather than kept beside <see cref="NgspiceComparisonTests"/>: its circuit lines get the
/// same transient control block as the kept ones, it is run through <see cref="NgspiceRunner"/> from a temporary file,
/// and ngspice's port voltage is sampled onto a trace's grid.
/// </summary>
internal static class GeneratedNetlist
{
    /// <summary>The kept netlists' stimulus, for a netlist that defines <c>pre</c> and <c>sig</c>: the error-function
    /// edge V_s(t) = 1 + erf((t − pre)/(σ√2)) into node <c>src</c>, erf by Abramowitz &amp; Stegun, <i>Handbook of
    /// Mathematical Functions</i> (1964), eq. 7.1.26 (|error| ≤ 1.5e-7), extended by odd symmetry.</summary>
    internal const string ErfEdge = """
        .func aspoly(t) {t*(0.254829592+t*(-0.284496736+t*(1.421413741+t*(-1.453152027+t*1.061405429))))}
        .func erfpos(x) {1-aspoly(1/(1+0.3275911*x))*exp(-x*x)}
        .func erfa(x) {sgn(x)*erfpos(abs(x))}
        Bsrc src 0 V = 1*(1+erfa((time-{pre})/({sig}*sqrt(2))))
        """;

    /// <summary>What every netlist ends with: write v(port) to port.txt with 12 digits and quit.</summary>
    private const string PortOutput = """
        .control
        set wr_singlescale
        set wr_vecnames
        option numdgt=12
        run
        wrdata port.txt v(port)
        quit
        .endc
        .end
        """;

    /// <summary>Runs <paramref name="circuit"/> (title, parameters, elements and the .tran line) and returns the port
    /// voltage as a trace of <paramref name="sampleCount"/> samples <paramref name="sampleIntervalSeconds"/> apart that
    /// starts at −<paramref name="preTriggerSeconds"/>: trace time t is ngspice time t + pre, where the netlist puts its
    /// edge's midpoint (as in NgspiceComparisonTests), linearly interpolated between ngspice's own time points.</summary>
    internal static Trace Run(string circuit, string name, double preTriggerSeconds, double sampleIntervalSeconds, int sampleCount)
    {
        string path = Path.Combine(Path.GetTempPath(), $"cablefault-{name}-{Guid.NewGuid():N}.cir");
        File.WriteAllText(path, circuit.TrimEnd() + "\n" + PortOutput + "\n");
        try
        {
            var (times, volts) = NgspiceRunner.Run(path);
            var spice = LinearSpline.InterpolateSorted(times, volts);
            var samples = Enumerable.Range(0, sampleCount).Select(i => spice.Interpolate(i * sampleIntervalSeconds)).ToArray();
            return new Trace(-preTriggerSeconds, sampleIntervalSeconds, samples);
        }
        finally
        {
            File.Delete(path);
        }
    }
}
