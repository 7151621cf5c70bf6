using System.CommandLine;
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

    /// <summary>Queues a statistics pass over <paramref name="slug"/> and runs it here; the exit code.</summary>
    public static Task<int> RunAsync(NpgsqlDataSource dataSource, JobRunner runner, string slug, bool all, CancellationToken cancel) =>
        CommandLineJob.RunAsync(dataSource, runner, JobKind.Statistics, slug, new StatisticsPayload(all), "stats", afterFailure: null, cancel);
}
