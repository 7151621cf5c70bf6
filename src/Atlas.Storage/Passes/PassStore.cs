using Atlas.Storage.Copy;
using Atlas.Storage.Jobs;
using Atlas.Storage.Statistics;
using Npgsql;

namespace Atlas.Storage.Passes;

/// <summary>
/// Statistics passes run in parts (db/V7): a pass row per dataset and pass, its parts as jobs of the queue, and the
/// staging table their blocks go to until the pass is complete. A part stores its batches in the staging table, each
/// batch in one transaction that first deletes the batch's blocks of the pass (a part redone after its worker died
/// stores nothing twice), and is marked done by <see cref="FinishPartAsync"/> in a transaction that, for the last part
/// of the pass, also moves every staged block into <c>statistic_block</c> and stamps the pass's cells. Readers thus
/// see the previous statistics until the whole pass is stored, and the statistics stamp moves once.
/// </summary>
public sealed class PassStore(NpgsqlDataSource dataSource)
{
    private const string PassColumns = "pass_id, dataset_id, dataset_slug, kind, state, payload::text, part_count, blocks, computed_at, created_at, finished_at, error";

    /// <summary>
    /// Opens a pass of <paramref name="kind"/> (statistics over <paramref name="blocks"/>, or ingest) of a dataset and
    /// queues one part per entry of <paramref name="partPayloads"/> (each part's job payload), in one transaction.
    /// Throws <see cref="PassOpenException"/>, changing nothing, while another pass of the dataset is open.
    /// <paramref name="metadataAtOpenJson"/>, when given, is merged into the dataset's metadata in the same transaction.
    /// </summary>
    public async Task<PassRecord> OpenAsync(PassKind kind, int datasetId, string datasetSlug, string payloadJson, int[] blocks,
        IReadOnlyList<string> partPayloads, DateTime computedAtUtc, string? metadataAtOpenJson = null, CancellationToken cancel = default)
    {
        if (partPayloads.Count == 0) throw new ArgumentException("A pass needs at least one part.", nameof(partPayloads));
        await using var connection = await dataSource.OpenConnectionAsync(cancel);
        await using var transaction = await connection.BeginTransactionAsync(cancel);
        PassRecord pass;
        try
        {
            await using var insert = new NpgsqlCommand($"""
                INSERT INTO pass (dataset_id, dataset_slug, kind, payload, part_count, blocks, computed_at) VALUES ($1, $6, $7, $2::jsonb, $3, $4, $5)
                RETURNING {PassColumns}
                """, connection, transaction);
            insert.Parameters.AddWithValue(datasetId);
            insert.Parameters.AddWithValue(payloadJson);
            insert.Parameters.AddWithValue(partPayloads.Count);
            insert.Parameters.AddWithValue(blocks);
            insert.Parameters.AddWithValue(computedAtUtc);
            insert.Parameters.AddWithValue(datasetSlug);
            insert.Parameters.AddWithValue(KindName(kind));
            pass = (await ReadPassesAsync(insert, cancel))[0];
        }
        catch (PostgresException e) when (e.SqlState == PostgresErrorCodes.UniqueViolation)
        {
            await transaction.RollbackAsync(CancellationToken.None);
            var open = await OpenPassAsync(datasetSlug, cancel);
            throw new PassOpenException(datasetSlug, open?.Id, open?.Kind);
        }
        for (var part = 0; part < partPayloads.Count; part++)
        {
            await using var job = new NpgsqlCommand(
                "INSERT INTO job (kind, dataset_slug, payload, pass_id, part) VALUES ($5, $1, $2::jsonb, $3, $4)", connection, transaction);
            job.Parameters.AddWithValue(datasetSlug);
            job.Parameters.AddWithValue(partPayloads[part]);
            job.Parameters.AddWithValue(pass.Id);
            job.Parameters.AddWithValue(part);
            job.Parameters.AddWithValue(KindName(kind) + "-part");
            await job.ExecuteNonQueryAsync(cancel);
        }
        if (metadataAtOpenJson is not null) await Datasets.DatasetStore.MergeMetadataAsync(connection, transaction, datasetId, metadataAtOpenJson, cancel);
        await transaction.CommitAsync(cancel);
        return pass;
    }

    public static string KindName(PassKind kind) => kind == PassKind.Ingest ? "ingest" : "statistics";

    /// <summary>
    /// Reserves a dataset id for an ingest pass that creates its dataset: the parts write series under it before the
    /// dataset row exists (the last part inserts the row with this id).
    /// </summary>
    public async Task<int> ReserveDatasetIdAsync(CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand("SELECT nextval(pg_get_serial_sequence('dataset', 'dataset_id'))::int");
        return (int)(await command.ExecuteScalarAsync(cancel))!;
    }

