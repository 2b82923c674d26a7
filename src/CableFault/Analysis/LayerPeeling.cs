using System.Numerics;
using System.Runtime.InteropServices;
using CableFault.Cables;
using CableFault.Traces;

namespace CableFault.Analysis;

/// <summary>
/// Impedance profile by discrete layer peeling (inverse scattering): the run is modelled as a stack of thin layers
/// of equal delay, each with its own impedance; the reflection impulse response measured at the port is undone
/// layer by layer, so multiple reflections between earlier boundaries no longer masquerade as impedance changes.
/// </summary>
/// <remarks>
/// <para><b>Model.</b> A Goupillaud layered medium: every layer has the same one-way delay Δt/2, so its round trip is
/// one sample Δt of the (possibly block-averaged) record. Forward and backward waves at the top of layer j are the
/// sequences u_j(n), v_j(n); at the port u_0 = δ(n) (unit incident impulse) and v_0 = r(n), the measured reflection
/// impulse response (the first difference of the step response, i.e. its derivative times Δt).
/// The first sample of the backward wave is the local reflection, k_j = v_j(0) / u_j(0); crossing the interface and
/// the layer gives u_{j+1}(n) = (u_j(n) − k_j v_j(n)) / (1 − k_j²) and v_{j+1}(n) = (v_j(n+1) − k_j u_j(n+1)) / (1 − k_j²)
/// (the divisor keeps u(0) = 1). This is the Schur recursion of A. M. Bruckstein and T. Kailath, "Inverse scattering
/// for discrete transmission-line models", SIAM Review 29(3):359–389, 1987, §2–3. Impedances follow from
/// Z_j = Z_{j−1} (1 + k_j) / (1 − k_j). Cost O(M²) for M layers; the record is block-averaged to at most
/// <see cref="MaximumLayers"/> layers so a 32 768-sample trace peels in a few tens of milliseconds.</para>
/// <para><b>Source mismatch.</b> A source Z_s ≠ Z_0 is treated as a semi-infinite line of impedance Z_s ahead of the
/// port: the port voltage V_s·Z_in/(Z_s + Z_in) equals (V_s/2)(1 + Γ_s(t)) with Γ_s referenced to Z_s (DESIGN.md §2),
/// so the data are normalised by the source's matched amplitude V_s/2 = P (Z_s + Z_0)/(2 Z_0), P being the incident
/// plateau at the port, and the first layer's reflection is (Z_0 − Z_s)/(Z_0 + Z_s). Re-reflections at the source are
/// then ordinary multiple reflections, removed by the peeling.</para>
/// <para><b>Blind zone.</b> During the incident edge (up to <see cref="BlindZoneRiseTimes"/> rise times after time zero)
/// the data hold the stimulus, not the run; the profile there is taken as Z_0.</para>
/// <para><b>Loss (approximation).</b> An echo from distance d travels 2d of lossy line. Skin loss α = k_c√f spreads a
/// step echo into erfc(a / 2√t), a = k_c·2d/√π (Laplace pair of e^(−a√s)), whose 10–90 % time is 31.5·a²; the echo's
/// rise is taken as t_e = √(t_r² + (31.5 a²)²) and its dominant frequency f_e = 0.35 / t_e (the single-pole
/// rise-bandwidth rule, common practice). Each increment r(n) from distance d is divided by the two-way attenuation
/// e^(−2 α(f_e) d), α = k_c√f_e + k_d f_e. Using the echo's own dispersed rise rather than the stimulus rise keeps the
/// correction to what the echo still carries (the stimulus' 0.35/t_r would over-correct a step's settled level many
/// times over on long lossy runs). The gain is capped at <see cref="MaximumLossGain"/>. DC resistance is ignored.</para>
/// </remarks>
public static class LayerPeeling
{
    /// <summary>Largest number of layers peeled (the record is block-averaged beyond this).</summary>
    public const int MaximumLayers = 4096;

    /// <summary>Blind zone after time zero, in rise times (a Gaussian edge reaches 99.9 % at 1.2 rise times after its 50 % point).</summary>
    public const double BlindZoneRiseTimes = 1.5;

