using BenchmarkDotNet.Running;
using CableFault.Benchmarks;

// Usage:
//   dotnet run -c Release --project tests/CableFault.Benchmarks -- forward        (BenchmarkDotNet: forward model vs one FFT)
//   dotnet run -c Release --project tests/CableFault.Benchmarks -- process        (whole-process cablefault simulate vs ngspice)
//   dotnet run -c Release --project tests/CableFault.Benchmarks -- accuracy [--cases N] [--out FILE]   (locate accuracy, Accuracy/)
//   dotnet run -c Release --project tests/CableFault.Benchmarks -- --filter '*'   (any BenchmarkDotNet arguments)
string mode = args.Length > 0 ? args[0] : "forward";
switch (mode)
{
    case "forward":
        BenchmarkRunner.Run<ForwardModelBenchmark>(args: args.Skip(1).ToArray());
        break;
    case "process":
        return ProcessBenchmark.Run(args.Skip(1).ToArray());
    case "accuracy":
        return CableFault.Benchmarks.Accuracy.AccuracyBenchmark.Run(args.Skip(1).ToArray());
    default:
        BenchmarkSwitcher.FromAssembly(typeof(ForwardModelBenchmark).Assembly).Run(args);
        break;
}
return 0;
