namespace CableFault.FrequencyDomain;

/// <summary>
/// Window applied to the reflection spectrum before the inverse transform. Trades edge speed (rise time) against
/// ringing (sidelobes) — see <see cref="ReflectionToStepConverter"/> for measured figures.
/// </summary>
public enum SpectralWindow
{
    /// <summary>No window: fastest edge, 9 % Gibbs overshoot, −13.3 dB sidelobes.</summary>
    Rectangular,
    /// <summary>Hann (raised cosine): −31.5 dB sidelobes.</summary>
    Hann,
    /// <summary>Kaiser–Bessel with shape β (<see cref="FrequencyToTimeOptions.KaiserBeta"/>).</summary>
    Kaiser,
}
