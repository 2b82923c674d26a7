using CableFault.Cables;
using CableFault.Networks;
using CableFault.Simulation;
using static CableFault.Tests.Physics.PhysicsFixtures;

namespace CableFault.Tests.Physics;

/// <summary>The lossy medium: attenuation against the data-sheet figures it is built from, and causality.</summary>
public sealed class LossyMediumTests
{
    /// <summary>dB per neper, 20/ln 10 (definition of the neper and decibel, ISO 80000-3).</summary>
    private static readonly double DecibelsPerNeper = 20 / Math.Log(10);

    /// <summary>
    /// Base tolerance: the constant-loss-tangent dielectric moves the effective C by (f/100 MHz)^(−n), n ≈ 2tanδ/π ≲ 1e-3
    /// (≲ 0.3 % over these bands); 0.5 % covers it. <see cref="AttenuationTolerance"/> adds the skin term's own share.
    /// A wrong factor (dB vs Np, 2Z₀, √π) would be off by far more.
    /// </summary>
    private const double AttenuationRelativeTolerance = 0.005;

    /// <summary>
    /// Data sheets give α; the model sets R = 2Z₀k_c√f and lets the skin term carry an equal internal reactance,
    /// Z′ = jωL + R(1 + j). Expanding γ = jω√(LC)·√(1 + x(1 − j)), x = R/ωL: Re γ = (R/2Z₀)(1 − x/2 + O(x²)), x/2 ≈ α/β.
    /// So Re γ sits below the data-sheet figure by the fraction α/β (≈ 1.5 % for RG-58-class coax at 10 MHz, more for
    /// thin pairs at low frequency); the tolerance allows that share explicitly.
    /// </summary>
    private static double AttenuationTolerance(CableMedium medium, double f, double datasheetDbPer100m)
    {
        double alpha = datasheetDbPer100m / DecibelsPerNeper / 100, beta = 2 * Math.PI * f / medium.VelocityMetersPerSecond;
        return AttenuationRelativeTolerance + alpha / beta;
    }

    /// <summary>Step-relative size below which the response before the first echo counts as zero (the brief's 1e-6).</summary>
    private const double CausalityTolerance = 1e-6;

    /// <summary>
    /// A generic 50 Ω solid-PE coax of the RG-58 class: attenuation in dB/100 m. Typical catalogue values, from memory;
    /// the test builds the model from the first and last points and checks all of them, so the middle ones test how well
    /// the two-term √f + f law describes a real cable (hence the looser tolerance for those).
    /// </summary>
    private static readonly (double Hz, double DbPer100m)[] GenericCoaxDatasheetPoints =
    {
        (10e6, 4.6), (50e6, 10.8), (100e6, 15.7), (400e6, 33.5), (1000e6, 56.0),
    };

    /// <summary>Middle data-sheet points versus a two-term fit through the ends: real data scatter by several percent
    /// around √f + f (common practice to quote ±10 %).</summary>
    private const double DatasheetInteriorTolerance = 0.10;

    private static double AttenuationDbPer100m(CableMedium medium, double f) =>
        medium.PropagationConstantPerMeter(f).Real * DecibelsPerNeper * 100;

    [Fact]
    public void AttenuationReproducesTheTwoDatasheetPointsAndFollowsTheTwoTermLaw()
    {
        // Synthetic data sheet: A(f) = a·√(f/MHz) + b·f/MHz dB/100 m with a = 0.4, b = 0.004 (a solid-PE coax shape).
        static double Datasheet(double f) => 0.4 * Math.Sqrt(f / 1e6) + 0.004 * f / 1e6;
        var loss = CableLossModel.FromDatasheet(Datasheet(10e6), 10e6, Datasheet(1e9), 1e9);
        var medium = new CableMedium(50, 0.66, loss);
        foreach (double f in new[] { 1e6, 10e6, 30e6, 100e6, 300e6, 1e9, 2e9 })
        {
            double expected = Datasheet(f), actual = AttenuationDbPer100m(medium, f);
            Assert.True(Math.Abs(actual - expected) < AttenuationTolerance(medium, f, expected) * expected,
                $"{f:E2} Hz: {actual:F3} dB/100 m from γ, data sheet {expected:F3}");
        }
    }

    [Fact]
    public void AttenuationFromOnePointGrowsAsRootF()
    {
        var medium = new CableMedium(75, 0.82, CableLossModel.FromDatasheet(6.5, 100e6));
        foreach (double f in new[] { 5e6, 100e6, 800e6 })
        {
            double expected = 6.5 * Math.Sqrt(f / 100e6), actual = AttenuationDbPer100m(medium, f);
            Assert.True(Math.Abs(actual - expected) < AttenuationTolerance(medium, f, expected) * expected, $"{f:E2} Hz: {actual:F3} vs {expected:F3}");
        }
    }

