using System.Text.Json;
using Atlas.Api.Downloads;
using Atlas.Api.Footprints;
using Atlas.Api.Infrastructure;
using Atlas.Statistics;
using Atlas.Api.Vocabulary;
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
        string slug, string? min_power_kw_m, string? min_depth_m, string? max_depth_m, string? max_coast_distance_km, string? max_hs_p90_m,
        string? period, DatasetCatalog catalog, ScreeningQueries screening, CellFootprints footprints, ProvenanceBuilder provenance,
        CancellationToken cancel)
    {
        var errors = new Dictionary<string, string[]>();
        double? Bound(string name, string? text, string unit)
        {
            if (text is null) return null;
            if (!QueryNumbers.TryParse(text, out var v)) { errors[name] = [$"'{text}' is not a number; give {name} in {unit}."]; return null; }
            if (v < 0) { errors[name] = [$"{name} is {v}; it cannot be negative ({unit})."]; return null; }
            return v;
        }
        var minPower = Bound("min_power_kw_m", min_power_kw_m, "kW/m");
        var minDepth = Bound("min_depth_m", min_depth_m, "m, positive down");
        var maxDepth = Bound("max_depth_m", max_depth_m, "m, positive down");
        var maxCoast = Bound("max_coast_distance_km", max_coast_distance_km, "km");
        var maxHs = Bound("max_hs_p90_m", max_hs_p90_m, "m");
        var t = AtlasPeriod.Annual;
        if (period is not null && !AtlasPeriod.TryParse(period, out t))
            errors["period"] = [VocabularyMessages.UnknownPeriod(period)];
        if (minDepth is { } a && maxDepth is { } b && a > b)
            errors["max_depth_m"] = [$"The depth window is reversed: min_depth_m {a} is greater than max_depth_m {b}; swap them."];
        if (errors.Count > 0) return TypedResults.ValidationProblem(errors, title: "The screening criteria are invalid");

        var dataset = await catalog.FindAsync(slug, cancel);
        if (dataset is null) return ApiProblems.UnknownDataset(slug);
        var criteria = new ScreeningCriteria(t, minPower, minDepth, maxDepth,
            maxCoast * 1000, maxHs);
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
            json.WriteString("period", t.Name);
            WriteBound(json, "min_power_kw_m", minPower);
            WriteBound(json, "min_depth_m", minDepth);
            WriteBound(json, "max_depth_m", maxDepth);
            WriteBound(json, "max_coast_distance_km", maxCoast);
            WriteBound(json, "max_hs_p90_m", maxHs);
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
