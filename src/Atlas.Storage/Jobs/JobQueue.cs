using Npgsql;

namespace Atlas.Storage.Jobs;

/// <summary>
/// The work queue in PostgreSQL. Workers claim the oldest queued job with FOR UPDATE SKIP LOCKED, so any number of
/// workers on any number of machines share it without claiming the same job twice. A running job whose heartbeat is
/// older than the stale limit (its worker died) is put back in the queue by <see cref="RequeueStaleAsync"/>.
/// </summary>
public sealed class JobQueue(NpgsqlDataSource dataSource)
{
    public async Task<long> EnqueueAsync(JobKind kind, string datasetSlug, string payloadJson = "{}", CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand(
            "INSERT INTO job (kind, dataset_slug, payload) VALUES ($1, $2, $3::jsonb) RETURNING job_id");
        command.Parameters.AddWithValue(KindName(kind));
        command.Parameters.AddWithValue(datasetSlug);
        command.Parameters.AddWithValue(payloadJson);
        return (long)(await command.ExecuteScalarAsync(cancel))!;
    }

    /// <summary>Claims the oldest queued job for <paramref name="worker"/>, or returns null when none is queued.</summary>
    public async Task<JobRecord?> ClaimAsync(string worker, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand($"""
            UPDATE job SET state = 'running', claimed_by = $1, claimed_at = now(), heartbeat_at = now(), attempts = attempts + 1
             WHERE job_id = (SELECT job_id FROM job WHERE state = 'queued' ORDER BY created_at, job_id
                              FOR UPDATE SKIP LOCKED LIMIT 1)
            RETURNING {Columns}
            """);
        command.Parameters.AddWithValue(worker);
        return await ReadOneAsync(command, cancel);
    }

    /// <summary>Claims one specific queued job (used by the command line, which runs its own job at once).</summary>
    public async Task<JobRecord?> ClaimAsync(long jobId, string worker, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand($"""
            UPDATE job SET state = 'running', claimed_by = $1, claimed_at = now(), heartbeat_at = now(), attempts = attempts + 1
             WHERE job_id = (SELECT job_id FROM job WHERE job_id = $2 AND state = 'queued' FOR UPDATE SKIP LOCKED)
            RETURNING {Columns}
            """);
        command.Parameters.AddWithValue(worker);
        command.Parameters.AddWithValue(jobId);
        return await ReadOneAsync(command, cancel);
    }

    public async Task HeartbeatAsync(long jobId, string progressJson, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand(
            "UPDATE job SET heartbeat_at = now(), progress = $2::jsonb WHERE job_id = $1 AND state = 'running'");
        command.Parameters.AddWithValue(jobId);
        command.Parameters.AddWithValue(progressJson);
        await command.ExecuteNonQueryAsync(cancel);
    }

    public Task CompleteAsync(long jobId, string summary, CancellationToken cancel = default) => FinishAsync(jobId, "done", null, summary, cancel);

    /// <summary>Marks a job done when <paramref name="worker"/> still holds it running; otherwise changes nothing.</summary>
    public async Task CompleteIfHeldAsync(long jobId, string worker, string summary, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand(
            "UPDATE job SET state = 'done', summary = $3, finished_at = now() WHERE job_id = $1 AND state = 'running' AND claimed_by = $2");
        command.Parameters.AddWithValue(jobId);
        command.Parameters.AddWithValue(worker);
        command.Parameters.AddWithValue(summary);
        await command.ExecuteNonQueryAsync(cancel);
    }

    /// <summary>Marks a job failed when <paramref name="worker"/> still holds it running; returns whether it did.</summary>
    public async Task<bool> FailIfHeldAsync(long jobId, string worker, string error, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand(
            "UPDATE job SET state = 'failed', error = $3, finished_at = now() WHERE job_id = $1 AND state = 'running' AND claimed_by = $2");
        command.Parameters.AddWithValue(jobId);
        command.Parameters.AddWithValue(worker);
        command.Parameters.AddWithValue(error);
        return await command.ExecuteNonQueryAsync(cancel) == 1;
    }

    /// <summary>Whether any job is queued or running (a worker run until idle stops when none is).</summary>
    public async Task<bool> AnyPendingAsync(CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand("SELECT EXISTS (SELECT 1 FROM job WHERE state IN ('queued', 'running'))");
        return (bool)(await command.ExecuteScalarAsync(cancel))!;
    }

    public Task FailAsync(long jobId, string error, CancellationToken cancel = default) => FinishAsync(jobId, "failed", error, null, cancel);

    /// <summary>Puts a job back in the queue (its worker is shutting down before finishing it).</summary>
    public async Task ReleaseAsync(long jobId, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand(
            "UPDATE job SET state = 'queued', claimed_by = NULL, claimed_at = NULL, heartbeat_at = NULL WHERE job_id = $1 AND state = 'running'");
        command.Parameters.AddWithValue(jobId);
        await command.ExecuteNonQueryAsync(cancel);
    }

