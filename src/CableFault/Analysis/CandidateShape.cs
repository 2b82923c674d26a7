namespace CableFault.Analysis;

/// <summary>The shape of a change in the trace, before any model says what caused it.</summary>
public enum CandidateShape
{
    /// <summary>A lasting change of level (impedance change, end, tap, resistive fault).</summary>
    Step,
    /// <summary>A transient excursion downward that returns to the previous level (shunt C).</summary>
    Dip,
    /// <summary>A transient excursion upward that returns to the previous level (series L).</summary>
    Bump,
}
