using System.CommandLine;
using System.Globalization;
using System.Text.Json;
using CableFault.Cables;
using CableFault.Cli.Infrastructure;

namespace CableFault.Cli.Commands;

/// <summary><c>cablefault cables</c>: lists the known cable types.</summary>
public static class CablesCommand
{
    /// <summary>Builds the verb.</summary>
    public static Command Create(CliContext context)
    {
        var cableFile = CommonOptions.CableFile();
        var format = new Option<string>("--format") { Description = "text (a table) or json.", DefaultValueFactory = _ => "text" }
            .AcceptOnlyFromAmong("text", "json");
        var command = new Command("cables", "List the cable types CableFault knows: Z0, velocity factor and loss at 10 and 100 MHz.\n\nExample:\n  cablefault cables --cables my-cables.json")
        {
            cableFile, format,
        };
        command.SetAction(parsed =>
        {
            var library = CableOptions.Library(parsed.GetValue(cableFile));
            if (parsed.GetValue(format) == "json") WriteJson(library, context.Output);
            else WriteTable(library, context.Output);
            return CliApp.Success;
        });
        return command;
    }

    private static void WriteTable(CableLibrary library, TextWriter output)
    {
        output.WriteLine($"{"designation",-12} {"Z0 (Ω)",7} {"VF",6} {"dB/100m@10MHz",14} {"dB/100m@100MHz",15}  description");
        foreach (var type in library.Types)
        {
            output.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"{type.Designation,-12} {type.ImpedanceOhms,7:F1} {type.VelocityFactor,6:F3} {type.Loss.AttenuationDbPer100m(10e6),14:F2} {type.Loss.AttenuationDbPer100m(100e6),15:F2}  {type.Description}"));
        }
        output.WriteLine("Values are generic nominal figures; use your cable's data sheet or 'cablefault calibrate' on a known length.");
    }

    private static void WriteJson(CableLibrary library, TextWriter output)
    {
        var items = library.Types.Select(t => new Dictionary<string, object?>
        {
            ["designation"] = t.Designation,
            ["description"] = t.Description,
            ["z0_ohms"] = t.ImpedanceOhms,
            ["vf"] = t.VelocityFactor,
            ["loss_db_per_100m_at_10mhz"] = Math.Round(t.Loss.AttenuationDbPer100m(10e6), 4),
            ["loss_db_per_100m_at_100mhz"] = Math.Round(t.Loss.AttenuationDbPer100m(100e6), 4),
            ["dc_loop_ohms_per_m"] = t.Loss.DcResistanceOhmsPerMeter,
            ["insulation"] = InsulationClassRanges.Name(t.InsulationClass),
            ["source"] = t.Source,
        });
        output.WriteLine(JsonSerializer.Serialize(new { cables = items }, new JsonSerializerOptions { WriteIndented = true }));
    }
}