    /// <summary>
    /// Re-queues running jobs whose process is gone: no <see cref="JobLease"/> holds their lock (checked once the
    /// claim is a few seconds old, the time a claimer takes to lease it), or no heartbeat came for
    /// <paramref name="staleAfter"/> (a process that hangs with its session still open).
    /// </summary>
    public async Task<int> RequeueStaleAsync(TimeSpan staleAfter, CancellationToken cancel = default)
    {
        // The try-lock is transaction-scoped, so a free lock taken here is released when this statement ends.
        await using var command = dataSource.CreateCommand($"""
            UPDATE job SET state = 'queued', claimed_by = NULL
             WHERE state = 'running'
               AND (heartbeat_at < now() - $1
                    OR (claimed_at < now() - $2 AND pg_try_advisory_xact_lock({JobLease.LockSpace}, {JobLease.JobKeySql})))
            """);
        command.Parameters.AddWithValue(staleAfter);
        command.Parameters.AddWithValue(LeaseGrace);
        return await command.ExecuteNonQueryAsync(cancel);
    }

    /// <summary>How long after its claim a running job without a lease counts as abandoned.</summary>
    public static readonly TimeSpan LeaseGrace = TimeSpan.FromSeconds(5);

    public async Task<JobRecord?> FindAsync(long jobId, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand($"SELECT {Columns} FROM job WHERE job_id = $1");
        command.Parameters.AddWithValue(jobId);
        return await ReadOneAsync(command, cancel);
    }

    public async Task<IReadOnlyList<JobRecord>> RecentAsync(int limit, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand($"SELECT {Columns} FROM job ORDER BY job_id DESC LIMIT $1");
        command.Parameters.AddWithValue(limit);
        return await ReadAllAsync(command, cancel);
    }

    /// <summary>Every job of one dataset, newest first.</summary>
    public async Task<IReadOnlyList<JobRecord>> ForDatasetAsync(string datasetSlug, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand($"SELECT {Columns} FROM job WHERE dataset_slug = $1 ORDER BY job_id DESC");
        command.Parameters.AddWithValue(datasetSlug);
        return await ReadAllAsync(command, cancel);
    }

    /// <summary>How many jobs are in each (kind, state); states with no job are absent.</summary>
    public async Task<IReadOnlyList<(string Kind, string State, long Count)>> CountByStateAsync(CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand("SELECT kind, state, count(*) FROM job GROUP BY kind, state");
        var counts = new List<(string, string, long)>();
        await using var reader = await command.ExecuteReaderAsync(cancel);
        while (await reader.ReadAsync(cancel)) counts.Add((reader.GetString(0), reader.GetString(1), reader.GetInt64(2)));
        return counts;
    }

    private async Task FinishAsync(long jobId, string state, string? error, string? summary, CancellationToken cancel)
    {
        await using var command = dataSource.CreateCommand(
            "UPDATE job SET state = $2, error = $3, summary = $4, finished_at = now() WHERE job_id = $1");
        command.Parameters.AddWithValue(jobId);
        command.Parameters.AddWithValue(state);
        command.Parameters.AddWithValue((object?)error ?? DBNull.Value);
        command.Parameters.AddWithValue((object?)summary ?? DBNull.Value);
        await command.ExecuteNonQueryAsync(cancel);
    }

    private const string Columns = "job_id, kind, dataset_slug, state, payload::text, attempts, claimed_by, created_at, finished_at, progress::text, error, summary, pass_id, part";

    public static string KindName(JobKind kind) => kind switch
    {
        JobKind.Ingest => "ingest",
        JobKind.Statistics => "statistics",
        JobKind.StatisticsPart => "statistics-part",
        _ => "ingest-part",
    };

    public static JobKind KindOf(string name) => name switch
    {
        "ingest" => JobKind.Ingest,
        "statistics" => JobKind.Statistics,
        "statistics-part" => JobKind.StatisticsPart,
        "ingest-part" => JobKind.IngestPart,
        _ => throw new ArgumentOutOfRangeException(nameof(name), name, "Not a job kind."),
    };

    private static async Task<JobRecord?> ReadOneAsync(NpgsqlCommand command, CancellationToken cancel)
    {
        await using var reader = await command.ExecuteReaderAsync(cancel);
        return await reader.ReadAsync(cancel) ? Read(reader) : null;
    }

    private static async Task<IReadOnlyList<JobRecord>> ReadAllAsync(NpgsqlCommand command, CancellationToken cancel)
    {
        var jobs = new List<JobRecord>();
        await using var reader = await command.ExecuteReaderAsync(cancel);
        while (await reader.ReadAsync(cancel)) jobs.Add(Read(reader));
        return jobs;
    }

    private static JobRecord Read(NpgsqlDataReader r) => new(
        r.GetInt64(0), KindOf(r.GetString(1)), r.GetString(2), r.GetString(3), r.GetString(4),
        r.GetInt32(5), r.IsDBNull(6) ? null : r.GetString(6), r.GetDateTime(7).ToUniversalTime(),
        r.IsDBNull(8) ? null : r.GetDateTime(8).ToUniversalTime(), r.IsDBNull(9) ? null : r.GetString(9),
        r.IsDBNull(10) ? null : r.GetString(10), r.IsDBNull(11) ? null : r.GetString(11),
        r.IsDBNull(12) ? null : r.GetInt64(12), r.IsDBNull(13) ? null : r.GetInt32(13));
}
