using CableFault.Traces;

namespace CableFault.Analysis;

/// <summary>Everything <see cref="Locator.Locate"/> found.</summary>
/// <param name="AlignedTrace">The trace with time zero at the incident edge, baseline removed, polarity corrected.</param>
/// <param name="Characteristics">Edge, levels and noise of the raw trace.</param>
/// <param name="Profile">Impedance against distance from layer peeling.</param>
/// <param name="Events">The events, nearest first.</param>
/// <param name="Fit">How the model fit went.</param>
/// <param name="BlindZoneMeters">Distance from the reference plane within which nothing can be told apart from the
/// incident edge, m: v·(t_r + t_r/2)/2 (one rise time plus the half of the edge before its 50 % point).</param>
/// <param name="Options">The options used.</param>
/// <param name="Warnings">One-line warnings (the conditioning's and the fit's).</param>
/// <param name="ModelTrace">The fitted model on the fit window's time grid (smoothed like the data when the record
/// was long), or null when no model was fitted.</param>
public sealed record LocateResult(Trace AlignedTrace, TraceCharacteristics Characteristics, ImpedanceProfile Profile,
    IReadOnlyList<LocatedEvent> Events, FitReport Fit, double BlindZoneMeters, LocateOptions Options,
    IReadOnlyList<string> Warnings, Trace? ModelTrace)
{
    /// <summary>True when the fit left part of the trace unexplained (a warning says how much): an empty or short event
    /// list is then no sign of a sound run (a slow, smeared echo on a very lossy cable can escape the detector).</summary>
    public bool LeavesTraceUnexplained => Warnings.Any(w => w.StartsWith(Locator.ResidualWarningLead, StringComparison.Ordinal));

    /// <summary>True when the level still moves at the end of the record (a warning says so): the run is then not shown
    /// to be uniform, whether or not any event was found.</summary>
    public bool LevelStillMovingAtEnd => Warnings.Any(w => w.StartsWith(TraceConditioner.StillMovingWarningLead, StringComparison.Ordinal));

    /// <summary>True when no event was found although the level strays far from the incident plateau (a warning says
    /// how far): the empty list is then no sign of a sound run (see SlowChange).</summary>
    public bool LevelMovesWithoutEvent => Warnings.Any(w => w.StartsWith(SlowChange.WarningLead, StringComparison.Ordinal));
}