    public async Task<PassRecord?> FindAsync(long passId, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand($"SELECT {PassColumns} FROM pass WHERE pass_id = $1");
        command.Parameters.AddWithValue(passId);
        var found = await ReadPassesAsync(command, cancel);
        return found.Count == 0 ? null : found[0];
    }

    /// <summary>The dataset's open pass, or null.</summary>
    public async Task<PassRecord?> OpenPassAsync(string datasetSlug, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand($"SELECT {PassColumns} FROM pass WHERE dataset_slug = $1 AND state = 'open'");
        command.Parameters.AddWithValue(datasetSlug);
        var found = await ReadPassesAsync(command, cancel);
        return found.Count == 0 ? null : found[0];
    }

    /// <summary>The passes (of one dataset, or all), newest first, with how many of their parts are in each state.</summary>
    public async Task<IReadOnlyList<PassProgress>> ProgressAsync(string? datasetSlug = null, int limit = 20, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand($"""
            SELECT {string.Join(", ", PassColumns.Split(", ").Select(c => "p." + c))},
                   count(*) FILTER (WHERE j.state = 'done')::int, count(*) FILTER (WHERE j.state = 'running')::int,
                   count(*) FILTER (WHERE j.state = 'queued')::int, count(*) FILTER (WHERE j.state = 'failed')::int,
                   min(j.claimed_at), max(j.finished_at) FILTER (WHERE j.state = 'done')
              FROM pass p LEFT JOIN job j ON j.pass_id = p.pass_id
             WHERE $1::text IS NULL OR p.dataset_slug = $1
             GROUP BY p.pass_id ORDER BY p.pass_id DESC LIMIT $2
            """);
        command.Parameters.AddWithValue(NpgsqlTypes.NpgsqlDbType.Text, (object?)datasetSlug ?? DBNull.Value);
        command.Parameters.AddWithValue(limit);
        var passes = new List<PassProgress>();
        await using var reader = await command.ExecuteReaderAsync(cancel);
        while (await reader.ReadAsync(cancel))
            passes.Add(new PassProgress(Read(reader), reader.GetInt32(12), reader.GetInt32(13), reader.GetInt32(14), reader.GetInt32(15),
                reader.IsDBNull(16) ? null : reader.GetDateTime(16).ToUniversalTime(), reader.IsDBNull(17) ? null : reader.GetDateTime(17).ToUniversalTime()));
        return passes;
    }

    /// <summary>How many parts of all passes are in each state (for metrics).</summary>
    public async Task<IReadOnlyList<(string State, long Count)>> PartsByStateAsync(CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand("SELECT state, count(*) FROM job WHERE pass_id IS NOT NULL GROUP BY state");
        var counts = new List<(string, long)>();
        await using var reader = await command.ExecuteReaderAsync(cancel);
        while (await reader.ReadAsync(cancel)) counts.Add((reader.GetString(0), reader.GetInt64(1)));
        return counts;
    }

    /// <summary>
    /// Stores one batch of a part in the pass's staging table, in one transaction that first deletes the pass's rows of
    /// the batch's blocks: a batch written again (its part redone) replaces itself. Returns false, storing nothing, when
    /// the pass is no longer open (it failed, or its dataset was removed).
    /// </summary>
    public async Task<bool> StageAsync(long passId, int datasetId, IReadOnlyList<StatisticBlock> blocks, CancellationToken cancel = default)
    {
        await using var connection = await dataSource.OpenConnectionAsync(cancel);
        await using var transaction = await connection.BeginTransactionAsync(cancel);
        // Held to the commit: a pass failing or completing meanwhile waits, so no staged row outlives its pass.
        await using (var open = new NpgsqlCommand("SELECT 1 FROM pass WHERE pass_id = $1 AND state = 'open' FOR SHARE", connection, transaction))
        {
            open.Parameters.AddWithValue(passId);
            if (await open.ExecuteScalarAsync(cancel) is null) return false;
        }
        await using (var delete = new NpgsqlCommand("DELETE FROM statistic_block_stage WHERE pass_id = $1 AND dataset_id = $2 AND block = ANY($3)",
            connection, transaction))
        {
            delete.Parameters.AddWithValue(passId);
            delete.Parameters.AddWithValue(datasetId);
            delete.Parameters.AddWithValue(blocks.Select(b => b.Block).Distinct().ToArray());
            await delete.ExecuteNonQueryAsync(cancel);
        }
        await StatisticsStore.CopyBlocksAsync(connection, datasetId, blocks, passId, cancel);
        await transaction.CommitAsync(cancel);
        return true;
    }

