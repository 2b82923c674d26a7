using System.Diagnostics;
using System.Globalization;
using System.Text;
using CableFault.Cables;
using CableFault.Networks;
using CableFault.Traces;
using Trace = CableFault.Traces.Trace;
using MathNet.Numerics.Interpolation;

namespace CableFault.Benchmarks.Accuracy;

/// <summary>
/// A case simulated by ngspice (<c>ngspice -b</c>; Debian package ngspice), written the way the reference netlists in
/// tests/CableFault.Tests/Reference/Ngspice are: an error-function edge through Z_s (erf by Abramowitz &amp; Stegun,
/// eq. 7.1.26), T elements for lossless lines, LTRA with R per metre for lossy ones (the lossy cases carry only
/// CableLossModel.DcResistanceOhmsPerMeter, so both sides solve Z′ = R + sL, Y′ = sC), the port voltage written with
/// <c>wrdata</c> and interpolated linearly onto the case's sample grid.
/// </summary>
public static class NgspiceTraces
{
    /// <summary>Resistance standing for an open end, Ω (as in the reference netlists).</summary>
    private const double OpenOhms = 1e12;

    public static Trace Simulate(AccuracyCase c, string workFolder)
    {
        string folder = Path.Combine(workFolder, $"cf-acc-{c.Index}-{Guid.NewGuid():N}");
        Directory.CreateDirectory(folder);
        try
        {
            File.WriteAllText(Path.Combine(folder, "case.cir"), Netlist(c));
            var info = new ProcessStartInfo("ngspice", ["-b", "case.cir"])
            {
                WorkingDirectory = folder, RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false,
            };
            using var process = Process.Start(info) ?? throw new InvalidOperationException("could not start ngspice");
            var stdout = process.StandardOutput.ReadToEndAsync();
            var stderr = process.StandardError.ReadToEndAsync();
            if (!process.WaitForExit(TimeSpan.FromMinutes(5)))
            {
                process.Kill(entireProcessTree: true);
                throw new TimeoutException($"ngspice did not finish case {c.Index}");
            }
            process.WaitForExit();
            string output = Path.Combine(folder, "port.txt");
            if (process.ExitCode != 0 || !File.Exists(output))
                throw new InvalidOperationException($"ngspice failed on case {c.Index} (exit {process.ExitCode}): {stderr.Result}");
            var (times, volts) = CableFault.Tests.Reference.Ngspice.NgspiceRunner.Parse(File.ReadLines(output));
            var spline = LinearSpline.InterpolateSorted(times, volts);
            // ngspice puts the edge's 50 % point at t = pre; the trace starts at −pre with the 50 % point at 0.
            var samples = new double[c.SampleCount];
            for (int i = 0; i < samples.Length; i++) samples[i] = spline.Interpolate(i * c.SampleIntervalSeconds);
            return new Trace(-c.PreTriggerSeconds, c.SampleIntervalSeconds, samples);
        }
        finally
        {
            try { Directory.Delete(folder, recursive: true); } catch (IOException) { }
        }
    }

