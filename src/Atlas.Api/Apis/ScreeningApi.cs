using System.Text.Json;
using Atlas.Api.Catalog;
using Atlas.Api.Downloads;
using Atlas.Api.Errors;
using Atlas.Api.Footprints;
using Atlas.Api.Model;
using Atlas.Api.Requests;
using Atlas.Api.Security;
using Atlas.Api.Vocabulary;
using Atlas.Statistics;
using Atlas.Storage.Queries;
using Microsoft.AspNetCore.Http.HttpResults;

namespace Atlas.Api.Apis;

/// <summary><c>GET /api/v1/datasets/{slug}/screen</c>: the wet cells that meet site-screening criteria.</summary>
public static class ScreeningApi
{
    public static IEndpointRouteBuilder MapScreeningApi(this IEndpointRouteBuilder routes)
    {
        routes.MapGet("/api/v1/datasets/{slug}/screen", ScreenAsync).WithTags("Screening").WithName("ScreenSites")
            .WithSummary("Cells meeting site-screening criteria, as GeoJSON with their count and total area")
            .WithDescription(
                "Criteria (each optional; all given must hold): min_power_kw_m (mean power of the period, kW/m), min_depth_m and " +
                "max_depth_m (depth positive down; a cell of unknown depth fails a depth criterion), max_coast_distance_km " +
                "(distance to the nearest dry cell of the dataset), max_hs_p90_m (90th percentile of Hs). period defaults to annual. " +
                "The answer is a GeoJSON FeatureCollection of cell centres with count, total_area_km2 (footprints on the spheroid), " +
                "the criteria, the provenance and the caution as top-level members.")
            .Produces(200, contentType: "application/geo+json")
            .RequireRateLimiting(RateLimits.Expensive);
        return routes;
    }

    public static async Task<Results<FileContentHttpResult, ProblemHttpResult, ValidationProblem>> ScreenAsync(
        string slug, [AsParameters] ScreeningQuery query, DatasetCatalog catalog, ScreeningQueries screening, CellFootprints footprints,
        ProvenanceBuilder provenance, CancellationToken cancel)
    {
        var errors = new QueryErrors();
        if (query.Read(errors) is not { } bounds) return TypedResults.ValidationProblem(errors, title: "The screening criteria are invalid");

        var dataset = await catalog.FindAsync(slug, cancel);
        if (dataset is null) return ApiProblems.UnknownDataset(slug);
        var criteria = new ScreeningCriteria((short)WaveParameter.J, (short)WaveParameter.Hs, bounds.Period.Code, bounds.MinPowerKwM,
            bounds.MinDepthM, bounds.MaxDepthM, bounds.MaxCoastDistanceKm * 1000, bounds.MaxHsP90M);
        var cells = await screening.MatchingCellsAsync(dataset.Id, criteria, cancel);
        var areas = await footprints.ForAsync(dataset, cancel);
        var source = await provenance.ForAsync(dataset, cancel);

        using var buffer = new MemoryStream();
        using (var json = new Utf8JsonWriter(buffer))
        {
            json.WriteStartObject();
            json.WriteString("type", "FeatureCollection");
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
            json.WritePropertyName("provenance");
            JsonSerializer.Serialize(json, source, GeoJsonSerialisation.Options);
            json.WriteString("caution", AtlasCaution.Text);
            json.WriteStartArray("features");
            foreach (var c in cells)
            {
                json.WriteStartObject();
                json.WriteString("type", "Feature");
                json.WriteNumber("id", c.CellId);
                json.WriteStartObject("geometry");
                json.WriteString("type", "Point");
                json.WritePropertyName("coordinates");
                LayerGeoJsonWriter.WritePosition(json, c.Longitude, c.Latitude);
                json.WriteEndObject();
                json.WriteStartObject("properties");
                json.WriteNumber("cell_id", c.CellId);
                json.WriteNumber("mean_power_kw_m", Math.Round(c.MeanPowerKilowattsPerMetre, 4));
                WriteBound(json, "hs_p90_m", c.HsP90Metres is { } h ? Math.Round(h, 4) : null);
                WriteBound(json, "depth_m", c.DepthMetres is { } d ? Math.Round(d, 2) : null);
                WriteBound(json, "coast_distance_km", c.CoastDistanceMetres is { } k ? Math.Round(k / 1000, 4) : null);
                WriteBound(json, "area_km2", areas.TryGetValue(c.CellId, out var fp) ? Math.Round(fp.SquareKilometres, 6) : null);
                json.WriteEndObject();
                json.WriteEndObject();
            }
            json.WriteEndArray();
            json.WriteEndObject();
        }
        return TypedResults.File(buffer.ToArray(), "application/geo+json");
    }

    private static void WriteBound(Utf8JsonWriter json, string name, double? value)
    {
        if (value is { } v) json.WriteNumber(name, v);
        else json.WriteNull(name);
    }
}
