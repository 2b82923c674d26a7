using System.CommandLine;
using CableFault.Analysis;
using CableFault.Traces;

namespace CableFault.Cli.Infrastructure;

/// <summary>The cable-setting options shared by the verbs that read traces (--vf, --z0, --cable, --source-ohms, --vf-uncertainty-percent, --cables).</summary>
public sealed class CableSettingOptions
{
    /// <summary>--vf.</summary>
    public Option<double?> VelocityFactor { get; } = new("--vf") { Description = "Velocity factor (v/c) of the cable, e.g. 0.66. Overrides trace metadata and --cable." };
    /// <summary>--z0.</summary>
    public Option<double?> Impedance { get; } = new("--z0") { Description = "Characteristic impedance of the cable, Ω, e.g. 50." };
    /// <summary>--cable.</summary>
    public Option<string?> Cable { get; } = new("--cable") { Description = "Cable type (see 'cablefault cables'); gives VF, Z0 and loss." };
    /// <summary>--source-ohms.</summary>
    public Option<double?> SourceImpedance { get; } = new("--source-ohms") { Description = "Instrument source impedance, Ω. Default: trace metadata, else the cable's Z0." };
    /// <summary>--vf-uncertainty-percent.</summary>
    public Option<double?> VelocityFactorUncertainty { get; } = new("--vf-uncertainty-percent") { Description = "1-σ uncertainty of the VF in percent (default 2 % for a stated VF, 10 % for the default)." };
    /// <summary>--cables.</summary>
    public Option<FileInfo?> CableFile { get; } = CommonOptions.CableFile();

    /// <summary>Adds every option to a command.</summary>
    public void AddTo(Command command)
    {
        command.Options.Add(VelocityFactor);
        command.Options.Add(Impedance);
        command.Options.Add(Cable);
        command.Options.Add(SourceImpedance);
        command.Options.Add(VelocityFactorUncertainty);
        command.Options.Add(CableFile);
    }

    /// <summary>Resolves the settings for a trace from the parsed options.</summary>
    public CableSettings Resolve(ParseResult parsed, Trace trace)
    {
        var library = CableOptions.Library(parsed.GetValue(CableFile));
        double? sigma = parsed.GetValue(VelocityFactorUncertainty) is double percent ? percent / 100 : null;
        return CableSettings.Resolve(trace, parsed.GetValue(VelocityFactor), parsed.GetValue(Impedance), parsed.GetValue(Cable),
            parsed.GetValue(SourceImpedance), library, sigma);
    }
}
