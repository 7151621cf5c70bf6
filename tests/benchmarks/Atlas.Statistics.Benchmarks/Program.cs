using System.Diagnostics;
using Atlas.Statistics;
using Atlas.Statistics.Benchmarks;

// Times the layer pass (BinnedCellCalculator) on invented hourly cells and reports nanoseconds per step, by
// wall clock and by the process's CPU time (the machine is shared, so CPU time is the steadier figure). Each case
// runs three times and the best run is kept. For a ratio measured in the same run, a sample of cells also goes
// through the exact point analysis (sorting every period), the straightforward way to get the same statistics.
// Usage: dotnet run -c Release --project tests/benchmarks/Atlas.Statistics.Benchmarks [cells] [threads]
// Defaults: the 15,000 cells x 8,760 hourly steps of the shared benchmark fixture, on 2 threads.
int cells = args.Length > 0 ? int.Parse(args[0]) : 15_000;
int threads = args.Length > 1 ? int.Parse(args[1]) : 2;
const int hoursPerYear = 8760;

Console.WriteLine($"Layer pass benchmark: {cells} cells, {threads} threads, {Environment.ProcessorCount} processors, " +
                  $"load average {LoadAverage()}");
Report("Hs + Te, depth unknown (the benchmark fixture), 1 year", new SyntheticCells(hoursPerYear, 64, allParameters: false), cells);
Report("Hs, Te, Tp, dir, spread, finite depth, 1 year", new SyntheticCells(hoursPerYear, 64, allParameters: true), cells);
Report("Hs + Te, depth unknown, 10 years", new SyntheticCells(10 * hoursPerYear, 8, allParameters: false), cells / 10);

void Report(string title, SyntheticCells data, int n)
{
    long totalSteps = (long)n * data.Times.Length;
    var warm = new BinnedCellCalculator();
    for (int i = 0; i < 300; i++) warm.Compute(data.Cell(i));

    double bestWall = double.MaxValue, bestCpu = double.MaxValue;
    for (int repeat = 0; repeat < 3; repeat++)
    {
        var process = Process.GetCurrentProcess();
        TimeSpan cpuBefore = process.TotalProcessorTime;
        var watch = Stopwatch.StartNew();
        Parallel.For(0, threads, new ParallelOptions { MaxDegreeOfParallelism = threads }, t =>
        {
            var calculator = new BinnedCellCalculator();
            for (int i = t; i < n; i += threads) calculator.Compute(data.Cell(i));
        });
        bestWall = Math.Min(bestWall, watch.Elapsed.TotalSeconds);
        process.Refresh();
        bestCpu = Math.Min(bestCpu, (process.TotalProcessorTime - cpuBefore).TotalSeconds);
    }

    int sample = Math.Max(4, n / 100);
    for (int i = 0; i < 4; i++) ExactPointAnalysis.Analyse(data.Cell(i));
    var current = Process.GetCurrentProcess();
    TimeSpan exactBefore = current.TotalProcessorTime;
    for (int i = 0; i < sample; i++) ExactPointAnalysis.Analyse(data.Cell(i));
    current.Refresh();
    double exactNs = (current.TotalProcessorTime - exactBefore).TotalNanoseconds / ((long)sample * data.Times.Length);

    double cpuNs = bestCpu * 1e9 / totalSteps;
    Console.WriteLine($"- {title}: {n} cells in {bestWall:F2} s wall; {bestWall * 1e9 * threads / totalSteps:F1} ns/step per core by wall clock, " +
                      $"{cpuNs:F1} ns/step by CPU time; exact point analysis {exactNs:F0} ns/step by CPU time ({exactNs / cpuNs:F0}x the layer pass)");
}

static string LoadAverage()
{
    try { return File.ReadAllText("/proc/loadavg").Split(' ')[0]; }
    catch (IOException) { return "unknown"; }
}
