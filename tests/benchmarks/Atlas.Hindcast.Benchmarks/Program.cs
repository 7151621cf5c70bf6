// Read-speed benchmark of HindcastFile.ReadSteps against two peers measured in the same run:
// reading the file's bytes from the page cache (the floor) and netCDF4-python reading the same two variables.
//
// Usage: dotnet run -c Release --project tests/benchmarks/Atlas.Hindcast.Benchmarks -- FILE [--rows N] [--runs N] [--no-python]
// FILE: e.g. /tmp/big.nc from `/usr/bin/python3 ../shared/bench/make_hindcast.py 150 100 8760 /tmp/big.nc` (1.05 GB).
using System.Diagnostics;
using System.Globalization;
using Atlas.Hindcast;

if (args.Length == 0)
{
    Console.Error.WriteLine("usage: Atlas.Hindcast.Benchmarks FILE [--rows N] [--runs N] [--no-python]");
    return 2;
}
string path = args[0];
int rowsPerBlock = Option("--rows", 20);
int runs = Option("--runs", 3);
bool python = !args.Contains("--no-python");

long fileBytes = new FileInfo(path).Length;
Console.WriteLine($"file {path}: {fileBytes / 1e6:F0} MB");

// Warm the page cache, then time a plain sequential read of every byte.
ReadBytes(path);
var raw = Best(runs, () => ReadBytes(path));
Console.WriteLine($"page-cache read of the file bytes: {raw:F3} s ({fileBytes / 1e6 / raw:F0} MB/s)");

using var file = HindcastFile.Open(path);
int steps = file.TimesUtc.Count, points = file.Grid.PointCount;
int nx = file.Grid is StructuredGrid g ? g.Nx : points;
int blockPoints = Math.Min(points, rowsPerBlock * nx);
long decodedBytes = 2L * steps * points * sizeof(float);
Console.WriteLine($"{file.Format}, {file.Grid.Kind} grid, {points} points x {steps} steps; blocks of {blockPoints} points x all steps");

var buffer = new float[(long)steps * blockPoints];
double checksum = 0;
var blocks = Best(runs, () =>
{
    checksum = 0;
    foreach (var v in new[] { WaveParameter.Hs, WaveParameter.Te })
        for (int p = 0; p < points; p += blockPoints)
        {
            int n = Math.Min(blockPoints, points - p);
            file.ReadSteps(v, 0, steps, p, n, buffer.AsSpan(0, steps * n));
            checksum += buffer[0] + buffer[steps * n - 1]; // touch the data without timing a full pass over it
        }
});
Console.WriteLine($"ReadSteps Hs+Te by point blocks: {blocks:F3} s ({decodedBytes / 1e6 / blocks:F0} MB/s decoded), checksum {checksum:F1}");

// The same data read time-slab by time-slab (all points, 24 steps at a time), the layout's natural order.
var slab = new float[24L * points];
var slabs = Best(runs, () =>
{
    foreach (var v in new[] { WaveParameter.Hs, WaveParameter.Te })
        for (int t = 0; t < steps; t += 24)
        {
            int n = Math.Min(24, steps - t);
            file.ReadSteps(v, t, n, 0, points, slab.AsSpan(0, n * points));
        }
});
Console.WriteLine($"ReadSteps Hs+Te by time slabs:   {slabs:F3} s ({decodedBytes / 1e6 / slabs:F0} MB/s decoded)");
Console.WriteLine($"ratio point blocks / page-cache read: {blocks / raw:F2}");

if (python)
{
    // netCDF4-python reading the whole of both variables (auto mask and scale on), timed inside the interpreter.
    const string script = "import sys,time,netCDF4\nd=netCDF4.Dataset(sys.argv[1])\nbest=1e9\nfor _ in range(int(sys.argv[2])):\n" +
                          "    t=time.perf_counter(); a=d['hs'][:]; b=d['te'][:]; best=min(best,time.perf_counter()-t)\nprint(best)";
    var start = new ProcessStartInfo("/usr/bin/python3") { RedirectStandardOutput = true };
    foreach (var a in new[] { "-c", script, path, runs.ToString(CultureInfo.InvariantCulture) }) start.ArgumentList.Add(a);
    using var process = Process.Start(start)!;
    double peer = double.Parse(process.StandardOutput.ReadToEnd().Trim(), CultureInfo.InvariantCulture);
    process.WaitForExit();
    Console.WriteLine($"netCDF4-python hs[:] and te[:]:  {peer:F3} s ({decodedBytes / 1e6 / peer:F0} MB/s)");
    Console.WriteLine($"ratio point blocks / netCDF4-python: {blocks / peer:F2}");
}
return 0;

int Option(string name, int fallback)
{
    int i = Array.IndexOf(args, name);
    return i >= 0 && i + 1 < args.Length ? int.Parse(args[i + 1], CultureInfo.InvariantCulture) : fallback;
}

// Best wall time of several runs; the CPU time of that run is printed too, since on a shared machine the wall
// time also measures the other users.
static double Best(int runs, Action action)
{
    double best = double.MaxValue, cpu = 0;
    using var self = Process.GetCurrentProcess();
    for (int r = 0; r < runs; r++)
    {
        self.Refresh();
        var cpuBefore = self.TotalProcessorTime;
        var watch = Stopwatch.StartNew();
        action();
        double wall = watch.Elapsed.TotalSeconds;
        self.Refresh();
        if (wall < best) (best, cpu) = (wall, (self.TotalProcessorTime - cpuBefore).TotalSeconds);
    }
    Console.Write($"  [best of {runs}: wall {best:F3} s, cpu {cpu:F3} s] ");
    return best;
}

static void ReadBytes(string path)
{
    var chunk = new byte[4 << 20];
    using var stream = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 1, FileOptions.SequentialScan);
    while (stream.Read(chunk) > 0) { }
}
