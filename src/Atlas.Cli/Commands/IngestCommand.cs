using System.CommandLine;
using System.Text.Json;
using Atlas.Ingest.Progress;
using Atlas.Ingest.Worker;
using Atlas.Storage;
using Atlas.Storage.Jobs;
using Microsoft.Extensions.DependencyInjection;

namespace Atlas.Cli.Commands;

/// <summary><c>atlas ingest FILE... --dataset SLUG</c>: queue an ingest job and run it here at once.</summary>
public static class IngestCommand
{
    public static Command Build()
    {
        var files = new Argument<string[]>("files") { Description = "CF-NetCDF hindcast files (classic, 64-bit offset, CDF5 or NetCDF-4)", Arity = ArgumentArity.OneOrMore };
        var dataset = new Option<string>("--dataset") { Description = "Slug of the dataset to load into (created if new): lower-case letters, digits and dashes", Required = true };
        var title = new Option<string?>("--title") { Description = "Title of a new dataset (default: the files' title attribute)" };
        var replace = new Option<bool>("--replace") { Description = "Replace time steps that are already stored with other values instead of refusing the file (a step given again with identical values is stored once without it)" };
        var mapping = new Option<string?>("--mapping") { Description = "JSON file naming the variables of a model that does not use CF standard names" };
        var noStats = new Option<bool>("--no-stats") { Description = "Do not compute statistics afterwards" };
        var command = new Command("ingest", "Load hindcast fields from CF-NetCDF files into a dataset.") { files, dataset, title, replace, mapping, noStats };
        command.SetAction(async (parse, cancel) =>
        {
            await using var dataSource = await AtlasDatabase.OpenMigratedAsync(cancel: cancel);
            using var host = CommandHost.BuildChecked(dataSource, "ingest");
            if (host is null) return 2;
            var runner = host.Services.GetRequiredService<JobRunner>();
            var queue = new JobQueue(dataSource);
            var payload = new IngestPayload(parse.GetValue(files)!.Select(Path.GetFullPath).ToArray(), parse.GetValue(title),
                parse.GetValue(replace), parse.GetValue(mapping) is { } m ? Path.GetFullPath(m) : null, QueueStatistics: false);
            var slug = parse.GetValue(dataset)!;
            var id = await queue.EnqueueAsync(JobKind.Ingest, slug, JsonSerializer.Serialize(payload), cancel);
            var job = await queue.ClaimAsync(id, CommandWorker.Name, cancel) ?? throw new InvalidOperationException($"Job {id} was claimed by another worker.");
            try
            {
                Console.WriteLine(await runner.RunAsync(job, new ConsoleProgress(), cancel));
            }
            catch (Exception e) when (e is not OperationCanceledException)
            {
                Console.Error.WriteLine($"atlas ingest: {e.Message}");
                Console.Error.WriteLine("Nothing was changed in the dataset.");
                return 2;
            }
            if (!parse.GetValue(noStats)) return await StatsCommand.RunAsync(dataSource, runner, slug, all: false, cancel);
            return 0;
        });
        return command;
    }
}

/// <summary>The worker name the command line claims its own jobs under.</summary>
public static class CommandWorker
{
    public static string Name => $"cli:{Environment.MachineName}:{Environment.ProcessId}";
}