    /// <summary>The netlist of a case.</summary>
    public static string Netlist(AccuracyCase c)
    {
        var lines = new List<string>();
        var models = new List<string>();
        int counter = 0;
        string NewNode() => $"n{++counter}";
        bool ltra = c.IsLossy;
        if (c.Loss is { } loss && (loss.SkinLossNepersPerMeterPerRootHertz != 0 || loss.DielectricLossNepersPerMeterPerHertz != 0))
            throw new ArgumentException("ngspice cases carry DC resistance only (LTRA's R per metre)");

        void Emit(NetworkBranch branch, string node)
        {
            double z = c.ImpedanceOhms;
            foreach (var element in branch.Elements)
            {
                switch (element)
                {
                    case CableSegment s:
                    {
                        string next = NewNode();
                        z = s.Medium.ImpedanceOhms;
                        if (s.Medium.IsLossless)
                            lines.Add(F($"T{counter} {node} 0 {next} 0 Z0={z:R} TD={s.DelaySeconds:R}"));
                        else
                        {
                            lines.Add(F($"O{counter} {node} 0 {next} 0 lmod{counter}"));
                            models.Add(F($".model lmod{counter} ltra r={s.Medium.Loss.DcResistanceOhmsPerMeter:R} l={s.Medium.InductanceHenriesPerMeter:R} g=0 c={s.Medium.CapacitanceFaradsPerMeter:R} len={s.LengthMeters:R}"));
                        }
                        node = next;
                        break;
                    }
                    case ShuntCapacitor sc: lines.Add(F($"C{++counter} {node} 0 {sc.CapacitanceFarads:R}")); break;
                    case ShuntResistor sr: lines.Add(F($"R{++counter} {node} 0 {sr.ResistanceOhms:R}")); break;
                    case SeriesInductor sl:
                    {
                        string next = NewNode();
                        lines.Add(F($"L{counter} {node} {next} {sl.InductanceHenries:R}"));
                        node = next;
                        break;
                    }
                    case SeriesResistor r:
                    {
                        string next = NewNode();
                        lines.Add(F($"R{counter} {node} {next} {r.ResistanceOhms:R}"));
                        node = next;
                        break;
                    }
                    case Junction j:
                        foreach (var b in j.Branches) Emit(b, node);
                        break;
                    case RunEnd e:
                        lines.Add(e.Kind switch
                        {
                            EndKind.Open => F($"R{++counter} {node} 0 {OpenOhms:R}"),
                            // A zero-volt source is an exact short.
                            EndKind.Short => F($"V{++counter} {node} 0 0"),
                            EndKind.Matched => F($"R{++counter} {node} 0 {z:R}"),
                            EndKind.Resistor => F($"R{++counter} {node} 0 {e.ResistanceOhms:R}"),
                            _ => throw new ArgumentException($"end {e.Kind} is not in the ngspice cases"),
                        });
                        break;
                    default:
                        throw new ArgumentException($"element {element.GetType().Name} is not in the ngspice cases");
                }
            }
        }
        Emit(c.Network.Run, "port");

        double pre = c.PreTriggerSeconds;
        double tstop = (c.SampleCount + 2) * c.SampleIntervalSeconds;
        double sigma = c.RiseSeconds / 2.5631031310892007;
        // Time step σ/10 resolves the edge (as the reference netlists); LTRA's convolution is quadratic in steps, σ/5 there.
        double tmax = ltra ? sigma / 5 : sigma / 10;
        var text = new StringBuilder();
        text.AppendLine(F($"* CableFault accuracy benchmark case {c.Index}: {c.Description}"));
        text.AppendLine(F($".param amp=1 pre={pre:R} sig={sigma:R}"));
        text.AppendLine(".func aspoly(t) {t*(0.254829592+t*(-0.284496736+t*(1.421413741+t*(-1.453152027+t*1.061405429))))}");
        text.AppendLine(".func erfpos(x) {1-aspoly(1/(1+0.3275911*x))*exp(-x*x)}");
        text.AppendLine(".func erfa(x) {sgn(x)*erfpos(abs(x))}");
        text.AppendLine("Bsrc src 0 V = {amp}*(1+erfa((time-{pre})/({sig}*sqrt(2))))");
        text.AppendLine(F($"Rs src port {c.ImpedanceOhms:R}"));
        foreach (string line in lines) text.AppendLine(line);
        foreach (string model in models) text.AppendLine(model);
        text.AppendLine(F($".tran {tmax:R} {tstop:R} 0 {tmax:R}"));
        text.AppendLine(".control");
        text.AppendLine("set wr_singlescale");
        text.AppendLine("set wr_vecnames");
        text.AppendLine("option numdgt=12");
        text.AppendLine("run");
        text.AppendLine("wrdata port.txt v(port)");
        text.AppendLine("quit");
        text.AppendLine(".endc");
        text.AppendLine(".end");
        return text.ToString();
    }

    private static string F(FormattableString s) => s.ToString(CultureInfo.InvariantCulture);
}
