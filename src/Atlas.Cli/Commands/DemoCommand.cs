using System.CommandLine;
using System.Text.Json;
using Atlas.Assessment.Access;
using Atlas.Assessment.Yield;
using Atlas.Cli.Demo;
using Atlas.Demo;
using Atlas.Ingest.Assessment;
using Atlas.Ingest.Progress;
using Atlas.Ingest.Validation;
using Atlas.Ingest.Worker;
using Atlas.Storage;
using Atlas.Storage.Datasets;
using Atlas.Storage.Devices;
using Atlas.Storage.Jobs;
using Atlas.Storage.Stations;
using Microsoft.Extensions.DependencyInjection;
using Npgsql;

namespace Atlas.Cli.Commands;

/// <summary>
/// <c>atlas demo</c>: generate the invented demo scenario (once), ingest it (files already loaded are skipped by
/// checksum, so re-running duplicates nothing), compute the statistics of changed cells, and optionally serve.
/// </summary>
public static class DemoCommand
{
    public const string DatasetSlug = "skelvane-reach";

    /// <summary>The dataset of the demo's spectra at its output points, loaded beside <see cref="DatasetSlug"/>.</summary>
    public const string PointsDatasetSlug = "skelvane-reach-points";

    private static async Task<FileStream> AcquireLockAsync(string path, CancellationToken cancel)
    {
        var announced = false;
        while (true)
        {
            try
            {
                return new FileStream(path, FileMode.OpenOrCreate, FileAccess.ReadWrite, FileShare.None);
            }
            catch (IOException)
            {
                if (!announced) Console.WriteLine("atlas demo: another demo run is in progress; waiting for it to finish");
                announced = true;
                await Task.Delay(1000, cancel);
            }
        }
    }

    public static Command Build()
    {
        var serve = new Option<bool>("--serve") { Description = "Serve the atlas when the demo is loaded" };
        var regenerate = new Option<bool>("--regenerate") { Description = "Write the demo files again even if they exist" };
        var months = new Option<int>("--months") { Description = "Months of hindcast to generate, from January 2021 (a shorter demo loads faster)", DefaultValueFactory = _ => DemoScenarioOptions.Full.Months };
        var command = new Command("demo", "Generate, load and (with --serve) serve the invented demo coast.") { serve, regenerate, months };
        command.SetAction(async (parse, cancel) =>
        {
            var folder = Path.Combine(AtlasHome.Resolve(), "demo");
            Directory.CreateDirectory(folder);
            // One demo run at a time per home: two runs writing the same files would corrupt them.
            using var demoLock = await AcquireLockAsync(Path.Combine(AtlasHome.Resolve(), "demo.lock"), cancel);
            var options = DemoScenarioOptions.Full with { Months = parse.GetValue(months) };
            try { options.Validate(); }
            catch (ArgumentOutOfRangeException e)
            {
                Console.Error.WriteLine($"atlas demo: {e.Message}");
                return 2;
            }
            var scenario = DemoScenario.Describe(options);
            var files = scenario.FieldFiles.Select(f => Path.Combine(folder, f)).ToArray();
            var pointFiles = scenario.PointFiles.Select(f => Path.Combine(folder, f)).ToArray();
            if (parse.GetValue(regenerate) || !files.All(File.Exists) || !pointFiles.All(File.Exists) || !File.Exists(Path.Combine(folder, DemoScenario.ManifestFileName)))
            {
                Console.WriteLine($"atlas demo: generating {scenario.Name} into {folder}");
                var display = new ConsoleProgress();
                var started = DateTime.UtcNow;
                var output = DemoScenarioWriter.Write(folder, options,
                    new Progress<DemoProgress>(p => display.Report(new ProgressSnapshot("generating", p.Done, p.Total, 0, DateTime.UtcNow - started, "files"))));
                Console.WriteLine($"atlas demo: wrote {output.Files.Count} files ({output.TotalBytes / 1e6:F0} MB) in {ProgressSnapshot.FormatDuration(output.Elapsed)}");
            }
            else Console.WriteLine($"atlas demo: using the files already generated in {folder}");
            foreach (var line in scenario.DescribeLines()) Console.WriteLine("  " + line);

            await using var dataSource = await AtlasDatabase.OpenMigratedAsync(cancel: cancel);
            using var host = CommandHost.BuildChecked(dataSource, "demo");
            if (host is null) return 2;
            var runner = host.Services.GetRequiredService<JobRunner>();
            var payload = new IngestPayload(files, $"{scenario.Name} (invented demo coast)", QueueStatistics: false);
            var ingest = await CommandLineJob.RunAsync(dataSource, runner, JobKind.Ingest, DatasetSlug, payload, "demo", afterFailure: null, cancel);
            if (ingest != 0) return ingest;
            var stats = await StatsCommand.RunAsync(dataSource, runner, DatasetSlug, all: false, cancel);
            if (stats != 0) return stats;
            // The spectra at the output points, beside the gridded dataset of the same hindcast.
            var points = new IngestPayload(pointFiles, $"{scenario.Name} output points (invented demo coast)", QueueStatistics: false, GridDataset: DatasetSlug);
            var pointsIngest = await CommandLineJob.RunAsync(dataSource, runner, JobKind.Ingest, PointsDatasetSlug, points, "demo", afterFailure: null, cancel);
            if (pointsIngest != 0) return pointsIngest;
            var pointsStats = await StatsCommand.RunAsync(dataSource, runner, PointsDatasetSlug, all: false, cancel);
            if (pointsStats != 0) return pointsStats;
            var assessment = await LoadAssessmentAsync(dataSource, folder, cancel);
            if (assessment != 0) return assessment;
            if (!parse.GetValue(serve))
            {
                Console.WriteLine($"atlas demo: loaded; run 'atlas serve' and open {ServeCommand.Url}/");
                return 0;
            }
            Console.WriteLine($"atlas demo: loaded; serving at {ServeCommand.Url}/ (dataset '{DatasetSlug}': {ServeCommand.Url}/api/v1/datasets/{DatasetSlug})");
            Console.Out.Flush();
            // The server runs as `atlas serve` does, under the server's runtime settings (this process becomes it).
            ServerRuntimeSettings.ServeInstead(Environment.GetCommandLineArgs()[1..]);
            await ServeCommand.RunAsync(url => Console.WriteLine($"atlas demo: ready at {url}/"), cancel);
            return 0;
        });
        return command;
    }

