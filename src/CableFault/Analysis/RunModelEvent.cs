namespace CableFault.Analysis;

/// <summary>One event of the parametric run model.</summary>
/// <param name="Element">What the event is.</param>
/// <param name="RoundTripSeconds">Round-trip time from the reference plane, s (&gt; 0).</param>
/// <param name="Value">Its size in SI (Ω after a boundary, F, H, Ω, or the tap branch's round trip in s); NaN for open and short.</param>
internal sealed record RunModelEvent(RunModelElement Element, double RoundTripSeconds, double Value)
{
    /// <summary>True when the event has a size parameter.</summary>
    internal bool HasValue => Element is not (RunModelElement.Open or RunModelElement.Short);

    /// <summary>True when nothing on the main line lies beyond the event.</summary>
    internal bool EndsRun => Element is RunModelElement.Open or RunModelElement.Short;
}
