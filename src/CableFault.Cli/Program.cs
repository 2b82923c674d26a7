using CableFault.Cli;

return CliApp.Run(args, Console.Out, Console.Error);
