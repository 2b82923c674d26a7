using BenchmarkDotNet.Running;
using CableFault.Benchmarks;

// Usage:
//   dotnet run -c Release --project tests/CableFault.Benchmarks -- forward        (BenchmarkDotNet: forward model vs one FFT)
//   dotnet run -c Release --project tests/CableFault.Benchmarks -- process [CLI.dll] [--native PATH]
//        (whole-process cablefault simulate vs ngspice; --native times a Native AOT build too, made with
//         dotnet publish src/CableFault.Cli -c Release -r linux-x64 -p:PublishAot=true -o out/native)
//   dotnet run -c Release --project tests/CableFault.Benchmarks -- accuracy [--cases N] [--out FILE]   (locate accuracy, Accuracy/)
//   dotnet run -c Release --project tests/CableFault.Benchmarks -- diagnose FILE VF Z0 [CABLE [SOURCE_OHMS]] (locate one trace file, every hypothesis shown)
//   dotnet run -c Release --project tests/CableFault.Benchmarks -- speed-traces [DIR] (write the locate speed traces, to profile by hand)
//   dotnet run -c Release --project tests/CableFault.Benchmarks -- batch [COUNT] (batch locate over COUNT traces, 1 vs 2 workers)
//   dotnet run -c Release --project tests/CableFault.Benchmarks -- history [COUNT] (run history: list and check with COUNT stored traces, default 10 000)
//   dotnet run -c Release --project tests/CableFault.Benchmarks -- --filter '*'   (any BenchmarkDotNet arguments)
string mode = args.Length > 0 ? args[0] : "forward";
switch (mode)
{
    case "forward":
        BenchmarkRunner.Run<ForwardModelBenchmark>(args: args.Skip(1).ToArray());
        break;
    case "process":
        return ProcessBenchmark.Run(args.Skip(1).ToArray());
    case "batch":
        return BatchBenchmark.Run(args.Skip(1).ToArray());
    case "history":
        return HistoryBenchmark.Run(args.Skip(1).ToArray());
    case "accuracy":
        return CableFault.Benchmarks.Accuracy.AccuracyBenchmark.Run(args.Skip(1).ToArray());
    case "speed-traces":
        CableFault.Benchmarks.Accuracy.LocateSpeed.WriteTraces(args.Length > 1 ? args[1] : "speed-traces");
        break;
    case "diagnose":
        return CableFault.Benchmarks.Accuracy.TraceDiagnosis.Run(args.Skip(1).ToArray());
    default:
        BenchmarkSwitcher.FromAssembly(typeof(ForwardModelBenchmark).Assembly).Run(args);
        break;
}
return 0;
