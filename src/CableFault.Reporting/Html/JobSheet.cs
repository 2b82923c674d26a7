using System.Globalization;
using CableFault.Traces;

namespace CableFault.Reporting.Html;

/// <summary>
/// Who measured what, where and when: the header of a technician report. Every field is optional; missing ones are
/// shown as "not recorded". Read from a job file (<see cref="JobSheetJson"/>), command-line options or trace metadata,
/// and combined with <see cref="Over"/>.
/// </summary>
/// <param name="Site">Where the run is.</param>
/// <param name="RunId">The cable run's identifier in the asset record.</param>
/// <param name="CableType">Cable type as named by the technician (e.g. a designation from the cable library).</param>
/// <param name="Technician">Who measured.</param>
/// <param name="MeasuredAt">Date and time of the measurement, free text (ISO 8601 preferred).</param>
/// <param name="Customer">Who the work is for.</param>
/// <param name="WorkOrder">Work order or ticket reference.</param>
/// <param name="ExpectedLengthMeters">Installed length of the run, m, when known: an open, short or termination there
/// is the run's own end, not a fault.</param>
/// <param name="VelocityFactor">VF the technician set for this job, or null.</param>
/// <param name="ImpedanceOhms">Cable Z₀ the technician set for this job, Ω, or null.</param>
/// <param name="Instrument">Instrument name and settings as label/value pairs, in the order given.</param>
/// <param name="Notes">Free notes for the next crew.</param>
/// <param name="AsBuiltFile">Path of the run's as-built list as written in the job file (relative to the job file), or null.</param>
public sealed record JobSheet(
    string? Site = null,
    string? RunId = null,
    string? CableType = null,
    string? Technician = null,
    string? MeasuredAt = null,
    string? Customer = null,
    string? WorkOrder = null,
    double? ExpectedLengthMeters = null,
    double? VelocityFactor = null,
    double? ImpedanceOhms = null,
    IReadOnlyList<KeyValuePair<string, string>>? Instrument = null,
    string? Notes = null,
    string? AsBuiltFile = null)
{
    /// <summary>An empty sheet.</summary>
    public static JobSheet Empty { get; } = new();

    /// <summary>The header fields a trace's metadata carries (<c># site=</c>, <c># run=</c>, <c># technician=</c>,
    /// <c># date=</c>, <c># cable=</c>) and its instrument settings (<c># rise_s=</c>, <c># source_ohms=</c>).</summary>
    public static JobSheet FromTrace(Trace trace)
    {
        ArgumentNullException.ThrowIfNull(trace);
        var instrument = new List<KeyValuePair<string, string>>();
        if (trace.MetadataOrNull("instrument") is string name) instrument.Add(new("Instrument", name));
        if (trace.MetadataOrNull(TraceMetadataKeys.RiseTimeSeconds) is string rise)
            instrument.Add(new("Step rise time (trace file)", double.TryParse(rise, NumberStyles.Float, CultureInfo.InvariantCulture, out double seconds)
                ? ReportNumbers.Seconds(seconds) : rise));
        if (trace.MetadataOrNull(TraceMetadataKeys.SourceImpedanceOhms) is string zs)
            instrument.Add(new("Source impedance (trace file)", double.TryParse(zs, NumberStyles.Float, CultureInfo.InvariantCulture, out double ohms)
                ? ReportNumbers.Ohms(ohms) : zs));
        return new JobSheet(
            Site: trace.MetadataOrNull(TraceMetadataKeys.Site),
            RunId: trace.MetadataOrNull(TraceMetadataKeys.Run),
            CableType: trace.MetadataOrNull(TraceMetadataKeys.Cable),
            Technician: trace.MetadataOrNull(TraceMetadataKeys.Technician),
            MeasuredAt: trace.MetadataOrNull(TraceMetadataKeys.Date),
            Instrument: instrument);
    }

    /// <summary>This sheet with every missing field taken from <paramref name="fallback"/> (fields set here win).
    /// Instrument lists are joined, this sheet's entries first, without repeating a label.</summary>
    public JobSheet Over(JobSheet fallback)
    {
        ArgumentNullException.ThrowIfNull(fallback);
        var instrument = (Instrument ?? []).ToList();
        foreach (var pair in fallback.Instrument ?? [])
            if (!instrument.Any(p => string.Equals(p.Key, pair.Key, StringComparison.OrdinalIgnoreCase)))
                instrument.Add(pair);
        return new JobSheet(
            Pick(Site, fallback.Site), Pick(RunId, fallback.RunId), Pick(CableType, fallback.CableType),
            Pick(Technician, fallback.Technician), Pick(MeasuredAt, fallback.MeasuredAt), Pick(Customer, fallback.Customer),
            Pick(WorkOrder, fallback.WorkOrder), ExpectedLengthMeters ?? fallback.ExpectedLengthMeters,
            VelocityFactor ?? fallback.VelocityFactor, ImpedanceOhms ?? fallback.ImpedanceOhms, instrument,
            Pick(Notes, fallback.Notes), Pick(AsBuiltFile, fallback.AsBuiltFile));
    }

    private static string? Pick(string? mine, string? theirs) => string.IsNullOrWhiteSpace(mine) ? theirs : mine;
}
