namespace CableFault.Cables;

/// <summary>
/// A cable type: nominal characteristic impedance, velocity factor and loss. Everything the forward model needs
/// about a cable is derived from these through <see cref="CableMedium"/>.
/// </summary>
/// <param name="Designation">Short name used in files and on the command line (case-insensitive), e.g. <c>RG-58</c>.</param>
/// <param name="Description">One line for people: construction, dielectric.</param>
/// <param name="ImpedanceOhms">Nominal characteristic impedance Z₀ at high frequency, Ω (&gt; 0).</param>
/// <param name="VelocityFactor">v / c, in (0, 1].</param>
/// <param name="Loss">Attenuation model.</param>
/// <param name="InsulationClass">Dielectric family, used to bound the VF when it is not known.</param>
/// <param name="Source">Where the nominal values come from.</param>
public sealed record CableType(
    string Designation,
    string Description,
    double ImpedanceOhms,
    double VelocityFactor,
    CableLossModel Loss,
    InsulationClass InsulationClass = InsulationClass.Unknown,
    string Source = "")
{
    /// <summary>Every problem with the values, empty when valid.</summary>
    public IReadOnlyList<string> Problems()
    {
        var problems = new List<string>();
        if (string.IsNullOrWhiteSpace(Designation)) problems.Add("designation is empty");
        if (!(ImpedanceOhms > 0) || !double.IsFinite(ImpedanceOhms)) problems.Add($"impedance {ImpedanceOhms} Ω must be a positive number");
        if (!(VelocityFactor > 0 && VelocityFactor <= 1)) problems.Add($"velocity factor {VelocityFactor} must be in (0, 1]");
        return problems;
    }

    /// <summary>Propagation speed v = VF·c, m/s.</summary>
    public double VelocityMetersPerSecond => VelocityFactor * PhysicalConstants.SpeedOfLightMetersPerSecond;

    /// <summary>The propagation medium derived from this type.</summary>
    public CableMedium Medium => new(ImpedanceOhms, VelocityFactor, Loss);
}
