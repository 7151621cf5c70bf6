namespace Atlas.Storage.Datasets;

/// <summary>
/// The space a dataset takes in its two large tables: sums of <c>pg_column_size</c> over its rows (series chunks:
/// the payload as stored; statistic blocks: the whole row). Both store their arrays uncompressed, so these are the
/// stored bytes of the values, without the tables' row headers, free space and indexes.
/// </summary>
public sealed record DatasetStorage(long SeriesChunkCount, long SeriesBytes, long StatisticBlockCount, long StatisticBytes);
