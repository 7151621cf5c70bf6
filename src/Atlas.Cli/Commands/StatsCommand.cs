using System.CommandLine;
using System.Text.Json;
using Atlas.Ingest.Progress;
using Atlas.Ingest.Worker;
using Atlas.Storage;
using Atlas.Storage.Jobs;
using Microsoft.Extensions.DependencyInjection;
using Npgsql;

namespace Atlas.Cli.Commands;

/// <summary><c>atlas stats SLUG</c>: compute the statistics of the cells whose series changed.</summary>
public static class StatsCommand
{
    public static Command Build()
    {
        var dataset = new Argument<string>("dataset") { Description = "Slug of the dataset" };
        var all = new Option<bool>("--all") { Description = "Recompute every cell, not only those whose series changed" };
        var command = new Command("stats", "Compute monthly, seasonal, annual and per-year statistics for every cell.") { dataset, all };
        command.SetAction(async (parse, cancel) =>
        {
            await using var dataSource = await AtlasDatabase.OpenMigratedAsync(cancel: cancel);
            using var host = CommandHost.BuildChecked(dataSource, "stats");
            if (host is null) return 2;
            return await RunAsync(dataSource, host.Services.GetRequiredService<JobRunner>(), parse.GetValue(dataset)!, parse.GetValue(all), cancel);
        });
        return command;
    }

    public static async Task<int> RunAsync(NpgsqlDataSource dataSource, JobRunner runner, string slug, bool all, CancellationToken cancel)
    {
        var queue = new JobQueue(dataSource);
        var id = await queue.EnqueueAsync(JobKind.Statistics, slug, JsonSerializer.Serialize(new StatisticsPayload(all)), cancel);
        var job = await queue.ClaimAsync(id, CommandWorker.Name, cancel) ?? throw new InvalidOperationException($"Job {id} was claimed by another worker.");
        try
        {
            Console.WriteLine(await runner.RunAsync(job, new ConsoleProgress(), cancel));
            return 0;
        }
        catch (Exception e) when (e is not OperationCanceledException)
        {
            Console.Error.WriteLine($"atlas stats: {e.Message}");
            return 2;
        }
    }
}
