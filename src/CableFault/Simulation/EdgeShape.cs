namespace CableFault.Simulation;

/// <summary>Shape of the stimulus step's transition.</summary>
public enum EdgeShape
{
    /// <summary>Error-function step (Gaussian derivative): the usual model of a sampler-limited edge; 10–90 % rise = 2.5631·σ.</summary>
    Gaussian,
    /// <summary>
    /// Linear ramp from 0 to 100 % over T = rise/0.8 (10–90 % rise = 0.8 × T), its two corners rounded by a Gaussian of
    /// σ = T/100 so that the spectrum is band-limited: the waveform differs from the ideal ramp only within ±3σ of a
    /// corner, by at most 0.4 % of the step (σ/T·φ(0)); the 10–90 % points and the midpoint are unchanged.
    /// </summary>
    Linear,
}
