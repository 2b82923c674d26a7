namespace CableFault;

/// <summary>Physical constants used throughout, in SI units.</summary>
public static class PhysicalConstants
{
    /// <summary>Speed of light in vacuum, c₀ = 299 792 458 m/s (exact by definition of the metre, SI Brochure 9th ed., 2019).</summary>
    public const double SpeedOfLightMetersPerSecond = 299_792_458.0;

    /// <summary>Metres in one international foot (exact, 1959 international yard and pound agreement).</summary>
    public const double MetersPerFoot = 0.3048;
}
