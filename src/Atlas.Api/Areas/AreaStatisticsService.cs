using NetTopologySuite.Geometries.Prepared;

namespace Atlas.Api.Areas;

/// <summary>A polygon read and resolved to the wet cells whose centres lie inside it.</summary>
public sealed record AreaSelection(DatasetRecord Dataset, Geometry Area, double AreaKm2, IReadOnlyList<CellFootprint> Inside);

/// <summary>
/// The area statistics every caller shares: <c>POST /area</c> and the area report read the polygon, select the cells
/// inside it and summarise a layer over them here, so that a report prints the numbers the endpoint answers.
/// </summary>
public sealed class AreaStatisticsService(DatasetCatalog catalog, StatisticsStore statistics, AreaQueries areas, CellFootprints footprints,
    ProvenanceBuilder provenance, IOptions<AtlasApiOptions> options)
{
    public const string Method =
        "Cells count as inside when their centre lies in the interior of the area (centres on the boundary are outside, as " +
        "PostGIS ST_Within). mean, min, max and the percentiles (Hyndman-Fan type 7, NumPy's default) are over the cells' values; " +
        "area_weighted_mean weights each cell by its footprint area. Areas are on the WGS 84 spheroid: area_km2 of the polygon " +
        "as sent, cell_area_km2 and area_above_threshold_km2 as the sum of the footprints of the cells inside (strictly above the threshold).";

    /// <summary>
    /// The polygon of <paramref name="body"/> and the wet cells inside it, or the problem: an unknown dataset, a body
    /// that is no valid polygon, an area above the size limit, or one holding no wet cell.
    /// </summary>
    public async Task<(AreaSelection? Selection, ProblemHttpResult? Problem)> SelectAsync(string slug, byte[] body, CancellationToken cancel)
    {
        var limits = options.Value;
        var dataset = await catalog.FindAsync(slug, cancel);
        if (dataset is null) return (null, ApiProblems.UnknownDataset(slug));

        var reading = AreaGeometryReader.Read(body, limits.AreaMaxVertices);
        if (reading.Area is not { } area) return (null, TypedResults.Problem(statusCode: reading.Status, title: reading.Title, detail: reading.Problem));
        var areaKm2 = await areas.SpheroidAreaSquareMetresAsync(area, cancel) / 1e6;
        if (areaKm2 > limits.AreaMaxSquareKilometres)
            return (null, ApiProblems.Unprocessable("The area is too large",
                $"The polygon covers {areaKm2:0.#} km2; the limit is {limits.AreaMaxSquareKilometres:0.#} km2. Send a smaller area, or download the layer (GET .../layers) and summarise it locally."));

        var cells = await footprints.ForAsync(dataset, cancel);
        var prepared = PreparedGeometryFactory.Prepare(area);
        var inside = cells.Values.Where(c => prepared.Contains(new Point(c.Longitude, c.Latitude))).ToArray();
        if (inside.Length == 0)
        {
            var spacing = await catalog.TypicalSpacingMetresAsync(dataset, cancel);
            return (null, ApiProblems.Unprocessable("No cell inside the area",
                $"No wet cell of '{slug}' has its centre inside the polygon ({areaKm2:0.###} km2). Cells are about " +
                $"{(spacing ?? 0) / 1000:0.##} km apart: draw the area over the sea within the dataset extent, and larger than one cell."));
        }
        return (new AreaSelection(dataset, area, areaKm2, inside), null);
    }

    /// <summary>A layer's value at every wet cell that has one, by cell id.</summary>
    public async Task<IReadOnlyDictionary<int, double>> LayerAsync(DatasetRecord dataset, WaveParameter parameter, StatisticKind statistic, AtlasPeriod period,
        CancellationToken cancel) =>
        (await statistics.LayerAsync(dataset.Id, parameter, period, statistic, await catalog.CellLookupAsync(dataset, cancel), cancel: cancel))
            .ToDictionary(v => v.CellId, v => v.Value);

    /// <summary>The answer of <c>POST /area</c>: the layer summarised over the cells inside, and the part above the threshold when one is given.</summary>
    public async Task<AreaStatistics> StatisticsAsync(AreaSelection selection, WaveParameter parameter, StatisticKind statistic, AtlasPeriod period,
        double? threshold, IReadOnlyDictionary<int, double> values, CancellationToken cancel)
    {
        var inside = selection.Inside;
        var withValue = inside.Where(c => values.ContainsKey(c.CellId)).ToArray();
        var sorted = withValue.Select(c => values[c.CellId]).Order().ToArray();
        double? Stat(Func<double> f) => sorted.Length == 0 ? null : f();
        var weight = withValue.Sum(c => c.SquareKilometres);
        var above = threshold is { } l ? withValue.Where(c => values[c.CellId] > l).ToArray() : null;
        return new AreaStatistics(
            selection.Dataset.Slug, new LayerChoice(parameter.Symbol(), statistic.Name(), period.Name, ParameterCatalogue.UnitOf(parameter, statistic)),
            selection.AreaKm2, inside.Count, withValue.Length, inside.Sum(c => c.SquareKilometres),
            Stat(() => sorted.Average()),
            Stat(() => withValue.Sum(c => values[c.CellId] * c.SquareKilometres) / weight),
            Stat(() => sorted[0]), Stat(() => sorted[^1]),
            Stat(() => ExactQuantile.OfSorted(sorted, 0.10)), Stat(() => ExactQuantile.OfSorted(sorted, 0.50)), Stat(() => ExactQuantile.OfSorted(sorted, 0.90)),
            threshold, above?.Length, above?.Sum(c => c.SquareKilometres),
            Method, await provenance.ForAsync(selection.Dataset, cancel), AtlasCaution.Text);
    }
}
