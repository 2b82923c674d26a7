using System.Numerics;
using CableFault.Cables;
using CableFault.Networks;
using CableFault.Simulation;
using static CableFault.Tests.Physics.PhysicsFixtures;

namespace CableFault.Tests.Physics;

/// <summary>
/// Input impedance of a single line against the textbook closed forms (Pozar, <i>Microwave Engineering</i>, 4th ed.,
/// §2.3 eq. 2.44 and §2.4): Z_in = Z₀ (Z_L + j Z₀ tan βl)/(Z₀ + j Z_L tan βl); at βl = π/2 (quarter wave) this
/// becomes Z₀²/Z_L, at βl = π (half wave) Z_L.
/// </summary>
public sealed class InputImpedanceClosedFormTests
{
    /// <summary>Pure double arithmetic on a handful of operations: agreement to 1e-9 relative is ample and still catches
    /// any wrong term (a wrong sign or factor changes the result at order one).</summary>
    private const double RelativeTolerance = 1e-9;

    public static TheoryData<double, double, double, double, double> Loads => new()
    {
        // Z0, VF, length m, load R, load C (0 = plain resistor)
        { 50, 0.66, 10, 100, 0 },
        { 50, 0.66, 10, 20, 0 },
        { 75, 0.82, 3.7, 300, 0 },
        { 100, 0.70, 123.4, 47, 0 },
        { 50, 0.66, 10, 100, 5e-12 },
        { 120, 0.6, 0.25, 560, 2e-12 },
    };

    private static Complex LoadImpedance(double r, double c, double f) =>
        c == 0 ? r : r / new Complex(1, 2 * Math.PI * f * r * c);

    private static CableNetwork Line(double z0, double vf, double length, double r, double c) =>
        Run(Segment(length, Lossless(z0, vf)), c == 0 ? RunEnd.Resistor(r) : new RunEnd(EndKind.ResistorParallelCapacitor, r, c));

    [Theory]
    [MemberData(nameof(Loads))]
    public void QuarterWaveLineInvertsTheLoad(double z0, double vf, double length, double r, double c)
    {
        // βl = π/2 when l = λ/4, i.e. f = v / (4 l).
        double f = vf * C0 / (4 * length);
        Complex expected = z0 * z0 / LoadImpedance(r, c, f);
        Complex actual = ForwardModel.InputImpedanceOhms(Line(z0, vf, length, r, c), f);
        Assert.True(Complex.Abs(actual - expected) <= RelativeTolerance * Complex.Abs(expected), $"Z_in = {actual}, expected {expected}");
    }

    [Theory]
    [MemberData(nameof(Loads))]
    public void HalfWaveLineRepeatsTheLoad(double z0, double vf, double length, double r, double c)
    {
        // βl = π when l = λ/2, i.e. f = v / (2 l); also at 3λ/2.
        foreach (double multiple in new[] { 1.0, 3.0 })
        {
            double f = multiple * vf * C0 / (2 * length);
            Complex expected = LoadImpedance(r, c, f);
            Complex actual = ForwardModel.InputImpedanceOhms(Line(z0, vf, length, r, c), f);
            Assert.True(Complex.Abs(actual - expected) <= RelativeTolerance * Complex.Abs(expected), $"Z_in = {actual}, expected {expected} at {f} Hz");
        }
    }

    [Theory]
    [MemberData(nameof(Loads))]
    public void ArbitraryFrequencyMatchesTheTangentFormula(double z0, double vf, double length, double r, double c)
    {
        // Pozar eq. 2.44, written out here independently of the library's ABCD-matrix path.
        foreach (double f in new[] { 1e3, 1.7e6, 33.3e6, 250e6, 1.234e9 })
        {
            double beta = 2 * Math.PI * f / (vf * C0);
            Complex zl = LoadImpedance(r, c, f), jt = new Complex(0, Math.Tan(beta * length));
            Complex expected = z0 * (zl + z0 * jt) / (z0 + zl * jt);
            Complex actual = ForwardModel.InputImpedanceOhms(Line(z0, vf, length, r, c), f);
            Assert.True(Complex.Abs(actual - expected) <= 1e-7 * Complex.Abs(expected), $"Z_in = {actual}, expected {expected} at {f} Hz");
        }
    }

    [Fact]
    public void QuarterWaveOpenLooksLikeAShortAndShortLikeAnOpen()
    {
        // Z₀²/Z_L with Z_L → ∞ gives 0 and with Z_L → 0 gives ∞ (Pozar §2.4): Γ_in = −Γ_L.
        const double length = 7.5, vf = 0.66;
        double f = vf * C0 / (4 * length);
        Complex gOpen = ForwardModel.ReflectionCoefficient(Run(Segment(length, Lossless()), RunEnd.Open), f, 50);
        Complex gShort = ForwardModel.ReflectionCoefficient(Run(Segment(length, Lossless()), RunEnd.Short), f, 50);
        Assert.True(Complex.Abs(gOpen - (-1)) < 1e-9, $"Γ(open, λ/4) = {gOpen}");
        Assert.True(Complex.Abs(gShort - 1) < 1e-9, $"Γ(short, λ/4) = {gShort}");
    }

    [Theory]
    [InlineData(0.0, 0.0, 0.05)]      // DC resistance only (an RLC line)
    [InlineData(1.3e-6, 0.0, 0.0)]    // skin effect only
    [InlineData(1.3e-6, 2e-11, 0.02)] // all three mechanisms
    public void LossyLineMatchesTheHyperbolicFormula(double kc, double kd, double rdc)
    {
        // Z_in = Z_c (Z_L + Z_c tanh γl)/(Z_c + Z_L tanh γl) (Pozar §2.3 eq. 2.91 form; DESIGN.md §2), with γ and Z_c
        // taken from the medium's own per-metre description, so this checks the network solver's segment algebra.
        var medium = new CableMedium(50, 0.66, new CableLossModel(kc, kd, rdc));
        const double length = 85, zl = 130;
        var network = Run(Segment(length, medium), RunEnd.Resistor(zl));
        foreach (double f in new[] { 1e3, 1e5, 3.3e6, 47e6, 400e6 })
        {
            Complex gamma = medium.PropagationConstantPerMeter(f), zc = medium.CharacteristicImpedanceOhms(f);
            Complex th = Complex.Tanh(gamma * length);
            Complex expected = zc * (zl + zc * th) / (zc + zl * th);
            Complex actual = ForwardModel.InputImpedanceOhms(network, f);
            Assert.True(Complex.Abs(actual - expected) <= 1e-8 * Complex.Abs(expected), $"Z_in = {actual}, expected {expected} at {f} Hz");
        }
    }
}
