using System.CommandLine;
using Atlas.Cli.Datasets;
using Atlas.Storage;
using Atlas.Storage.Datasets;
using Atlas.Storage.Jobs;
using Atlas.Storage.Passes;
using Npgsql;

namespace Atlas.Cli.Commands;

/// <summary>
/// <c>atlas datasets list|show|remove</c>: what is stored, one dataset in full, and its removal. Exit codes: 0 done;
/// 1 the operator declined the removal; 2 an unknown dataset, a removal refused (not confirmed on a terminal and no
/// --yes, or a job of the dataset running).
/// </summary>
public static class DatasetsCommand
{
    public static Command Build() => ReferenceCommands.Group("datasets", "List the stored datasets, describe one, or remove one.",
        ReferenceCommands.List("List the stored datasets, one line each.", "No dataset is stored (atlas ingest or atlas demo loads one).",
            SummariesAsync, DatasetReport.Line),
        Show(),
        Remove());

    private static async Task<IReadOnlyList<DatasetSummary>> SummariesAsync(NpgsqlDataSource dataSource, CancellationToken cancel)
    {
        var store = new DatasetStore(dataSource);
        var summaries = new List<DatasetSummary>();
        foreach (var dataset in await store.ListAsync(cancel))
            if (await store.SummariseAsync(dataset.Slug, cancel) is { } summary) summaries.Add(summary);
        return summaries;
    }

    private static Command Show()
    {
        var slug = new Argument<string>("dataset") { Description = "Slug of the dataset" };
        var command = new Command("show", "Describe one dataset: extent, cells, years, variables and ingest assumptions, stored size, statistics, jobs.") { slug };
        command.SetAction(async (parse, cancel) =>
        {
            await using var dataSource = await AtlasDatabase.OpenMigratedAsync(cancel: cancel);
            var store = new DatasetStore(dataSource);
            if (await store.SummariseAsync(parse.GetValue(slug)!, cancel) is not { } summary) return Unknown("show", parse.GetValue(slug)!);
            var storage = await store.StorageAsync(summary.Dataset.Id, cancel);
            var jobs = await new JobQueue(dataSource).ForDatasetAsync(summary.Dataset.Slug, cancel);
            var passes = await new PassStore(dataSource).ProgressAsync(summary.Dataset.Slug, cancel: cancel);
            Console.Write(DatasetReport.Describe(summary, storage, jobs, passes));
            return 0;
        });
        return command;
    }

    private static Command Remove()
    {
        var slug = new Argument<string>("dataset") { Description = "Slug of the dataset" };
        var yes = new Option<bool>("--yes") { Description = "Remove without asking (required when the input is not a terminal)" };
        var command = new Command("remove",
            "Remove a dataset and everything stored for it (series, statistics, time lines, source file records, jobs) in one transaction. " +
            "Asks first unless --yes; refuses while a job of the dataset runs.") { slug, yes };
        command.SetAction(async (parse, cancel) =>
        {
            var name = parse.GetValue(slug)!;
            await using var dataSource = await AtlasDatabase.OpenMigratedAsync(cancel: cancel);
            var store = new DatasetStore(dataSource);
            if (await store.SummariseAsync(name, cancel) is not { } summary) return Unknown("remove", name);
            var storage = await store.StorageAsync(summary.Dataset.Id, cancel);
            var what = DatasetReport.Contents(summary, storage);
            if (!parse.GetValue(yes))
            {
                if (Console.IsInputRedirected)
                {
                    Console.Error.WriteLine($"atlas datasets remove: '{name}' was not removed: the input is not a terminal, so there is no one to confirm; add --yes to remove it.");
                    return 2;
                }
                Console.WriteLine($"Dataset '{name}' (\"{summary.Dataset.Title}\") holds {what}.");
                Console.Write("Type its slug to remove it and everything stored for it, or press Enter to keep it: ");
                if (Console.ReadLine()?.Trim() != name)
                {
                    Console.WriteLine($"'{name}' was kept.");
                    return 1;
                }
            }
            var removal = await store.DeleteAsync(name, cancel);
            switch (removal.Outcome)
            {
                case DatasetRemovalOutcome.Unknown:
                    return Unknown("remove", name);
                case DatasetRemovalOutcome.Busy:
                    Console.Error.WriteLine($"atlas datasets remove: '{name}' was not removed: {removal.BusyReason}. " +
                                            $"Nothing was changed; remove it once that has finished (atlas datasets show {name} lists its jobs).");
                    return 2;
                default:
                    Console.WriteLine($"dataset {name}: removed with {what}");
                    return 0;
            }
        });
        return command;
    }

    private static int Unknown(string verb, string slug)
    {
        Console.Error.WriteLine($"atlas datasets {verb}: there is no dataset '{slug}' (atlas datasets list)");
        return 2;
    }
}