    /// <summary>
    /// Registers the demo buoys and device from the manifest the generator wrote (matched by name and checksum, so a
    /// re-run stores nothing twice), validates the demo dataset against the buoys (summary into its metadata), and
    /// computes the device's yield layer and an accessibility layer so that the map shows them at once.
    /// </summary>
    private static async Task<int> LoadAssessmentAsync(NpgsqlDataSource dataSource, string folder, CancellationToken cancel)
    {
        try
        {
            var (stations, device) = DemoReferenceFiles.Read(folder, DemoScenario.ManifestFileName);
            var loader = new StationLoader(dataSource);
            foreach (var s in stations)
                Console.WriteLine("atlas demo: " + (await loader.LoadAsync(
                    new StationLoadRequest(s.Name, s.Latitude, s.Longitude, s.DepthMetres, s.Instrument, s.Role, s.FilePath), cancel)).Describe());
            var loaded = await new DeviceLoader(dataSource).LoadAsync(device.Name, device.FilePath, device.RatedPowerKw, cancel);
            Console.WriteLine("atlas demo: " + loaded.Describe());

            var validated = await ValidateCommand.RunAsync(dataSource, DatasetSlug, null, cancel);
            if (validated != 0) return validated;

            var dataset = (await new DatasetStore(dataSource).FindAsync(DatasetSlug, cancel))!;
            var layers = new AssessmentLayerBuilder(dataSource);
            var clock = System.Diagnostics.Stopwatch.StartNew();
            var yield = await layers.YieldAsync(dataset, loaded.Device, PowerMatrixInterpolation.Bilinear, cancel);
            Console.WriteLine($"atlas demo: yield layer of {loaded.Device.Name}: {yield.CellIds.Length:N0} cells in {ProgressSnapshot.FormatDuration(clock.Elapsed)}");
            clock.Restart();
            var access = await layers.AccessibilityAsync(dataset, new AccessLimits(DemoAccessHsMetres), null, cancel);
            Console.WriteLine($"atlas demo: accessibility layer (Hs <= {DemoAccessHsMetres} m): {access.CellIds.Length:N0} cells in {ProgressSnapshot.FormatDuration(clock.Elapsed)}");
            return 0;
        }
        catch (Exception e) when (e is FormatException or ArgumentException or IOException or DuplicateStationException or DuplicateDeviceException)
        {
            Console.Error.WriteLine($"atlas demo: {e.Message}");
            return 2;
        }
    }

    /// <summary>The Hs limit of the accessibility layer the demo prepares, m (a typical crew-transfer limit, common practice).</summary>
    public const double DemoAccessHsMetres = 1.5;
}
