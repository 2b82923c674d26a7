namespace CableFault.History;

/// <summary>Why a trace was stored in the run history.</summary>
public enum HistoryPurpose
{
    /// <summary>Stored by <c>history add</c>: a measurement kept on record (possibly the run's baseline).</summary>
    Record,

    /// <summary>Stored by <c>history check</c>: a measurement compared against the run's baseline, with the verdict.</summary>
    Check,
}
