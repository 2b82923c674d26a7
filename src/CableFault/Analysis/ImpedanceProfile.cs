namespace CableFault.Analysis;

/// <summary>
/// Line impedance against one-way distance from the reference plane, from layer peeling
/// (<see cref="LayerPeeling.Profile"/>). The three arrays have the same length; index k is layer k.
/// </summary>
/// <param name="DistancesMeters">One-way distance of the start of each layer, in metres: d = v · t / 2, v = VF · c.</param>
/// <param name="ImpedanceOhms">Line impedance of each layer, in ohms (may be very large or small near an open or short).</param>
/// <param name="ReflectionCoefficients">Local reflection coefficient at the start of each layer,
/// k_j = (Z_j − Z_{j−1}) / (Z_j + Z_{j−1}), dimensionless, in (−1, 1).</param>
/// <param name="VelocityMetersPerSecond">Propagation velocity used for the distance axis, v = VF · c, in m/s.</param>
public sealed record ImpedanceProfile(
    double[] DistancesMeters,
    double[] ImpedanceOhms,
    double[] ReflectionCoefficients,
    double VelocityMetersPerSecond)
{
    /// <summary>Round-trip time of one-way distance <paramref name="distanceMeters"/>, in seconds: t = 2 d / v.</summary>
    public double RoundTripSecondsAt(double distanceMeters) => 2 * distanceMeters / VelocityMetersPerSecond;

    /// <summary>Layer count.</summary>
    public int Length => DistancesMeters.Length;

    /// <summary>Layer thickness, in metres (v · Δt / 2); 0 for an empty profile.</summary>
    public double LayerThicknessMeters => Length > 1 ? DistancesMeters[1] - DistancesMeters[0] : 0;

    /// <summary>Impedance at <paramref name="distanceMeters"/>, in ohms (nearest layer; clamped to the ends).</summary>
    public double ImpedanceAt(double distanceMeters)
    {
        if (Length == 0) throw new InvalidOperationException("The profile is empty.");
        double dx = LayerThicknessMeters;
        int k = dx > 0 ? (int)Math.Round((distanceMeters - DistancesMeters[0]) / dx) : 0;
        return ImpedanceOhms[Math.Clamp(k, 0, Length - 1)];
    }
}
