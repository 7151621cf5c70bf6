using System.CommandLine;
using Atlas.Ingest.Ingestion;
using Atlas.Ingest.Statistics;
using Atlas.Ingest.Worker;
using Atlas.Storage;
using Atlas.Storage.Jobs;
using Atlas.Storage.Passes;
using Microsoft.Extensions.DependencyInjection;

namespace Atlas.Cli.Commands;

/// <summary>
/// <c>atlas ingest FILE... --dataset SLUG</c>: queue an ingest job and run it here at once; with <c>--queue</c>, queue it
/// (in parts for a new dataset) for any workers.
/// </summary>
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
        var gridDataset = new Option<string?>("--grid-dataset") { Description = "For files of spectra at output points: the slug of the gridded dataset of the same hindcast, whose point answers then add the exact spectral values at the nearest output point" };
        var queue = new Option<bool>("--queue")
        {
            Description = "Check the files and queue the load for any workers (atlas worker) instead of running it here: a new dataset in parts " +
                          "(ranges of grid rows) that several workers load at once, a load into an existing dataset as one job; statistics are not computed",
        };
        var partCells = new Option<int>("--part-cells")
        {
            Description = "With --queue: grid points per part, rounded to whole grid rows",
            DefaultValueFactory = _ => IngestInParts.DefaultPartCells,
        };
        partCells.Validators.Add(result =>
        {
            if (result.GetValueOrDefault<int>() < 1) result.AddError("--part-cells: give a positive number of grid points per part, such as 8192.");
        });
        var command = new Command("ingest", "Load hindcast fields, or spectra at output points, from CF-NetCDF files into a dataset.") { files, dataset, title, replace, mapping, noStats, gridDataset, queue, partCells };
        command.SetAction(async (parse, cancel) =>
        {
            await using var dataSource = await AtlasDatabase.OpenMigratedAsync(cancel: cancel);
            using var host = CommandHost.BuildChecked(dataSource, "ingest");
            if (host is null) return 2;
            var runner = host.Services.GetRequiredService<JobRunner>();
            var payload = new IngestPayload(parse.GetValue(files)!.Select(Path.GetFullPath).ToArray(), parse.GetValue(title),
                parse.GetValue(replace), parse.GetValue(mapping) is { } m ? Path.GetFullPath(m) : null, QueueStatistics: false,
                GridDataset: parse.GetValue(gridDataset));
            var slug = parse.GetValue(dataset)!;
            if (parse.GetValue(queue))
            {
                try
                {
                    Console.WriteLine((await host.Services.GetRequiredService<IngestInParts>().QueueAsync(payload, slug, parse.GetValue(partCells), cancel)).Describe());
                    return 0;
                }
                catch (Exception e) when (e is IngestException or PassOpenException or IOException)
                {
                    Console.Error.WriteLine($"atlas ingest: {e.Message}");
                    Console.Error.WriteLine("Nothing was queued.");
                    return 2;
                }
            }
            // The statistics follow the load: their kernel compiles meanwhile, on a core the load leaves free at times.
            if (!parse.GetValue(noStats)) HotMethodWarmup.Start();
            var ingest = await CommandLineJob.RunAsync(dataSource, runner, JobKind.Ingest, slug, payload, "ingest", "Nothing was changed in the dataset.", cancel);
            if (ingest != 0) return ingest;
            if (!parse.GetValue(noStats)) return await StatsCommand.RunAsync(dataSource, runner, slug, all: false, cancel);
            return 0;
        });
        return command;
    }
}
