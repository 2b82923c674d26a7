using System.Text;
using CableFault.Cli;

// Standard output is buffered (a trace CSV is tens of thousands of lines; the console's line-by-line flushing would
// dominate the run time) and flushed once at the end. Standard error stays unbuffered for progress and errors.
using var output = new StreamWriter(Console.OpenStandardOutput(), new UTF8Encoding(false), 1 << 16) { AutoFlush = false };
int exitCode = CliApp.Run(args, output, Console.Error);
output.Flush();
return exitCode;
