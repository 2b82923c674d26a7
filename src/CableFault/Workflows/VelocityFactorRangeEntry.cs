using CableFault.Analysis;

namespace CableFault.Workflows;

/// <summary>One event, VF-free.</summary>
/// <param name="Event">The located event (its distance uses the assumed VF).</param>
/// <param name="RoundTripSeconds">Round trip from the reference plane, s.</param>
/// <param name="ElectricalLengthMeters">c·t/2, m: the distance if the VF were 1; the physical distance is VF times this.</param>
/// <param name="LowMeters">VF_low·c·t/2, m.</param>
/// <param name="HighMeters">VF_high·c·t/2, m.</param>
public sealed record VelocityFactorRangeEntry(LocatedEvent Event, double RoundTripSeconds, double ElectricalLengthMeters, double LowMeters, double HighMeters);
