namespace CableFault.Analysis;

/// <summary>What one event of the parametric run model is, in network terms.</summary>
internal enum RunModelElement
{
    /// <summary>The line impedance changes to <see cref="RunModelEvent.Value"/> ohms and stays there.</summary>
    Boundary,
    /// <summary>A shunt capacitor of <see cref="RunModelEvent.Value"/> farads.</summary>
    ShuntCapacitor,
    /// <summary>A series inductor of <see cref="RunModelEvent.Value"/> henries.</summary>
    SeriesInductor,
    /// <summary>A shunt resistor of <see cref="RunModelEvent.Value"/> ohms (the line continues at the same impedance).</summary>
    ShuntResistor,
    /// <summary>A series resistor of <see cref="RunModelEvent.Value"/> ohms.</summary>
    SeriesResistor,
    /// <summary>A junction with an open-ended branch of the same impedance whose round trip is <see cref="RunModelEvent.Value"/> seconds.</summary>
    Tap,
    /// <summary>The run ends open here.</summary>
    Open,
    /// <summary>The run ends shorted here.</summary>
    Short,
}
