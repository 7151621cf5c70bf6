using System.Collections.Concurrent;
using Atlas.Ingest.Spectra;

namespace Atlas.Api.Points;

/// <summary>
/// The records of output points (<see cref="OutputPointRecord"/>) in memory, bounded to a quarter of
/// <see cref="AtlasApiOptions.PointCacheMegabytes"/> (at least 16 MB). Every point answer of a gridded dataset with output
/// points beside it carries the nearest one's spectral values for the asked window; the few output points are asked again
/// and again with new windows, so their stored values are read once and each answer is arithmetic. A record is keyed by
/// the stamp of its dataset's files, so a new load of the points is read afresh, never answered from the old record.
/// </summary>
public sealed class OutputPointRecords : IDisposable
{
    private readonly MemoryCache _cache;
    private readonly ConcurrentDictionary<string, Lazy<Task<OutputPointRecord?>>> _loading = new();
    private readonly DatasetCatalog _catalog;
    private readonly StationSpectraAnswers _spectra;

    public OutputPointRecords(DatasetCatalog catalog, StationSpectraAnswers spectra, IOptions<AtlasApiOptions> options)
    {
        _catalog = catalog;
        _spectra = spectra;
        var megabytes = Math.Max(16, options.Value.PointCacheMegabytes / 4);
        _cache = new MemoryCache(new MemoryCacheOptions { SizeLimit = megabytes * (1L << 20), CompactionPercentage = 0.25 });
    }

    /// <summary>The record of an output point of <paramref name="dataset"/> as its files stand now; null when it has no stored series.</summary>
    public async Task<OutputPointRecord?> ForAsync(DatasetRecord dataset, CellRecord cell, CancellationToken cancel)
    {
        var stamp = await _catalog.SeriesStampAsync(dataset, cancel);
        var key = string.Join('|', dataset.Id, dataset.CreatedAtUtc.Ticks, stamp.Token, cell.CellId);
        if (_cache.TryGetValue(key, out OutputPointRecord? known)) return known;
        var shared = _loading.GetOrAdd(key, k => new Lazy<Task<OutputPointRecord?>>(async () =>
        {
            try
            {
                var timelines = await _catalog.TimelinesAsync(dataset, CancellationToken.None);
                var record = await _spectra.RecordAsync(dataset, cell.CellId, cell.DepthMetres, timelines, CancellationToken.None);
                if (record is not null)
                    _cache.Set(k, record, new MemoryCacheEntryOptions { Size = record.Bytes, SlidingExpiration = TimeSpan.FromMinutes(30) });
                return record;
            }
            finally { _loading.TryRemove(k, out _); }
        }));
        return await shared.Value.WaitAsync(cancel);
    }

    public void Dispose() => _cache.Dispose();
}