    /// <summary>Peeling stops once less than this fraction of the incident energy reaches the next layer,
    /// Π(1 − k_j²) &lt; 0.02: beyond, noise is amplified more than 7× in amplitude and the far end has been reached.</summary>
    public const double MinimumTransmittedEnergy = 0.02;

    /// <summary>Peeling also stops once the impedance leaves [Z_0/19, 19·Z_0] (a reflection beyond ±0.9 against Z_0):
    /// a band-limited open or short arrives as a smooth climb over many thin layers, which the layered model sees as a
    /// taper that still transmits, so the energy test alone would carry on peeling amplified noise.</summary>
    public const double MaximumImpedanceRatio = 19;

    /// <summary>Upper bound on the loss-correction gain (noise is amplified by the same factor).</summary>
    public const double MaximumLossGain = 10;

    /// <summary>
    /// Impedance against distance from an aligned trace (<see cref="TraceConditioner.Align"/>).
    /// </summary>
    /// <param name="aligned">Trace with t = 0 at the reference plane, baseline removed, polarity corrected.</param>
    /// <param name="characteristics">Its characteristics (incident amplitude P at the port, rise time).</param>
    /// <param name="z0Ohms">Impedance of the first cable, Ω (&gt; 0); the reference of the profile.</param>
    /// <param name="velocityFactor">Velocity factor VF (0 &lt; VF ≤ 1); distance d = VF·c·t/2.</param>
    /// <param name="loss">Cable loss model, or null for lossless.</param>
    /// <param name="sourceImpedanceOhms">Instrument source impedance Z_s, Ω (&gt; 0).</param>
    public static ImpedanceProfile Profile(Trace aligned, TraceCharacteristics characteristics, double z0Ohms,
        double velocityFactor, CableLossModel? loss, double sourceImpedanceOhms = 50)
    {
        ArgumentNullException.ThrowIfNull(aligned);
        ArgumentNullException.ThrowIfNull(characteristics);
        if (!(z0Ohms > 0) || !double.IsFinite(z0Ohms)) throw new ArgumentOutOfRangeException(nameof(z0Ohms), "Z0 must be a positive number of ohms.");
        if (!(velocityFactor > 0 && velocityFactor <= 1)) throw new ArgumentOutOfRangeException(nameof(velocityFactor), "The velocity factor must lie in (0, 1].");
        if (!(sourceImpedanceOhms > 0) || !double.IsFinite(sourceImpedanceOhms)) throw new ArgumentOutOfRangeException(nameof(sourceImpedanceOhms), "The source impedance must be a positive number of ohms.");
        if (!(characteristics.IncidentAmplitudeVolts > 0)) throw new ArgumentException("The incident amplitude must be positive.", nameof(characteristics));

        double v = velocityFactor * PhysicalConstants.SpeedOfLightMetersPerSecond;
        double dt = aligned.SampleIntervalSeconds;
        int n = aligned.Length;
        int i0 = (int)Math.Max(0, Math.Ceiling(-aligned.StartTimeSeconds / dt - 1e-9));
        int after = n - i0;
        if (after < 2) return new ImpedanceProfile([], [], [], v);
        int block = Math.Max(1, (after + MaximumLayers - 1) / MaximumLayers);
        int m = after / block;
        if (m < 2) return new ImpedanceProfile([], [], [], v);

        double sourceAmplitude = characteristics.IncidentAmplitudeVolts * (sourceImpedanceOhms + z0Ohms) / (2 * z0Ohms);
        double k0 = (z0Ohms - sourceImpedanceOhms) / (z0Ohms + sourceImpedanceOhms);
        double blind = BlindZoneRiseTimes * characteristics.RiseTimeSeconds;

        // Step reflection (referenced to Z_s) per block, then increments = impulse response of the layered medium.
        var rho = new double[m];
        var layerTime = new double[m];
        for (int b = 0; b < m; b++)
        {
            double s = 0;
            int first = i0 + b * block;
            for (int i = 0; i < block; i++) s += aligned.SamplesVolts[first + i];
            double centre = aligned.TimeAt(first) + 0.5 * (block - 1) * dt;
            rho[b] = b == 0 || centre < blind ? k0 : s / block / sourceAmplitude - 1;
            layerTime[b] = Math.Max(0, aligned.TimeAt(first) - 0.5 * dt);
        }
        layerTime[0] = 0;
        var u = new double[m];
        var w = new double[m + 1];
        u[0] = 1;
        w[0] = rho[0];
        for (int b = 1; b < m; b++)
            w[b] = (rho[b] - rho[b - 1]) * LossGain(loss, layerTime[b], v, characteristics.RiseTimeSeconds);

        var k = new double[m];
        var z = new double[m];
        double transmitted = 1, zPrev = sourceImpedanceOhms;
        int layers = 0;
        for (int j = 0; j < m; j++)
        {
            double kj = w[0];
            if (!(Math.Abs(kj) < 1) || transmitted * (1 - kj * kj) < MinimumTransmittedEnergy && j > 0)
            {
                if (Math.Abs(kj) < 1 && layers < m) { k[j] = kj; zPrev = z[j] = zPrev * (1 + kj) / (1 - kj); layers = j + 1; }
                break;
            }
            k[j] = kj;
            zPrev = z[j] = zPrev * (1 + kj) / (1 - kj);
            layers = j + 1;
            transmitted *= 1 - kj * kj;
            if (zPrev > MaximumImpedanceRatio * z0Ohms || zPrev < z0Ohms / MaximumImpedanceRatio) break;
            Peel(u, w, m - j, kj);
        }

        var distances = new double[layers];
        for (int j = 0; j < layers; j++) distances[j] = v * layerTime[j] / 2;
        return new ImpedanceProfile(distances, z[..layers], k[..layers], v);
    }

