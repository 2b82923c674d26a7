namespace CableFault.Comparison;

/// <summary>A stretch of the run where the two traces differ by more than the combined noise band.</summary>
/// <param name="StartMeters">Where the difference leaves the band, m.</param>
/// <param name="EndMeters">Where it returns into the band, m.</param>
/// <param name="PeakDistanceMeters">Where the difference is largest, m.</param>
/// <param name="PeakDifference">Largest difference current − baseline, in units of the incident step (signed).</param>
/// <param name="Explained">True when an event-level change at or before this region accounts for it (a change
/// alters everything downstream of it).</param>
public sealed record DifferenceRegion(double StartMeters, double EndMeters, double PeakDistanceMeters, double PeakDifference,
    bool Explained);
