namespace Atlas.Api.Layers;

/// <summary>A layer's values with what is needed to draw and describe them.</summary>
public sealed record LayerData(DatasetRecord Dataset, LayerRequest Request, IReadOnlyList<LayerValue> Values, Provenance Provenance, string Units)
{
    public string Title => $"{ParameterCatalogue.LongName(Request.Parameter)}, {ParameterCatalogue.StatisticLongName(Request.Statistic)}, {Request.Period.Name}";
}

/// <summary>
/// Renders layer downloads and keeps them in the layer cache. The cache key holds the statistics stamp, so a
/// recomputation of the dataset's statistics makes new downloads (and new ETags) at once.
/// </summary>
public sealed class LayerRenderer(
    DatasetCatalog catalog,
    StatisticsStore statistics,
    CellStore cells,
    LayerCacheStore layerCache,
    ProvenanceBuilder provenance,
    CellFootprints footprints,
    DryCellLand land,
    IMemoryCache memory,
    IOptions<AtlasApiOptions> options)
{
    /// <summary>The rendered download, or null when the dataset has no values for this parameter, statistic and period.</summary>
    public async Task<CachedLayer?> RenderAsync(DatasetRecord dataset, LayerRequest request, CancellationToken cancel)
    {
        var stamp = await catalog.StatisticsStampAsync(dataset, cancel);
        var key = request.CacheKey(stamp.Token);
        if (await layerCache.FindAsync(dataset.Id, key, cancel) is { } cached) return cached;

        var data = await LoadAsync(dataset, request, cancel);
        if (data is null) return null;
        var content = request.Format switch
        {
            LayerFormat.Csv => LayerCsvWriter.Write(data),
            LayerFormat.GeoJson => LayerGeoJsonWriter.Write(data, request.Polygons ? await footprints.ForAsync(dataset, cancel) : null),
            LayerFormat.Tif => GeoTiffWriter.Write(await RasteriseAsync(data, cancel), GeoTiffMetadataOf(data), data.Provenance.GeneratedAtUtc),
            LayerFormat.Nc => LayerNetCdfWriter.Write(await RasteriseAsync(data, cancel), data),
            LayerFormat.Svg => LayerFigureRenderer.RenderSvg(await RasteriseAsync(data, cancel), data, (await land.ForAsync(dataset, cancel)).Polygons),
            _ => LayerFigureRenderer.RenderPng(await RasteriseAsync(data, cancel), data, (await land.ForAsync(dataset, cancel)).Polygons),
        };
        var etag = "\"" + Convert.ToHexStringLower(SHA256.HashData(content))[..32] + "\"";
        var layer = new CachedLayer(etag, request.Format.ContentType(), content);
        await layerCache.PutAsync(dataset.Id, key, layer, cancel);
        return layer;
    }

    public async Task<LayerData?> LoadAsync(DatasetRecord dataset, LayerRequest request, CancellationToken cancel)
    {
        var values = await statistics.LayerAsync(dataset.Id, request.Parameter, request.Period,
            request.Statistic, await catalog.CellLookupAsync(dataset, cancel), cancel: cancel);
        // Depth is a property of the cell, not a statistic of the series: without stored rows it is the cell depth.
        if (values.Count == 0 && request.Parameter == WaveParameter.Depth && request.Statistic == StatisticKind.Mean && request.Period == AtlasPeriod.Annual)
            values = await DepthsAsync(dataset, cancel);
        if (values.Count == 0) return null;
        // A layer download is a function of the stored statistics alone, so it carries their time as its own: drawn
        // again after the cache is emptied it is the same file (same ETag), and its companions (the CSV's metadata,
        // the figure's sidecar), made on another request, state the same time as the file they describe.
        var source = await provenance.ForAsync(dataset, cancel);
        source = source with { GeneratedAtUtc = source.StatisticsComputedAtUtc ?? dataset.CreatedAtUtc };
        return new LayerData(dataset, request, values, source, ParameterCatalogue.UnitOf(request.Parameter, request.Statistic));
    }

    /// <summary>True when some wet cell of the dataset has a depth.</summary>
    public async Task<bool> HasDepthsAsync(DatasetRecord dataset, CancellationToken cancel) => (await DepthsAsync(dataset, cancel)).Count > 0;

    private async Task<IReadOnlyList<LayerValue>> DepthsAsync(DatasetRecord dataset, CancellationToken cancel) =>
        (await memory.GetOrCreateAsync(("depths", dataset.Id, dataset.CreatedAtUtc), async entry =>
        {
            entry.AbsoluteExpirationRelativeToNow = TimeSpan.FromMinutes(10);
            return (await catalog.CellsAsync(dataset, cancel)).All
                .Where(c => c.Wet && c.DepthMetres is not null)
                .Select(c => new LayerValue(c.CellId, c.Longitude, c.Latitude, c.GridI, c.GridJ, c.DepthMetres, c.DepthMetres!.Value))
                .ToArray();
        }))!;

    /// <summary>The layer on a longitude/latitude raster: one pixel per cell on an even regular grid, else by triangles.</summary>
    public async Task<LayerRaster> RasteriseAsync(LayerData data, CancellationToken cancel)
    {
        var dataset = data.Dataset;
        if (dataset.GridKind == "regular" && GridAxes.From(dataset.GridJson) is { IsUniform: true } axes)
            return LayerRasteriser.OnRegularGrid(axes, data.Values);
        var triangles = dataset.GridKind == "mesh"
            ? await memory.GetOrCreateAsync(("triangles", dataset.Id, dataset.CreatedAtUtc), async entry =>
            {
                entry.AbsoluteExpirationRelativeToNow = TimeSpan.FromMinutes(10);
                return await cells.TrianglesAsync(dataset.Id, cancel);
            }) ?? []
            : LayerRasteriser.GridTriangles(data.Values);
        return LayerRasteriser.OnTriangles(data.Values, triangles, options.Value.LayerMaxPixels);
    }

    private static GeoTiffMetadata GeoTiffMetadataOf(LayerData data)
    {
        var p = data.Provenance;
        var items = new List<KeyValuePair<string, string>>
        {
            new("dataset", $"{p.Dataset} ({p.Title})"),
            new("parameter", data.Request.Parameter.Symbol()),
            new("statistic", data.Request.Statistic.Name()),
            new("period", data.Request.Period.Name),
            new("units", data.Units),
            new("source_files", p.SourceFilesText()),
            new("software", $"{p.Software} {p.SoftwareVersion}"),
            new("statistics_computed_at", p.StatisticsComputedAtUtc?.ToString("O") ?? "not computed"),
            new("generated_at", p.GeneratedAtUtc.ToString("O")),
            new("method", p.MethodNotes),
            new("assumptions", p.AssumptionsText()),
            new("caution", p.Caution),
        };
        if (p.Citation is { } citation) items.Add(new("citation", citation));
        return new GeoTiffMetadata($"{data.Title} ({data.Units}); dataset {p.Dataset}. {p.Caution}", items,
            $"{data.Request.Parameter.Symbol()} {data.Request.Statistic.Name()} {data.Request.Period.Name}", data.Units, p.Licence);
    }
}
