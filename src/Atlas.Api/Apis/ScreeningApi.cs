namespace Atlas.Api.Apis;

/// <summary><c>GET /api/v1/datasets/{slug}/screen</c>: the wet cells that meet site-screening criteria.</summary>
public static class ScreeningApi
{
    public static IEndpointRouteBuilder MapScreeningApi(this IEndpointRouteBuilder routes)
    {
        routes.MapGet("/api/v1/datasets/{slug}/screen", ScreenAsync).WithTags("Screening")
            .ProducesFile("application/geo+json", "text/csv", CsvwMetadataWriter.MediaType)
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
        "the criteria, the provenance and the caution as top-level members. format=csv gives the same cells as plain RFC 4180 CSV " +
        "(cell_id, lon, lat and the values), whose criteria, count, total area, units, provenance and caution are in its W3C CSV on the " +
        "Web metadata (format=csvw with the same query, application/csvm+json, named by the CSV answer's Link header with rel=describedby).")]
    public static async Task<Results<FileContentHttpResult, ProblemHttpResult, ValidationProblem>> ScreenAsync(
        string slug, [AsParameters] ScreeningQuery query, DatasetCatalog catalog, ScreeningQueries screening, CellFootprints footprints,
        ProvenanceBuilder provenance, HttpContext http, CancellationToken cancel)
    {
        var errors = new QueryErrors();
        var form = query.Form(errors);
        if (query.Read(errors) is not { } bounds || errors.Count > 0) return TypedResults.ValidationProblem(errors, title: "The screening criteria are invalid");

        var dataset = await catalog.FindAsync(slug, cancel);
        if (dataset is null) return ApiProblems.UnknownDataset(slug);
        var criteria = new ScreeningCriteria(bounds.Period, bounds.MinPowerKwM, bounds.MinDepthM, bounds.MaxDepthM,
            bounds.MaxCoastDistanceKm * 1000, bounds.MaxHsP90M);
        var cells = await screening.MatchingCellsAsync(dataset.Id, criteria, cancel);
        var areas = await footprints.ForAsync(dataset, cancel);
        var source = await provenance.ForAsync(dataset, cancel);
        double? Area(int cellId) => areas.TryGetValue(cellId, out var f) ? Math.Round(f.SquareKilometres, 6) : null;
        if (form is { } tabular)
        {
            var table = CsvTableOf(bounds, cells.Count, Math.Round(cells.Sum(c => areas.TryGetValue(c.CellId, out var f) ? f.SquareKilometres : 0), 6), source);
            if (tabular == TableFormat.CsvMetadata)
                return TypedResults.File(CsvwMetadataWriter.Write(table, CsvMetadataLinks.FormatForm(http.Request, "csv")), CsvwMetadataWriter.MediaType,
                    $"{slug}_screening.csv-metadata.json");
            CsvMetadataLinks.Describe(http.Response, CsvMetadataLinks.FormatForm(http.Request, CsvMetadataLinks.FormatValue));
            return TypedResults.File(table.ToBytes(rows =>
            {
                foreach (var c in cells)
                {
                    rows.Integer(c.CellId).Number(c.Longitude, "0.######").Number(c.Latitude, "0.######")
                        .Number(Math.Round(c.MeanPowerKilowattsPerMetre, 4)).Number(c.HsP90Metres is { } h ? Math.Round(h, 4) : null)
                        .Number(c.DepthMetres is { } d ? Math.Round(d, 2) : null).Number(c.CoastDistanceMetres is { } k ? Math.Round(k / 1000, 4) : null)
                        .Number(Area(c.CellId));
                    rows.EndRow();
                }
            }), CsvTable.ContentType, $"{slug}_screening.csv");
        }

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

    /// <summary>The description of the screening CSV: the criteria, the count and the total area go to its metadata.</summary>
    private static CsvTable CsvTableOf(ScreeningBounds bounds, int count, double totalAreaKm2, Provenance source)
    {
        var criteria = string.Join(", ", new (string Name, double? Value)[]
            {
                ("min_power_kw_m", bounds.MinPowerKwM), ("min_depth_m", bounds.MinDepthM), ("max_depth_m", bounds.MaxDepthM),
                ("max_coast_distance_km", bounds.MaxCoastDistanceKm), ("max_hs_p90_m", bounds.MaxHsP90M),
            }.Where(c => c.Value is not null).Select(c => string.Create(CultureInfo.InvariantCulture, $"{c.Name} {c.Value}")));
        return new CsvTable(
            $"Site screening of dataset {source.Dataset}, period {bounds.Period.Name}",
            string.Create(CultureInfo.InvariantCulture,
                $"The {count} wet cells meeting every criterion ({(criteria.Length == 0 ? "none given" : criteria)}; period {bounds.Period.Name}), " +
                $"{totalAreaKm2} km2 in all (cell footprints on the spheroid). One row per cell."),
            [
                CsvColumn.CellId, CsvColumn.Longitude, CsvColumn.Latitude,
                CsvColumn.Double("mean_power_kw_m", "mean wave power of the period", "kW/m"),
                CsvColumn.Double("hs_p90_m", "90th percentile of Hs", "m"),
                CsvColumn.Double("depth_m", "depth, positive down", "m"),
                CsvColumn.Double("coast_distance_km", "distance to the nearest dry cell of the dataset", "km"),
                CsvColumn.Double("area_km2", "area of the cell footprint", "km2"),
            ],
            source,
            ["A cell of unknown depth fails a depth criterion."]);
    }

    private static void WriteBound(Utf8JsonWriter json, string name, double? value)
    {
        if (value is { } v) json.WriteNumber(name, v);
        else json.WriteNull(name);
    }
}
