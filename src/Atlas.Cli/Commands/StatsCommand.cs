using System.CommandLine;
using Atlas.Ingest.Ingestion;
using Atlas.Ingest.Statistics;
using Atlas.Ingest.Worker;
using Atlas.Storage;
using Atlas.Storage.Jobs;
using Atlas.Storage.Passes;
using Microsoft.Extensions.DependencyInjection;
using Npgsql;

namespace Atlas.Cli.Commands;

/// <summary>
/// <c>atlas stats SLUG [--all] [--queue]</c>: compute the statistics of the cells whose series changed (or all), here
/// at once, or queued in parts for any workers.
/// </summary>
public static class StatsCommand
{
    public static Command Build()
    {
        var dataset = new Argument<string>("dataset") { Description = "Slug of the dataset" };
        var all = new Option<bool>("--all") { Description = "Recompute every cell, not only those whose series changed" };
        var queue = new Option<bool>("--queue")
        {
            Description = "Queue the pass in parts (blocks of cells) for any workers to run (atlas worker) instead of running it here; " +
                          "the new statistics are served once every part is done",
        };
        var partCells = new Option<int>("--part-cells")
        {
            Description = "With --queue: cell ids per part, rounded down to whole blocks of 1,024",
            DefaultValueFactory = _ => StatisticsPasses.DefaultPartCells,
        };
        var command = new Command("stats", "Compute monthly, seasonal, annual and per-year statistics for every cell.") { dataset, all, queue, partCells };
        partCells.Validators.Add(result =>
        {
            if (result.GetValueOrDefault<int>() < 1) result.AddError("--part-cells: give a positive number of cell ids per part, such as 4096.");
        });
        command.SetAction(async (parse, cancel) =>
        {
            // The kernel compiles while the command connects and sets up, not while the pass waits for it.
            if (!parse.GetValue(queue)) HotMethodWarmup.Start();
            await using var dataSource = await AtlasDatabase.OpenMigratedAsync(cancel: cancel);
            using var host = CommandHost.BuildChecked(dataSource, "stats");
            if (host is null) return 2;
            var slug = parse.GetValue(dataset)!;
            if (!parse.GetValue(queue))
                return await RunAsync(dataSource, host.Services.GetRequiredService<JobRunner>(), slug, parse.GetValue(all), cancel);
            return await QueueAsync(host.Services.GetRequiredService<StatisticsPasses>(), slug, parse.GetValue(all), parse.GetValue(partCells), cancel);
        });
        return command;
    }

    /// <summary>Queues a pass over <paramref name="slug"/> in parts and says so; the exit code (2 when refused).</summary>
    public static async Task<int> QueueAsync(StatisticsPasses passes, string slug, bool all, int partCells, CancellationToken cancel)
    {
        try
        {
            var queued = await passes.QueueAsync(slug, all, partCells, cancel);
            Console.WriteLine(queued?.Describe() ?? $"statistics {slug}: up to date (no cell's series changed); nothing queued");
            return 0;
        }
        catch (Exception e) when (e is PassOpenException or IngestException)
        {
            Console.Error.WriteLine($"atlas stats: {e.Message}");
            return 2;
        }
    }

    /// <summary>Queues a statistics pass over <paramref name="slug"/> and runs it here; the exit code.</summary>
    public static Task<int> RunAsync(NpgsqlDataSource dataSource, JobRunner runner, string slug, bool all, CancellationToken cancel) =>
        CommandLineJob.RunAsync(dataSource, runner, JobKind.Statistics, slug, new StatisticsPayload(all), "stats", afterFailure: null, cancel);
}
