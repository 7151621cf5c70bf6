namespace Atlas.Api.Apis;

/// <summary><c>GET /api/v1/datasets/{slug}/screen</c>: the wet cells that meet site-screening criteria.</summary>
public static class ScreeningApi
{
    public static IEndpointRouteBuilder MapScreeningApi(this IEndpointRouteBuilder routes)
    {
        routes.MapGet("/api/v1/datasets/{slug}/screen", ScreenAsync).WithTags("Screening")
            .ProducesFile("application/geo+json")
            .ProducesProblems(StatusCodes.Status404NotFound)
            .RequireExpensiveLimit();
        return routes;
    }

    [EndpointName("ScreenSites")]
    [EndpointSummary("Cells meeting site-screening criteria, as GeoJSON with their count and total area")]
    [EndpointDescription(
        "Criteria (each optional; all given must hold): min_power_kw_m (mean power of the period, kW/m), min_depth_m and " +
        "max_depth_m (depth positive down; a cell of unknown depth fails a depth criterion), max_coast_distance_km " +
        "(distance to the nearest dry cell of the dataset), max_hs_p90_m (90th percentile of Hs). period defaults to annual. " +
        "The answer is a GeoJSON FeatureCollection of cell centres with count, total_area_km2 (footprints on the spheroid), " +
        "the criteria, the provenance and the caution as top-level members.")]
    public static async Task<Results<FileContentHttpResult, ProblemHttpResult, ValidationProblem>> ScreenAsync(
        string slug, [AsParameters] ScreeningQuery query, DatasetCatalog catalog, ScreeningQueries screening, CellFootprints footprints,
        ProvenanceBuilder provenance, CancellationToken cancel)
    {
        var errors = new QueryErrors();
        if (query.Read(errors) is not { } bounds) return TypedResults.ValidationProblem(errors, title: "The screening criteria are invalid");

        var dataset = await catalog.FindAsync(slug, cancel);
        if (dataset is null) return ApiProblems.UnknownDataset(slug);
        var criteria = new ScreeningCriteria(bounds.Period, bounds.MinPowerKwM, bounds.MinDepthM, bounds.MaxDepthM,
            bounds.MaxCoastDistanceKm * 1000, bounds.MaxHsP90M);
        var cells = await screening.MatchingCellsAsync(dataset.Id, criteria, cancel);
        var areas = await footprints.ForAsync(dataset, cancel);
        var source = await provenance.ForAsync(dataset, cancel);

        var content = GeoJsonWriter.FeatureCollection(json =>
        {
            json.WriteNumber("count", cells.Count);
            json.WriteNumber("total_area_km2", Math.Round(cells.Sum(c => areas.TryGetValue(c.CellId, out var f) ? f.SquareKilometres : 0), 6));
            json.WriteStartObject("criteria");
            json.WriteString("period", bounds.Period.Name);
            WriteBound(json, "min_power_kw_m", bounds.MinPowerKwM);
            WriteBound(json, "min_depth_m", bounds.MinDepthM);
            WriteBound(json, "max_depth_m", bounds.MaxDepthM);
            WriteBound(json, "max_coast_distance_km", bounds.MaxCoastDistanceKm);
            WriteBound(json, "max_hs_p90_m", bounds.MaxHsP90M);
            json.WriteEndObject();
            GeoJsonWriter.WriteMember(json, "provenance", source);
            json.WriteString("caution", AtlasCaution.Text);
        }, cells.Select(c => new Feature(GeoJsonWriter.Point(c.Longitude, c.Latitude), new AttributesTable
        {
            { GeoJsonWriter.IdAttribute, c.CellId },
            { "cell_id", c.CellId },
            { "mean_power_kw_m", Math.Round(c.MeanPowerKilowattsPerMetre, 4) },
            { "hs_p90_m", c.HsP90Metres is { } h ? Math.Round(h, 4) : null },
            { "depth_m", c.DepthMetres is { } d ? Math.Round(d, 2) : null },
            { "coast_distance_km", c.CoastDistanceMetres is { } k ? Math.Round(k / 1000, 4) : null },
            { "area_km2", areas.TryGetValue(c.CellId, out var fp) ? Math.Round(fp.SquareKilometres, 6) : null },
        })));
        return TypedResults.File(content, "application/geo+json");
    }

    private static void WriteBound(Utf8JsonWriter json, string name, double? value)
    {
        if (value is { } v) json.WriteNumber(name, v);
        else json.WriteNull(name);
    }
}