    /// <summary>
    /// Marks a statistics part done when <paramref name="worker"/> still holds it (claimed and running); when it is the
    /// pass's last part, completes the pass in the same transaction: the staged blocks replace the pass's blocks in
    /// <c>statistic_block</c>, the wet cells of those blocks are stamped computed at the pass's time, the layer cache
    /// is emptied and the metadata the pass recorded is merged into the dataset's. Returns what became of it.
    /// </summary>
    public async Task<PartOutcome> FinishPartAsync(JobRecord part, string worker, string summary, CancellationToken cancel = default)
    {
        await using var connection = await dataSource.OpenConnectionAsync(cancel);
        await using var transaction = await connection.BeginTransactionAsync(cancel);
        var (outcome, pass) = await MarkPartDoneAsync(connection, transaction, part, worker, summary, cancel);
        if (outcome == PartOutcome.PassCompleted) await CompleteStatisticsAsync(connection, transaction, pass!, cancel);
        if (outcome is PartOutcome.Stored or PartOutcome.PassCompleted) await transaction.CommitAsync(cancel);
        return outcome;
    }

    /// <summary>
    /// In the caller's transaction: locks the part's pass (so the parts of one pass finish one after another and exactly
    /// one sees itself last) and marks the part done when <paramref name="worker"/> still holds it. Returns
    /// <see cref="PartOutcome.PassCompleted"/> when no other part is left (the caller then completes the pass, marks it
    /// done with <see cref="MarkPassDoneAsync"/> and commits), <see cref="PartOutcome.Stored"/> when others are, and
    /// <see cref="PartOutcome.Lost"/> or <see cref="PartOutcome.PassGone"/> when the caller must roll back.
    /// </summary>
    public static async Task<(PartOutcome Outcome, PassRecord? Pass)> MarkPartDoneAsync(NpgsqlConnection connection, NpgsqlTransaction transaction,
        JobRecord part, string worker, string summary, CancellationToken cancel)
    {
        var passId = part.PassId ?? throw new ArgumentException($"Job {part.Id} is not a part of a pass.", nameof(part));
        PassRecord pass;
        await using (var lockPass = new NpgsqlCommand($"SELECT {PassColumns} FROM pass WHERE pass_id = $1 FOR UPDATE", connection, transaction))
        {
            lockPass.Parameters.AddWithValue(passId);
            var found = await ReadPassesAsync(lockPass, cancel);
            if (found.Count == 0 || found[0].State != "open") return (PartOutcome.PassGone, null);
            pass = found[0];
        }
        await using (var done = new NpgsqlCommand("""
            UPDATE job SET state = 'done', summary = $3, finished_at = now(), error = NULL
             WHERE job_id = $1 AND state = 'running' AND claimed_by = $2
            """, connection, transaction))
        {
            done.Parameters.AddWithValue(part.Id);
            done.Parameters.AddWithValue(worker);
            done.Parameters.AddWithValue(summary);
            if (await done.ExecuteNonQueryAsync(cancel) == 0) return (PartOutcome.Lost, pass);
        }
        await using var left = new NpgsqlCommand("SELECT count(*) FROM job WHERE pass_id = $1 AND state <> 'done'", connection, transaction);
        left.Parameters.AddWithValue(passId);
        if ((long)(await left.ExecuteScalarAsync(cancel))! > 0) return (PartOutcome.Stored, pass);
        await using (var note = new NpgsqlCommand("UPDATE job SET summary = summary || $2 WHERE job_id = $1", connection, transaction))
        {
            note.Parameters.AddWithValue(part.Id);
            note.Parameters.AddWithValue(PassCompletedNote);
            await note.ExecuteNonQueryAsync(cancel);
        }
        return (PartOutcome.PassCompleted, pass);
    }

