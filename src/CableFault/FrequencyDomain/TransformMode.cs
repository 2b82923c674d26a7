namespace CableFault.FrequencyDomain;

/// <summary>How reflection data are taken to the time domain.</summary>
public enum TransformMode
{
    /// <summary>Low-pass step when the sweep starts close enough to DC, band-pass impulse otherwise.</summary>
    Automatic,
    /// <summary>Low-pass step: a harmonic grid extended to DC gives a real step response (opens and shorts can be told apart).</summary>
    LowPassStep,
    /// <summary>Band-pass impulse: the magnitude of the windowed impulse response; shows where reflections are, not their kind.</summary>
    BandPassImpulse,
}
