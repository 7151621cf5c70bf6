using System.CommandLine;
using Atlas.Cli.Jobs;
using Atlas.Storage;
using Atlas.Storage.Jobs;
using Atlas.Storage.Passes;

namespace Atlas.Cli.Commands;

/// <summary>
/// <c>atlas jobs [--dataset SLUG]</c>: the queue at a glance: jobs by kind and state, the statistics passes in parts
/// with their parts done, running, queued and failed and the time left, and the latest whole jobs.
/// </summary>
public static class JobsCommand
{
    public static Command Build()
    {
        var dataset = new Option<string?>("--dataset") { Description = "Only the passes and jobs of this dataset" };
        var limit = new Option<int>("--limit") { Description = "How many passes and jobs to list", DefaultValueFactory = _ => 10 };
        var command = new Command("jobs", "Show the job queue: passes in parts (parts done, running, failed, time left) and recent jobs.") { dataset, limit };
        command.SetAction(async (parse, cancel) =>
        {
            await using var dataSource = await AtlasDatabase.OpenMigratedAsync(cancel: cancel);
            var queue = new JobQueue(dataSource);
            var slug = parse.GetValue(dataset);
            var counts = await queue.CountByStateAsync(cancel);
            Console.WriteLine(counts.Count == 0 ? "queue: empty"
                : "queue: " + string.Join("; ", counts.GroupBy(c => c.Kind).OrderBy(g => g.Key)
                    .Select(g => $"{g.Key} " + string.Join(", ", g.OrderBy(c => c.State).Select(c => $"{c.Count} {c.State}")))));
            var passes = await new PassStore(dataSource).ProgressAsync(slug, parse.GetValue(limit), cancel);
            foreach (var pass in passes) Console.WriteLine(PassReport.Line(pass, DateTime.UtcNow));
            var jobs = slug is null ? await queue.RecentAsync(parse.GetValue(limit) * 4, cancel) : await queue.ForDatasetAsync(slug, cancel);
            foreach (var job in jobs.Where(j => j.PassId is null).Take(parse.GetValue(limit)))
                Console.WriteLine(Datasets.DatasetReport.JobLine(job));
            return 0;
        });
        return command;
    }
}
