using System.Diagnostics;
using Atlas.Statistics;
using Atlas.Statistics.Benchmarks;

// Times the layer pass (CellStatisticsCalculator) on invented hourly cells and reports nanoseconds per step.
// Usage: dotnet run -c Release --project tests/benchmarks/Atlas.Statistics.Benchmarks [cells] [threads]
// Defaults: the 15,000 cells x 8,760 hourly steps of the shared benchmark fixture, on 2 threads.
int cells = args.Length > 0 ? int.Parse(args[0]) : 15_000;
int threads = args.Length > 1 ? int.Parse(args[1]) : 2;
const int steps = 8760;

Console.WriteLine($"Layer pass: {cells} cells x {steps} hourly steps, {Environment.ProcessorCount} processors");
Report("Hs + Te, depth unknown (the benchmark fixture)", new SyntheticCells(steps, 64, allParameters: false));
Report("Hs, Te, Tp, dir, spread, finite depth", new SyntheticCells(steps, 64, allParameters: true));
Report("Hs + Te, ten years of hourly steps per cell", new SyntheticCells(10 * steps, 16, allParameters: false), cellDivisor: 10);

void Report(string title, SyntheticCells data, int cellDivisor = 1)
{
    int n = cells / cellDivisor;
    long totalSteps = (long)n * data.Times.Length;
    var warm = new CellStatisticsCalculator();
    for (int i = 0; i < 200; i++) warm.Compute(data.Cell(i));

    var single = new CellStatisticsCalculator();
    int singleCells = Math.Max(1, n / 5);
    var watch = Stopwatch.StartNew();
    for (int i = 0; i < singleCells; i++) single.Compute(data.Cell(i));
    double nsPerStepOneCore = watch.Elapsed.TotalNanoseconds / ((long)singleCells * data.Times.Length);

    watch.Restart();
    Parallel.For(0, threads, new ParallelOptions { MaxDegreeOfParallelism = threads }, t =>
    {
        var calculator = new CellStatisticsCalculator();
        for (int i = t; i < n; i += threads) calculator.Compute(data.Cell(i));
    });
    double wall = watch.Elapsed.TotalSeconds;
    Console.WriteLine($"- {title}: {nsPerStepOneCore:F1} ns/step on one core; {n} cells on {threads} threads in {wall:F2} s " +
                      $"({wall * 1e9 / totalSteps * threads:F1} ns/step per core)");
}
