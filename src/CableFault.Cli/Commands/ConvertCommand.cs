using System.CommandLine;
using System.Globalization;
using CableFault.Cli.Infrastructure;
using CableFault.Traces;

namespace CableFault.Cli.Commands;

/// <summary><c>cablefault convert INPUT -o TRACE.csv</c>: any accepted input (Touchstone, CSV) written as a CableFault trace CSV.</summary>
public static class ConvertCommand
{
    /// <summary>Builds the verb.</summary>
    public static Command Create(CliContext context)
    {
        var input = new Argument<FileInfo>("input") { Description = "A Touchstone file (.s1p, .s2p) or a trace CSV." };
        var output = new Option<FileInfo?>("--output", "-o") { Description = "Trace CSV to write. Without it the CSV goes to standard output." };
        var window = TraceFiles.WindowOption();
        var command = new Command("convert",
            "Write any accepted input as a CableFault trace CSV; a vector network analyser's S11 becomes the equivalent step response.\n\n" +
            "Example:\n  cablefault convert feeder.s1p -o feeder-step.csv --window hann")
        {
            input, output, window,
        };
        command.SetAction(parsed =>
        {
            var loaded = TraceFiles.Load(parsed.GetValue(input)!, TraceFiles.TransformFor(parsed.GetValue(window)));
            foreach (string warning in loaded.Warnings) context.Warn(warning);
            var trace = loaded.Trace;
            if (parsed.GetValue(output) is FileInfo file)
            {
                AtomicFile.WriteText(file.FullName, writer => TraceCsvWriter.Write(trace, writer));
                string rise = trace.MetadataOrNull("rise_s") is string r && double.TryParse(r, NumberStyles.Float, CultureInfo.InvariantCulture, out double s)
                    ? string.Create(CultureInfo.InvariantCulture, $", equivalent rise {s * 1e9:G3} ns") : "";
                string alias = trace.MetadataOrNull("alias_free_s") is string a && double.TryParse(a, NumberStyles.Float, CultureInfo.InvariantCulture, out double t)
                    ? string.Create(CultureInfo.InvariantCulture, $", alias-free to {t * 1e9:G4} ns round trip") : "";
                context.Error.WriteLine($"wrote {file.Name}: {trace.Length} samples{rise}{alias}");
            }
            else
            {
                TraceCsvWriter.Write(trace, context.Output);
            }
            return CliApp.Success;
        });
        return command;
    }
}
