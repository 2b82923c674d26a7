namespace CableFault.Traces.Csv;

/// <summary>What a CSV column holds.</summary>
internal enum ColumnQuantity
{
    /// <summary>A column this reader does not use.</summary>
    Unknown,
    /// <summary>Sample time.</summary>
    Time,
    /// <summary>Port voltage.</summary>
    Voltage,
    /// <summary>Reflection coefficient (dimensionless), kept in the volts slot with metadata unit=rho.</summary>
    Rho,
}

/// <summary>
/// One header cell understood: its quantity and the divisor that turns a file value into SI
/// (value_SI = value_file / <see cref="Divisor"/>; dividing by an exact power of ten rounds once, multiplying by 1e-9 twice).
/// </summary>
internal readonly record struct CsvColumn(string Header, ColumnQuantity Quantity, double Divisor, bool UnitStated)
{
    /// <summary>A bracketed unit on a time or voltage name that this reader does not know (e.g. "time (min)").</summary>
    public string? UnrecognisedUnit { get; init; }

    /// <summary>Voltage or rho.</summary>
    public bool IsSignal => Quantity is ColumnQuantity.Voltage or ColumnQuantity.Rho;
}
