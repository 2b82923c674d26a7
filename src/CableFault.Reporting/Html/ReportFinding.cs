using CableFault.Analysis;

namespace CableFault.Reporting.Html;

/// <summary>One event as the report presents it.</summary>
/// <param name="Number">Its number in the event table and on the plots (1 = nearest the connector).</param>
/// <param name="Event">The located event.</param>
/// <param name="Severity">Rank for ordering, higher first: how much the finding calls for action.</param>
/// <param name="Role">Attention, PossibleEnd (the farthest end-like event when the run's length was not recorded),
/// Listed (a feature of the as-built list), Expected (the run's recorded end) or BeyondEnd (an echo past an open or short).</param>
/// <param name="AsBuilt">What the as-built list says about the event, or null when no list was given.</param>
public sealed record ReportFinding(int Number, LocatedEvent Event, int Severity, FindingRole Role, Workflows.AsBuiltEventMatch? AsBuilt = null);

/// <summary>How a finding relates to what the run should look like.</summary>
public enum FindingRole
{
    /// <summary>Needs attention: a fault or an unexplained change.</summary>
    Attention,
    /// <summary>The farthest open, short or termination when the run's length is unknown: probably its end.</summary>
    PossibleEnd,
    /// <summary>A known feature of the run (a splice, connector, tap, cable change or end of the as-built list), found
    /// where and as it should be.</summary>
    Listed,
    /// <summary>The run's end where the job file says it is.</summary>
    Expected,
    /// <summary>Beyond an open or a short: nothing travels past a full reflection, so this is a re-reflection (an echo
    /// of earlier events), not a place on the cable.</summary>
    BeyondEnd,
}