    [Fact]
    public void GenericCoaxMatchesItsDatasheetPoints()
    {
        var (f1, a1) = GenericCoaxDatasheetPoints[0];
        var (f2, a2) = GenericCoaxDatasheetPoints[^1];
        var medium = new CableMedium(50, 0.66, CableLossModel.FromDatasheet(a1, f1, a2, f2));
        foreach (var (f, a) in GenericCoaxDatasheetPoints)
        {
            double actual = AttenuationDbPer100m(medium, f);
            double tolerance = f == f1 || f == f2 ? AttenuationTolerance(medium, f, a) : DatasheetInteriorTolerance;
            Assert.True(Math.Abs(actual - a) < tolerance * a, $"{f:E2} Hz: {actual:F2} dB/100 m, data sheet {a:F2}");
        }
    }

    [Fact]
    public void DcResistanceAloneGivesRover2Z0AtHighFrequency()
    {
        // An RLC line with ωL ≫ R: α → R/(2Z₀) (Pozar §2.7 eq. 2.85a with G = 0).
        const double r = 0.2, z0 = 50;
        var medium = new CableMedium(z0, 0.66, new CableLossModel(0, 0, r));
        double alpha = medium.PropagationConstantPerMeter(1e9).Real;
        Assert.True(Math.Abs(alpha - r / (2 * z0)) < 1e-4 * r / (2 * z0), $"α = {alpha} Np/m");
    }

    [Theory]
    [InlineData(1.3e-6, 0.0, 0.0, 100.0)]
    [InlineData(5e-6, 0.0, 0.05, 60.0)]
    [InlineData(2e-7, 0.0, 0.3, 250.0)]
    [InlineData(1.3e-6, 2e-11, 0.0, 100.0)]
    [InlineData(2e-7, 1e-10, 0.3, 250.0)]
    public void LossyEchoIsZeroBeforeTheFirstArrival(double kc, double kd, double rdc, double length)
    {
        // The far-end echo is (open trace − matched trace): both share whatever the port sees of the lossy line's own
        // frequency-dependent Z_c, and differ only by what comes back from the far end. A causal medium returns nothing
        // before the first arrival 2l/v_front. Skin and DC loss vanish relative to sL as f → ∞, so v_front = VF·c exactly.
        // The constant-loss-tangent dielectric has C_eff = C·(f/f_ref)^(−n), so frequencies above f_ref = 100 MHz run
        // slightly faster than VF·c (Kramers–Kronig: loss brings dispersion); the front is then taken at the phase
        // velocity of the highest frequency the edge carries (|E| = 1e-9 at ω = 6.44/σ). The error-function edge itself
        // reaches 1e-9 of its height 6σ before its midpoint, so the check stops there.
        var medium = new CableMedium(50, 0.66, new CableLossModel(kc, kd, rdc));
        const double rise = 1e-9;
        double sigma = rise / StimulusSpectrum.GaussianRiseInSigmas;
        double fTop = 6.44 / sigma / (2 * Math.PI);
        double vFront = kd == 0
            ? medium.VelocityMetersPerSecond
            : Math.Max(medium.VelocityMetersPerSecond, 2 * Math.PI * fTop / medium.PropagationConstantPerMeter(fTop).Imaginary);
        double arrival = 2 * length / vFront;
        var settings = Settings(rise, 2 * arrival);
        var open = ForwardModel.Simulate(Run(Segment(length, medium), RunEnd.Open), settings);
        var matched = ForwardModel.Simulate(Run(Segment(length, medium), RunEnd.Matched), settings);
        double worstBefore = 0, largestAfter = 0;
        for (int i = 0; i < open.Length; i++)
        {
            double echo = open.SamplesVolts[i] - matched.SamplesVolts[i], t = open.TimeAt(i);
            if (t < arrival - 6 * sigma) worstBefore = Math.Max(worstBefore, Math.Abs(echo));
            else largestAfter = Math.Max(largestAfter, Math.Abs(echo));
        }
        double step = settings.IncidentAmplitudeVolts;
        Assert.True(worstBefore < CausalityTolerance * step, $"echo before the first arrival reaches {worstBefore:E3} V");
        Assert.True(largestAfter > 0.1 * step, $"the echo itself is only {largestAfter:E3} V: the check would be empty");
    }
}
