using Npgsql;

namespace Atlas.Storage.Jobs;

/// <summary>
/// Proof that a live process is running a job: a session advisory lock on the job, held on a connection of its own
/// for as long as the lease lives. When the process dies (killed, crashed, its machine lost), PostgreSQL ends the
/// session and drops the lock, and <see cref="JobQueue.RequeueStaleAsync"/> puts the job back in the queue at once
/// instead of waiting for its heartbeat to go stale.
/// </summary>
public sealed class JobLease : IAsyncDisposable
{
    /// <summary>The first key of the two-key advisory locks on jobs (the second is the job id), apart from other locks.</summary>
    public const int LockSpace = 0x61746A62;

    private readonly NpgsqlConnection _connection;
    private readonly long _jobId;

    private JobLease(NpgsqlConnection connection, long jobId)
    {
        _connection = connection;
        _jobId = jobId;
    }

    /// <summary>The second key of a job's lock; job ids past 2^31 wrap, which only makes two jobs share a lock.</summary>
    public const string JobKeySql = "(job_id % 2147483647)::int";

    public static async Task<JobLease> TakeAsync(NpgsqlDataSource dataSource, long jobId, CancellationToken cancel = default)
    {
        var connection = await dataSource.OpenConnectionAsync(cancel);
        try
        {
            // Blocking form: a requeue check may hold the lock for the length of one statement.
            await using var command = new NpgsqlCommand("SELECT pg_advisory_lock($1, ($2 % 2147483647)::int)", connection);
            command.Parameters.AddWithValue(LockSpace);
            command.Parameters.AddWithValue(jobId);
            await command.ExecuteNonQueryAsync(cancel);
            return new JobLease(connection, jobId);
        }
        catch
        {
            await connection.DisposeAsync();
            throw;
        }
    }

    public async ValueTask DisposeAsync()
    {
        try
        {
            // Explicitly: a pooled connection is only reset when next used, and would keep the lock until then.
            await using var command = new NpgsqlCommand("SELECT pg_advisory_unlock($1, ($2 % 2147483647)::int)", _connection);
            command.Parameters.AddWithValue(LockSpace);
            command.Parameters.AddWithValue(_jobId);
            await command.ExecuteNonQueryAsync();
        }
        catch (NpgsqlException)
        {
            // The session is gone, and its lock with it.
        }
        await _connection.DisposeAsync();
    }
}