    /// <summary>Marks a pass done, in the transaction that completed it.</summary>
    public static async Task MarkPassDoneAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, long passId, CancellationToken cancel)
    {
        await using var command = new NpgsqlCommand("UPDATE pass SET state = 'done', finished_at = now() WHERE pass_id = $1", connection, transaction);
        command.Parameters.AddWithValue(passId);
        await command.ExecuteNonQueryAsync(cancel);
    }

    /// <summary>What the summary of the part that completed its pass ends with.</summary>
    public const string PassCompletedNote = "; pass complete, now served";

    private static async Task CompleteStatisticsAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, PassRecord pass, CancellationToken cancel)
    {
        async Task RunAsync(string sql, params object[] values)
        {
            await using var command = new NpgsqlCommand(sql, connection, transaction);
            foreach (var value in values) command.Parameters.AddWithValue(value);
            await command.ExecuteNonQueryAsync(cancel);
        }
        await RunAsync("DELETE FROM statistic_block WHERE dataset_id = $1 AND block = ANY($2)", pass.DatasetId, pass.Blocks);
        await RunAsync($"""
            INSERT INTO statistic_block (dataset_id, {StatisticsStore.BlockColumns})
            SELECT dataset_id, {StatisticsStore.BlockColumns} FROM statistic_block_stage
             WHERE pass_id = $1 AND dataset_id = $2 ORDER BY parameter, period, block
            """, pass.Id, pass.DatasetId);
        await RunAsync("DELETE FROM cell_statistic_state WHERE dataset_id = $1 AND cell_id / 1024 = ANY($2)", pass.DatasetId, pass.Blocks);
        await RunAsync("""
            INSERT INTO cell_statistic_state (dataset_id, cell_id, computed_at)
            SELECT dataset_id, cell_id, $3 FROM cell WHERE dataset_id = $1 AND wet AND cell_id / 1024 = ANY($2)
            """, pass.DatasetId, pass.Blocks, pass.ComputedAtUtc);
        await RunAsync("DELETE FROM layer_cache WHERE dataset_id = $1", pass.DatasetId);
        await RunAsync("""
            UPDATE dataset d SET metadata = d.metadata || coalesce(p.payload -> 'metadata', '{}'::jsonb)
              FROM pass p WHERE d.dataset_id = $1 AND p.pass_id = $2
            """, pass.DatasetId, pass.Id);
        await RunAsync("DELETE FROM statistic_block_stage WHERE pass_id = $1", pass.Id);
        await MarkPassDoneAsync(connection, transaction, pass.Id, cancel);
    }

    /// <summary>
    /// Fails a pass whose part failed for good: its other queued parts are failed too (running ones end on their own,
    /// finding the pass gone), and what its parts stored is deleted: a statistics pass's staged blocks (the stored
    /// statistics stay those of the last complete pass), an ingest pass's series under the dataset id it reserved (no
    /// dataset row was created). Does nothing to a pass that is no longer open.
    /// </summary>
    public async Task FailAsync(long passId, string error, CancellationToken cancel = default)
    {
        await using var connection = await dataSource.OpenConnectionAsync(cancel);
        await using var transaction = await connection.BeginTransactionAsync(cancel);
        await using (var fail = new NpgsqlCommand(
            "UPDATE pass SET state = 'failed', error = $2, finished_at = now() WHERE pass_id = $1 AND state = 'open'", connection, transaction))
        {
            fail.Parameters.AddWithValue(passId);
            fail.Parameters.AddWithValue(error);
            if (await fail.ExecuteNonQueryAsync(cancel) == 0) return;
        }
        await using (var parts = new NpgsqlCommand("""
            UPDATE job SET state = 'failed', error = 'not run: another part of its pass failed', finished_at = now()
             WHERE pass_id = $1 AND state = 'queued'
            """, connection, transaction))
        {
            parts.Parameters.AddWithValue(passId);
            await parts.ExecuteNonQueryAsync(cancel);
        }
        await using (var stage = new NpgsqlCommand("DELETE FROM statistic_block_stage WHERE pass_id = $1", connection, transaction))
        {
            stage.Parameters.AddWithValue(passId);
            await stage.ExecuteNonQueryAsync(cancel);
        }
        await using (var series = new NpgsqlCommand("""
            DELETE FROM series_chunk s USING pass p
             WHERE p.pass_id = $1 AND p.kind = 'ingest' AND s.dataset_id = p.dataset_id
               AND NOT EXISTS (SELECT 1 FROM dataset d WHERE d.dataset_id = p.dataset_id)
            """, connection, transaction))
        {
            series.Parameters.AddWithValue(passId);
            await series.ExecuteNonQueryAsync(cancel);
        }
        await transaction.CommitAsync(cancel);
    }

    private static async Task<IReadOnlyList<PassRecord>> ReadPassesAsync(NpgsqlCommand command, CancellationToken cancel)
    {
        var passes = new List<PassRecord>();
        await using var reader = await command.ExecuteReaderAsync(cancel);
        while (await reader.ReadAsync(cancel)) passes.Add(Read(reader));
        return passes;
    }

    private static PassRecord Read(NpgsqlDataReader r) => new(
        r.GetInt64(0), r.GetInt32(1), r.GetString(2), r.GetString(3) == "ingest" ? PassKind.Ingest : PassKind.Statistics, r.GetString(4), r.GetString(5),
        r.GetInt32(6), r.GetFieldValue<int[]>(7), r.GetDateTime(8).ToUniversalTime(), r.GetDateTime(9).ToUniversalTime(),
        r.IsDBNull(10) ? null : r.GetDateTime(10).ToUniversalTime(), r.IsDBNull(11) ? null : r.GetString(11));
}