    /// <summary>One layer of the Schur recursion in place over the first <paramref name="length"/> entries.</summary>
    private static void Peel(double[] u, double[] w, int length, double k)
    {
        double c = 1 / (1 - k * k);
        int count = length - 1;           // entries that stay meaningful after the one-sample advance of w
        int i = 0;
        int lanes = Vector<double>.Count;
        if (Vector.IsHardwareAccelerated)
        {
            var vk = new Vector<double>(k);
            var vc = new Vector<double>(c);
            ref double ur = ref MemoryMarshal.GetArrayDataReference(u);
            ref double wr = ref MemoryMarshal.GetArrayDataReference(w);
            for (; i + lanes < count; i += lanes)
            {
                var u0 = Vector.LoadUnsafe(ref ur, (nuint)i);
                var w0 = Vector.LoadUnsafe(ref wr, (nuint)i);
                var u1 = Vector.LoadUnsafe(ref ur, (nuint)(i + 1));
                var w1 = Vector.LoadUnsafe(ref wr, (nuint)(i + 1));
                (vc * (u0 - vk * w0)).StoreUnsafe(ref ur, (nuint)i);
                (vc * (w1 - vk * u1)).StoreUnsafe(ref wr, (nuint)i);
            }
        }
        for (; i < count; i++)
        {
            double un = c * (u[i] - k * w[i]);
            double wn = c * (w[i + 1] - k * u[i + 1]);
            u[i] = un;
            w[i] = wn;
        }
        if (count >= 0) { u[count] = c * (u[count] - k * w[count]); w[count] = 0; }
    }

    /// <summary>
    /// Two-way loss gain 1 / e^(−2 α(f_e) d) for an echo arriving <paramref name="roundTripSeconds"/> after time zero
    /// (see the type's remarks), capped at <see cref="MaximumLossGain"/>; 1 for a lossless cable.
    /// </summary>
    internal static double LossGain(CableLossModel? loss, double roundTripSeconds, double velocityMetersPerSecond, double riseTimeSeconds)
    {
        if (loss is null || loss.IsLossless || roundTripSeconds <= 0) return 1;
        double d = velocityMetersPerSecond * roundTripSeconds / 2;
        double a = loss.SkinLossNepersPerMeterPerRootHertz * 2 * d / Math.Sqrt(Math.PI);
        double skinRise = 31.48 * a * a;
        double echoRise = Math.Sqrt(riseTimeSeconds * riseTimeSeconds + skinRise * skinRise);
        double f = 0.35 / echoRise;
        double alpha = loss.SkinLossNepersPerMeterPerRootHertz * Math.Sqrt(f) + loss.DielectricLossNepersPerMeterPerHertz * f;
        return Math.Min(MaximumLossGain, Math.Exp(2 * alpha * d));
    }
}
