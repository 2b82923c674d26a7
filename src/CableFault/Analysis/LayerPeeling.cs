using CableFault.Cables;
using CableFault.Traces;

namespace CableFault.Analysis;

/// <summary>Impedance profile by discrete layer peeling (inverse scattering).</summary>
public static class LayerPeeling
{
    /// <summary>Impedance against distance from an aligned trace.</summary>
    public static ImpedanceProfile Profile(Trace aligned, TraceCharacteristics characteristics, double z0Ohms,
        double velocityFactor, CableLossModel? loss, double sourceImpedanceOhms = 50) => throw new NotImplementedException();
}
