namespace CableFault.Simulation;

/// <summary>Shape of the stimulus step's transition.</summary>
public enum EdgeShape
{
    /// <summary>Error-function step (Gaussian derivative): the usual model of a sampler-limited edge; 10–90 % rise = 2.5631·σ.</summary>
    Gaussian,
    /// <summary>Linear ramp from 0 to 100 % over rise/0.8 (10–90 % rise = 0.8 × ramp time).</summary>
    Linear,
}
