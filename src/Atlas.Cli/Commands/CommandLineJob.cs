using System.Text.Json;
using Atlas.Ingest.Progress;
using Atlas.Ingest.Worker;
using Atlas.Storage.Jobs;
using Npgsql;

namespace Atlas.Cli.Commands;

/// <summary>
/// A job the command line runs itself: queued like any other (so the queue and the web page show it), claimed at once
/// under this process's worker name and run here with progress on the console.
/// </summary>
internal static class CommandLineJob
{
    /// <summary>The worker name the command line claims its own jobs under.</summary>
    public static string WorkerName => $"cli:{Environment.MachineName}:{Environment.ProcessId}";

    /// <summary>
    /// Queues, claims and runs a job and prints its outcome: 0 when it succeeds; 2 when it fails, after the error
    /// (<c>atlas COMMAND: message</c>) and <paramref name="afterFailure"/> on standard error.
    /// </summary>
    /// <param name="command">The command's name for the error line, e.g. <c>ingest</c>.</param>
    /// <param name="afterFailure">A line saying what a failure left behind, or null.</param>
    /// <param name="runner">The runner built by the command's checked host (<see cref="CommandHost"/>).</param>
    public static async Task<int> RunAsync<TPayload>(NpgsqlDataSource dataSource, JobRunner runner, JobKind kind, string slug, TPayload payload,
        string command, string? afterFailure, CancellationToken cancel)
    {
        var queue = new JobQueue(dataSource);
        var id = await queue.EnqueueAsync(kind, slug, JsonSerializer.Serialize(payload), cancel);
        var job = await queue.ClaimAsync(id, WorkerName, cancel) ?? throw new InvalidOperationException($"Job {id} was claimed by another worker.");
        try
        {
            Console.WriteLine(await runner.RunAsync(job, new ConsoleProgress(), cancel));
            return 0;
        }
        catch (Exception e) when (e is not OperationCanceledException)
        {
            Console.Error.WriteLine($"atlas {command}: {e.Message}");
            if (afterFailure is not null) Console.Error.WriteLine(afterFailure);
            return 2;
        }
    }
}
