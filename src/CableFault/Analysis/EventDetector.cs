using CableFault.Traces;

namespace CableFault.Analysis;

/// <summary>Finds the places where the run changes, rejecting noise and multiple-reflection ghosts.</summary>
public static class EventDetector
{
    /// <summary>Default detection threshold, in standard deviations of the difference noise.</summary>
    public const double DefaultThresholdSigma = 5.0;

    /// <summary>Event candidates, in order of round-trip time.</summary>
    public static IReadOnlyList<EventCandidate> Detect(Trace aligned, TraceCharacteristics characteristics,
        ImpedanceProfile profile, double thresholdSigma = DefaultThresholdSigma) => throw new NotImplementedException();
}
