namespace Atlas.Storage.Datasets;

/// <summary>
/// The space a dataset takes in its two large tables: sums of <c>pg_column_size</c> over its rows (series chunks:
/// the payload as stored; statistic blocks: the whole row). Both store their arrays uncompressed, so these are the
/// stored bytes of the values, without the tables' row headers, free space and indexes.
/// </summary>
public sealed record DatasetStorage(long SeriesChunkCount, long SeriesBytes, long StatisticBlockCount, long StatisticBytes)
{
    /// <summary>Output points only: station-years of per-step spectral values and their bytes (whole rows).</summary>
    public long SpectralYearCount { get; init; }

    public long SpectralBytes { get; init; }

    /// <summary>Output points only: station-months of spectrum sums and their bytes (whole rows).</summary>
    public long SpectrumMonthCount { get; init; }

    public long SpectrumMonthBytes { get; init; }
}
