using System.Globalization;
using Atlas.Storage.Copy;
using Npgsql;

namespace Atlas.Storage.Spectra;

/// <summary>The spectral values of output points kept beside their series: per-step values and monthly sums (V6 schema).</summary>
public sealed class StationSpectraStore(NpgsqlDataSource dataSource)
{
    /// <summary>
    /// Writes (or replaces) station-years of per-step values inside the caller's transaction: by binary COPY into a
    /// temporary table, then one insert that replaces the rows already stored; straight into the table for a dataset
    /// created by this transaction (<paramref name="newDataset"/>), which has no rows to replace.
    /// </summary>
    public static Task UpsertStepsAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, int datasetId, bool newDataset,
        IEnumerable<StationStepRecord> records, CancellationToken cancel) =>
        CopyAndMergeAsync(connection, transaction, "station_step", StepColumns, newDataset, records, (encoder, r) =>
        {
            encoder.StartRow(8);
            encoder.WriteInt32(datasetId);
            encoder.WriteInt32(r.CellId);
            encoder.WriteInt16((short)r.Year);
            foreach (var values in new[] { r.PowerSpectral, r.PowerParametric, r.Directionality, r.MaximumPowerFrom, r.SpectralWidth })
                encoder.WriteFloatBytes(values);
        }, """
            ON CONFLICT (dataset_id, cell_id, year) DO UPDATE SET j_spectral = excluded.j_spectral, j_parametric = excluded.j_parametric,
                directionality = excluded.directionality, max_power_from = excluded.max_power_from, spectral_width = excluded.spectral_width
            """, cancel);

    /// <summary>
    /// The per-step values of the given years (all when null) of one station (all when null), by (cell, year), read by
    /// binary COPY; inside the caller's transaction when given.
    /// </summary>
    public static async Task<Dictionary<(int Cell, int Year), StationStepRecord>> ReadStepsAsync(NpgsqlConnection connection,
        NpgsqlTransaction? transaction, int datasetId, int[]? years, int? cellId, CancellationToken cancel)
    {
        var filter = $"dataset_id = {datasetId:D}" + AndIn("year", years) + AndIn("cell_id", cellId is { } cell ? [cell] : null);
        var result = new Dictionary<(int, int), StationStepRecord>();
        await using var copy = await connection.BeginRawBinaryCopyAsync($"COPY (SELECT cell_id, year, {ProductColumns} FROM station_step WHERE {filter}) TO STDOUT (FORMAT BINARY)", cancel);
        var decoder = new BinaryCopyDecoder(copy);
        await decoder.ReadHeaderAsync(cancel);
        while (await decoder.StartRowAsync(7, cancel))
        {
            int cellOf = await decoder.ReadInt32Async(cancel);
            int year = await decoder.ReadInt16Async(cancel);
            var products = new float[5][];
            for (int k = 0; k < products.Length; k++)
                products[k] = await decoder.ReadFloatBytesAsync("station_step", cancel);
            result[(cellOf, year)] = new StationStepRecord(cellOf, year, products[0], products[1], products[2], products[3], products[4]);
        }
        return result;
    }

    /// <summary>The power integrated from the spectra, per step, of every stored station-year of a dataset, read by binary COPY.</summary>
    public static async Task<Dictionary<(int Cell, int Year), float[]>> ReadSpectralPowerAsync(NpgsqlConnection connection, int datasetId,
        CancellationToken cancel)
    {
        var result = new Dictionary<(int, int), float[]>();
        await using var copy = await connection.BeginRawBinaryCopyAsync(
            $"COPY (SELECT cell_id, year, j_spectral FROM station_step WHERE dataset_id = {datasetId:D}) TO STDOUT (FORMAT BINARY)", cancel);
        var decoder = new BinaryCopyDecoder(copy);
        await decoder.ReadHeaderAsync(cancel);
        while (await decoder.StartRowAsync(3, cancel))
        {
            int cell = await decoder.ReadInt32Async(cancel);
            int year = await decoder.ReadInt16Async(cancel);
            result[(cell, year)] = await decoder.ReadFloatBytesAsync("station_step", cancel);
        }
        return result;
    }

    /// <summary>The per-step values of every stored year of one station.</summary>
    public async Task<IReadOnlyDictionary<int, StationStepRecord>> StepsOfStationAsync(int datasetId, int cellId, CancellationToken cancel)
    {
        await using var connection = await dataSource.OpenConnectionAsync(cancel);
        var all = await ReadStepsAsync(connection, null, datasetId, null, cellId, cancel);
        return all.Values.ToDictionary(r => r.Year);
    }

    /// <summary>
    /// Adds the given monthly sums to the stored ones (rows created where missing) inside the caller's transaction: by
    /// binary COPY into a temporary table, then one insert that adds to the rows already stored, element by element;
    /// straight into the table for a dataset created by this transaction (<paramref name="newDataset"/>).
    /// </summary>
    public static Task AddMonthSumsAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, int datasetId, bool newDataset,
        IEnumerable<StationMonthSums> sums, CancellationToken cancel) =>
        CopyAndMergeAsync(connection, transaction, "station_spectrum_month", "dataset_id, cell_id, year, month, steps, frequency_sum, direction_sum", newDataset, sums,
            (encoder, m) =>
            {
                encoder.StartRow(7);
                encoder.WriteInt32(datasetId);
                encoder.WriteInt32(m.CellId);
                encoder.WriteInt16((short)m.Year);
                encoder.WriteInt16((short)m.Month);
                encoder.WriteInt32(m.Steps);
                encoder.WriteDoubleArray(m.FrequencySum);
                encoder.WriteDoubleArray(m.DirectionSum);
            }, """
            ON CONFLICT (dataset_id, cell_id, year, month) DO UPDATE SET
                steps = station_spectrum_month.steps + excluded.steps,
                frequency_sum = (SELECT array_agg(a + b ORDER BY k)
                    FROM unnest(station_spectrum_month.frequency_sum, excluded.frequency_sum) WITH ORDINALITY AS u(a, b, k)),
                direction_sum = coalesce((SELECT array_agg(a + b ORDER BY k)
                    FROM unnest(station_spectrum_month.direction_sum, excluded.direction_sum) WITH ORDINALITY AS u(a, b, k)), ARRAY[]::double precision[])
            """, cancel);

    /// <summary>
    /// Writes rows into <paramref name="table"/> inside the caller's transaction: by binary COPY into a temporary table
    /// shaped like it (<paramref name="write"/> writes one row's fields), then one insert of them all that ends with
    /// <paramref name="onConflict"/>; the temporary table is dropped after. With <paramref name="direct"/> (the rows
    /// cannot conflict: their dataset was created by this transaction) the COPY goes straight into the table, which
    /// halves the database's work: on 50 stations x 10 years the staged way wrote 58 MB twice.
    /// </summary>
    private static async Task CopyAndMergeAsync<T>(NpgsqlConnection connection, NpgsqlTransaction transaction, string table, string columns,
        bool direct, IEnumerable<T> rows, Action<BinaryCopyEncoder, T> write, string onConflict, CancellationToken cancel)
    {
        var load = direct ? table : table + "_load";
        if (!direct) await ExecuteAsync(connection, transaction, $"CREATE TEMP TABLE {load} (LIKE {table}) ON COMMIT DROP", cancel);
        await using (var copy = await connection.BeginRawBinaryCopyAsync($"COPY {load} ({columns}) FROM STDIN (FORMAT BINARY)", cancel))
        {
            var encoder = new BinaryCopyEncoder(copy);
            encoder.WriteHeader();
            foreach (var row in rows)
            {
                cancel.ThrowIfCancellationRequested();
                write(encoder, row);
            }
            encoder.WriteTrailer();
        }
        if (!direct)
            await ExecuteAsync(connection, transaction, $"INSERT INTO {table} ({columns}) SELECT {columns} FROM {load} {onConflict}; DROP TABLE {load}", cancel);
    }

    /// <summary>
    /// " AND column IN (...)" over <paramref name="values"/> (matching nothing when empty), or nothing when null. COPY
    /// takes no parameters: the values are integers formatted here, so nothing in the query is text from outside.
    /// </summary>
    private static string AndIn(string column, int[]? values) => values switch
    {
        null => "",
        [] => $" AND {column} IN (NULL)",
        _ => $" AND {column} IN ({string.Join(", ", values.Select(v => v.ToString("D", CultureInfo.InvariantCulture)))})",
    };

    private const string ProductColumns = "j_spectral, j_parametric, directionality, max_power_from, spectral_width";
    private const string StepColumns = "dataset_id, cell_id, year, " + ProductColumns;

    private static async Task ExecuteAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, string sql, CancellationToken cancel)
    {
        await using var command = new NpgsqlCommand(sql, connection, transaction);
        await command.ExecuteNonQueryAsync(cancel);
    }

    /// <summary>The monthly sums of one station, every stored month, in calendar order.</summary>
    public async Task<IReadOnlyList<StationMonthSums>> MonthSumsAsync(int datasetId, int cellId, CancellationToken cancel) =>
        (await MonthSumsOfCellsAsync(datasetId, [cellId], cancel)).GetValueOrDefault(cellId, []);

    /// <summary>
    /// The monthly sums of the given stations (all when null), every stored month in calendar order, by station: one
    /// binary COPY for them all.
    /// </summary>
    public async Task<Dictionary<int, List<StationMonthSums>>> MonthSumsOfCellsAsync(int datasetId, int[]? cellIds, CancellationToken cancel)
    {
        var filter = $"dataset_id = {datasetId:D}" + AndIn("cell_id", cellIds);
        var result = new Dictionary<int, List<StationMonthSums>>();
        await using var connection = await dataSource.OpenConnectionAsync(cancel);
        await using var copy = await connection.BeginRawBinaryCopyAsync(
            $"COPY (SELECT cell_id, year, month, steps, frequency_sum, direction_sum FROM station_spectrum_month WHERE {filter} ORDER BY cell_id, year, month) TO STDOUT (FORMAT BINARY)", cancel);
        var decoder = new BinaryCopyDecoder(copy);
        await decoder.ReadHeaderAsync(cancel);
        while (await decoder.StartRowAsync(6, cancel))
        {
            int cell = await decoder.ReadInt32Async(cancel);
            int year = await decoder.ReadInt16Async(cancel);
            int month = await decoder.ReadInt16Async(cancel);
            int steps = await decoder.ReadInt32Async(cancel);
            var frequency = await decoder.ReadDoubleArrayAsync(cancel) ?? throw new InvalidDataException("station_spectrum_month holds a NULL array");
            var direction = await decoder.ReadDoubleArrayAsync(cancel) ?? throw new InvalidDataException("station_spectrum_month holds a NULL array");
            if (!result.TryGetValue(cell, out var months)) result[cell] = months = [];
            months.Add(new StationMonthSums(cell, year, month, steps, frequency, direction));
        }
        return result;
    }
}
