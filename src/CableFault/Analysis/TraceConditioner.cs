using CableFault.Traces;

namespace CableFault.Analysis;

/// <summary>Finds the incident edge, levels, rise time and noise of a raw trace, and aligns it.</summary>
public static class TraceConditioner
{
    /// <summary>Characterises a raw trace. Throws <see cref="InputException"/> when no usable incident edge exists.</summary>
    public static TraceCharacteristics Characterise(Trace raw) => throw new NotImplementedException();

    /// <summary>Time zero at the reference plane, baseline removed, polarity corrected (amplitude not normalised).</summary>
    public static Trace Align(Trace raw, TraceCharacteristics characteristics) => throw new NotImplementedException();
}
