namespace CableFault.Json;

/// <summary>
/// Ranges accepted for the numbers of run descriptions and cable files. Each is wide enough for anything a real run
/// or cable has (by orders of magnitude) and narrow enough that the forward model's arithmetic stays finite: a value
/// outside is a unit slip or a corrupt number, and is refused with its path rather than turned into NaN samples.
/// </summary>
internal static class PlausibleRanges
{
    /// <summary>Characteristic impedance, Ω: 1 … 10 000 (cables are about 25–600 Ω).</summary>
    internal const double MinimumImpedanceOhms = 1, MaximumImpedanceOhms = 10_000;

    /// <summary>Velocity factor: 0.01 … 1 (cables are about 0.4–0.99).</summary>
    internal const double MinimumVelocityFactor = 0.01;

    /// <summary>Loss-table frequency, MHz: up to 1 000 000 (1 THz).</summary>
    internal const double MaximumLossFrequencyMhz = 1e6;

    /// <summary>Attenuation, dB/100 m: up to 10 000 (thin cable at microwave frequencies is tens to hundreds).</summary>
    internal const double MaximumAttenuationDbPer100m = 1e4;

    /// <summary>DC loop resistance, Ω/m: up to 1000 (thin pairs are about 0.2 Ω/m).</summary>
    internal const double MaximumDcLoopOhmsPerMeter = 1e3;

    /// <summary>Lumped capacitance, pF: 1e-6 … 1e9 (1 aF … 1 mF).</summary>
    internal const double MinimumCapacitancePf = 1e-6, MaximumCapacitancePf = 1e9;

    /// <summary>Lumped inductance, nH: 1e-6 … 1e9 (1 fH … 1 H).</summary>
    internal const double MinimumInductanceNh = 1e-6, MaximumInductanceNh = 1e9;

    /// <summary>Lumped or end resistance, Ω: 1e-6 … 1e12 (a micro-ohm short to a tera-ohm leak).</summary>
    internal const double MinimumResistanceOhms = 1e-6, MaximumResistanceOhms = 1e12;
}
