using System.CommandLine;
using System.Globalization;
using CableFault.Analysis;
using CableFault.Cables;
using CableFault.Reporting;
using CableFault.Workflows;

namespace CableFault.Cli.Infrastructure;

/// <summary>The field-workflow options of <c>locate</c>: both-ends location, unknown VF and a launch lead.</summary>
public sealed class FieldOptions
{
    /// <summary>Two traces of the same run, one from each end.</summary>
    public Option<bool> BothEnds { get; } = new("--from-both-ends") { Description = "The two traces are of the same run measured from end A and from end B (the other end open): each fault at L·t_A/(t_A+t_B), no VF needed. Needs --length." };

    /// <summary>Physical run length for --from-both-ends.</summary>
    public Option<double?> Length { get; } = new("--length") { Description = "Physical length of the run between the two measuring points, in --units (for --from-both-ends)." };

    /// <summary>1-σ of that length.</summary>
    public Option<double> LengthUncertainty { get; } = new("--length-uncertainty") { Description = "1-σ uncertainty of --length, in --units.", DefaultValueFactory = _ => 0 };

    /// <summary>Insulation class whose VF range is shown when no VF is known.</summary>
    public Option<string?> Insulation { get; } = new Option<string?>("--insulation") { Description = "Insulation of the cable when its VF is not known: distances are then shown as the range for that class (default: a wide range covering common cables)." }
        .AcceptOnlyFromAmong("solid_pe", "foam_pe", "ptfe", "twisted_pair", "xlpe");

    /// <summary>Launch lead length.</summary>
    public Option<double?> LeadLength { get; } = new("--lead-length") { Description = "Length of a launch (lead-in) cable between instrument and run, in --units: distances then start at its far end and its connector is left out." };

    /// <summary>Launch lead cable type.</summary>
    public Option<string?> LeadCable { get; } = new("--lead-cable") { Description = "Cable type of the launch lead (see 'cablefault cables'); gives its VF." };

    /// <summary>Launch lead velocity factor.</summary>
    public Option<double?> LeadVelocityFactor { get; } = new("--lead-vf") { Description = "Velocity factor of the launch lead (default: --lead-cable's, else the run's)." };

    /// <summary>Adds the options to <paramref name="command"/>.</summary>
    public void AddTo(Command command)
    {
        foreach (var option in new Option[] { BothEnds, Length, LengthUncertainty, Insulation, LeadLength, LeadCable, LeadVelocityFactor })
            command.Options.Add(option);
    }

    /// <summary>The launch lead, or null when --lead-length is not given; the run's VF is the fallback for its VF.</summary>
    public LaunchLead? Lead(ParseResult parsed, DistanceUnit unit, CableLibrary library, double runVelocityFactor)
    {
        if (parsed.GetValue(LeadLength) is not double length)
        {
            if (parsed.GetValue(LeadCable) is not null || parsed.GetValue(LeadVelocityFactor) is not null)
                throw new InputException("--lead-cable and --lead-vf describe a launch lead; give its length with --lead-length");
            return null;
        }
        double vf = parsed.GetValue(LeadVelocityFactor)
            ?? (parsed.GetValue(LeadCable) is string name ? library.Get(name).VelocityFactor : runVelocityFactor);
        var lead = new LaunchLead(length * unit.MetersPerUnit, vf);
        if (lead.Problems() is [var first, ..]) throw new InputException($"--lead-length/--lead-vf: {first}");
        return lead;
    }

    /// <summary>The insulation class for the VF range (unknown when not given).</summary>
    public InsulationClass InsulationClass(ParseResult parsed) => InsulationClassRanges.Parse(parsed.GetValue(Insulation));

    /// <summary>Length and its σ in metres, checked.</summary>
    public (double Meters, double SigmaMeters) LengthMeters(ParseResult parsed, DistanceUnit unit)
    {
        double length = parsed.GetValue(Length) ?? throw new InputException("--from-both-ends needs the run's physical length: give --length");
        double sigma = parsed.GetValue(LengthUncertainty);
        if (!(length > 0) || !double.IsFinite(length)) throw new InputException(string.Create(CultureInfo.InvariantCulture, $"--length {length}: must be a positive length"));
        if (!(sigma >= 0) || !double.IsFinite(sigma)) throw new InputException("--length-uncertainty must be zero or positive");
        return (length * unit.MetersPerUnit, sigma * unit.MetersPerUnit);
    }
}
