namespace Atlas.Api.Catalog;

/// <summary>
/// Dataset look-ups shared by every endpoint, cached briefly in memory: a point request must not pay for the
/// dataset row, its time lines and its cell spacing each time. Entries expire on their own (another process may
/// ingest or recompute), and a delete through this API forgets the dataset at once.
/// </summary>
public sealed class DatasetCatalog(DatasetStore datasets, DatasetGeometryQueries geometry, CellStore cells, IMemoryCache cache,
    IOptions<AtlasApiOptions> options)
{
    private static readonly TimeSpan RowLifetime = TimeSpan.FromSeconds(5);
    private static readonly TimeSpan TimelineLifetime = TimeSpan.FromSeconds(30);
    private static readonly TimeSpan StampLifetime = TimeSpan.FromSeconds(2);
    private static readonly TimeSpan SpacingLifetime = TimeSpan.FromMinutes(10);
    private static readonly TimeSpan LargeValueIdleLifetime = TimeSpan.FromMinutes(10);
    private readonly Lock _gate = new();

    public async Task<DatasetRecord?> FindAsync(string slug, CancellationToken cancel)
    {
        var key = ("dataset", slug);
        if (cache.TryGetValue(key, out DatasetRecord? known)) return known;
        var found = await datasets.FindAsync(slug, cancel);
        if (found is not null) cache.Set(key, found, RowLifetime);
        return found;
    }

    /// <summary>
    /// The time line (Unix seconds) of every stored year, by year. Keyed by the files stamp: a load that lengthens a
    /// year's time line also rewrites its chunks, and chunks read fresh against a time line kept from before would not
    /// match (the year would be left out of point answers until the time line expired).
    /// </summary>
    public async Task<SortedDictionary<int, long[]>> TimelinesAsync(DatasetRecord dataset, CancellationToken cancel)
    {
        var stamp = await SeriesStampAsync(dataset, cancel);
        return await CachedAsync(("timelines", dataset.Id, dataset.CreatedAtUtc, stamp.Token), TimelineLifetime,
            () => datasets.TimelinesAsync(dataset.Id, CancellationToken.None), cancel);
    }

    public Task<StatisticsStamp> StatisticsStampAsync(DatasetRecord dataset, CancellationToken cancel) =>
        CachedAsync(("stamp", dataset.Id, dataset.CreatedAtUtc), StampLifetime, () => geometry.StatisticsStampAsync(dataset.Id, CancellationToken.None), cancel);

    /// <summary>When the dataset's files were last loaded: a token that moves whenever series or wet cells may have changed.</summary>
    public Task<SeriesStamp> SeriesStampAsync(DatasetRecord dataset, CancellationToken cancel) =>
        CachedAsync(("series-stamp", dataset.Id, dataset.CreatedAtUtc), StampLifetime, () => geometry.SeriesStampAsync(dataset.Id, CancellationToken.None), cancel);

    /// <summary>
    /// Every cell of the dataset (wet and dry) by cell id, with positions, grid indices and depths, held in memory
    /// and reloaded after each load of files: layers take positions from here instead of joining the cell table.
    /// </summary>
    public async Task<CellTable> CellsAsync(DatasetRecord dataset, CancellationToken cancel)
    {
        var stamp = await SeriesStampAsync(dataset, cancel);
        return await SharedAsync(("cells", dataset.Id, dataset.CreatedAtUtc, stamp.Token),
            async () => new CellTable(await cells.AllAsync(dataset.Id, CancellationToken.None)));
    }

    /// <summary>
    /// Cells by id from the in-memory cell table, for datasets within <see cref="AtlasApiOptions.PointIndexMaxCells"/>
    /// grid points; null for larger ones, whose positions the database joins in instead.
    /// </summary>
    public async Task<Func<int, CellRecord?>?> CellLookupAsync(DatasetRecord dataset, CancellationToken cancel) =>
        dataset.PointCount <= options.Value.PointIndexMaxCells ? (await CellsAsync(dataset, cancel)).Find : null;

    /// <summary>
    /// The dataset's wet cells indexed in memory for nearest-cell look-ups, rebuilt after each load of files; null
    /// when the dataset has more wet cells than <see cref="AtlasApiOptions.PointIndexMaxCells"/> (the database's
    /// spatial index answers then).
    /// </summary>
    public async Task<WetCellIndex?> WetCellsAsync(DatasetRecord dataset, CancellationToken cancel)
    {
        var stamp = await SeriesStampAsync(dataset, cancel);
        var limit = options.Value.PointIndexMaxCells;
        if (limit <= 0) return null;
        return await SharedAsync(("wet-cells", dataset.Id, dataset.CreatedAtUtc, stamp.Token), async () =>
            await cells.WetCountAsync(dataset.Id, CancellationToken.None) <= limit
                ? new WetCellIndex((await CellsAsync(dataset, CancellationToken.None)).All)
                : null);
    }

    /// <summary>The median distance between neighbouring wet cells, metres (null with fewer than two wet cells).</summary>
    public Task<double?> TypicalSpacingMetresAsync(DatasetRecord dataset, CancellationToken cancel) =>
        CachedAsync(("spacing", dataset.Id, dataset.CreatedAtUtc), SpacingLifetime, () => geometry.TypicalSpacingMetresAsync(dataset.Id, CancellationToken.None), cancel);

    /// <summary>The envelope of the grid (wet and dry cell centres), or null when the dataset has no cell.</summary>
    public Task<(double West, double South, double East, double North)?> ExtentAsync(DatasetRecord dataset, CancellationToken cancel) =>
        CachedAsync(("extent", dataset.Id, dataset.CreatedAtUtc), TimelineLifetime, () => geometry.GridExtentAsync(dataset.Id, CancellationToken.None), cancel);

    public void Forget(string slug) => cache.Remove(("dataset", slug));

    /// <summary>
    /// A large value loaded once per key however many requests ask for it at the same moment, then kept while it is
    /// used.
    /// </summary>
    private Task<T> SharedAsync<T>(object key, Func<Task<T>> load) =>
        LoadOnceAsync(key, load, new MemoryCacheEntryOptions { SlidingExpiration = LargeValueIdleLifetime });

    /// <summary>
    /// A small value kept for <paramref name="lifetime"/>. When it lapses under load, the requests that arrive together
    /// share one reload rather than each sending the same query (which queued them all for connections, every few
    /// seconds, behind a burst of identical queries). The load runs to its end whoever waits; a caller that gives up
    /// stops waiting only.
    /// </summary>
    private Task<T> CachedAsync<T>(object key, TimeSpan lifetime, Func<Task<T>> load, CancellationToken cancel) =>
        LoadOnceAsync(key, load, new MemoryCacheEntryOptions { AbsoluteExpirationRelativeToNow = lifetime }).WaitAsync(cancel);

    /// <summary>One load per key for all the callers that ask while it runs or is kept; a failed load is forgotten so that the next request tries again.</summary>
    private Task<T> LoadOnceAsync<T>(object key, Func<Task<T>> load, MemoryCacheEntryOptions keep)
    {
        Lazy<Task<T>>? entry;
        lock (_gate)
        {
            if (!cache.TryGetValue(key, out entry))
            {
                entry = new Lazy<Task<T>>(async () =>
                {
                    try { return await load(); }
                    catch { cache.Remove(key); throw; }
                });
                cache.Set(key, entry, keep);
            }
        }
        return entry!.Value;
    }
}
