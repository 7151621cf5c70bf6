using System.Diagnostics;
using System.Threading.Channels;

namespace Atlas.Demo;

/// <summary>
/// Generates the whole demo into a folder: one CF NetCDF-4 hindcast file per calendar month
/// (<c>skelvane-reach-YYYY-MM.nc</c>), the two buoy records (CSV), the device power matrix (CSV),
/// the station list (<c>stations.csv</c>) and the manifest (<c>scenario.json</c>). Existing files
/// of the same names are replaced, and hindcast files of this demo left by an earlier, longer run
/// (<c>skelvane-reach-*.nc</c> not in this scenario) are deleted so that a folder never mixes two
/// runs; nothing else in the folder is touched. Months are generated in
/// parallel over cells while the previous month is being written (netCDF-C writes one file at a
/// time), with two month-sized buffers in turn.
/// </summary>
public static class DemoScenarioWriter
{
    /// <summary>Writes the scenario <paramref name="options"/> select (the full demo when null) into <paramref name="outputFolder"/>.</summary>
    public static DemoScenarioOutput Write(string outputFolder, DemoScenarioOptions? options = null, IProgress<DemoProgress>? progress = null)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(outputFolder);
        options ??= DemoScenarioOptions.Full;
        options.Validate();
        var clock = Stopwatch.StartNew();
        string folder = Path.GetFullPath(outputFolder);
        Directory.CreateDirectory(folder);

        var grid = new DemoGrid(options.Columns, options.Rows);
        var scenario = DemoScenario.Describe(options, grid);
        var model = new SeaStateModel(grid, new OffshoreForcing(options.Seed, options.Start, options.End));
        RemoveStaleFieldFiles(folder, scenario);
        int total = scenario.FieldFiles.Count + scenario.PointFiles.Count + scenario.Buoys.Count + 3;
        int done = 0;
        var files = new List<DemoFile>();
        void Report(string name)
        {
            files.Add(new DemoFile(name, new FileInfo(Path.Combine(folder, name)).Length));
            progress?.Report(new DemoProgress(++done, total, name));
        }

        WriteFields(folder, options, scenario, grid, model, Report);
        var outputPoints = DemoOutputPoints.Place(grid);
        foreach (var year in scenario.Years)
        {
            var name = SpectralPointsFileWriter.FileName(year);
            SpectralPointsFileWriter.Write(Path.Combine(folder, name), scenario, model, outputPoints, year);
            Report(name);
        }

        foreach (var (buoy, cell, stream) in DemoStations.Place(grid, options.BuoyIntervalMinutes))
        {
            var rows = BuoyRecordSimulator.Simulate(model, cell, buoy, options.Start, options.End, new Xoshiro256StarStar(options.Seed, stream));
            BuoyRecordCsvWriter.Write(Path.Combine(folder, buoy.FileName), rows);
            Report(buoy.FileName);
        }
        PowerMatrixCsvWriter.Write(Path.Combine(folder, scenario.Device.FileName), DemoStations.DevicePowerMatrix());
        Report(scenario.Device.FileName);
        DemoManifestWriter.WriteStationList(Path.Combine(folder, DemoScenario.StationListFileName), scenario);
        Report(DemoScenario.StationListFileName);
        DemoManifestWriter.WriteManifest(Path.Combine(folder, DemoScenario.ManifestFileName), scenario);
        Report(DemoScenario.ManifestFileName);
        return new DemoScenarioOutput(folder, scenario, files, clock.Elapsed);
    }

    private static void WriteFields(string folder, DemoScenarioOptions options, DemoScenario scenario, DemoGrid grid, SeaStateModel model, Action<string> report)
    {
        // Two sets of buffers take turns: one is filled while the other is written, so memory
        // stays at two months whatever the length of the run.
        var toWrite = Channel.CreateBounded<MonthlyFields>(new BoundedChannelOptions(1) { SingleReader = true, SingleWriter = true });
        var free = Channel.CreateUnbounded<MonthlyFields>();
        int cells = grid.Columns * grid.Rows;
        free.Writer.TryWrite(new MonthlyFields(cells, options.StepHours));
        free.Writer.TryWrite(new MonthlyFields(cells, options.StepHours));
        var writing = Task.Run(async () =>
        {
            try
            {
                await foreach (var fields in toWrite.Reader.ReadAllAsync().ConfigureAwait(false))
                {
                    string name = DemoScenario.FieldFileName(fields.Month);
                    MonthlyHindcastFileWriter.Write(Path.Combine(folder, name), scenario, grid, fields);
                    report(name);
                    free.Writer.TryWrite(fields);
                }
            }
            catch (Exception failure)
            {
                // Closing the channels releases the producer, whichever it waits on.
                toWrite.Writer.TryComplete(failure);
                free.Writer.TryComplete(failure);
                throw;
            }
        });
        try
        {
            for (int m = 0; m < options.Months; m++)
            {
                try
                {
                    var fields = free.Reader.ReadAsync().AsTask().GetAwaiter().GetResult();
                    fields.Fill(model, options.Start.AddMonths(m), options.StepHours);
                    fields.RoundToSignificantBits(MonthlyHindcastFileWriter.KeptMantissaBits);
                    toWrite.Writer.WriteAsync(fields).AsTask().GetAwaiter().GetResult();
                }
                catch (ChannelClosedException)
                {
                    // The writer failed; its own exception is rethrown below.
                    break;
                }
            }
        }
        finally
        {
            toWrite.Writer.TryComplete();
        }
        writing.GetAwaiter().GetResult();
    }

    private static void RemoveStaleFieldFiles(string folder, DemoScenario scenario)
    {
        var current = new HashSet<string>(scenario.FieldFiles.Concat(scenario.PointFiles), StringComparer.Ordinal);
        foreach (string path in Directory.EnumerateFiles(folder, DemoScenario.FieldFileStem + "-*.nc"))
            if (!current.Contains(Path.GetFileName(path)))
                File.Delete(path);
    }
}
