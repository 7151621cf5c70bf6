using System.Globalization;
using System.Text.Json;
using System.Text;
using Atlas.Api.Downloads;
using Atlas.Api.Model;
using Atlas.Api.Rasters;
using Atlas.Ingest.Assessment;
using Atlas.Ingest.Validation;
using Atlas.Storage.Cells;
using Atlas.Storage.Datasets;
using Atlas.Storage.Statistics;

namespace Atlas.Api.Assessment;

/// <summary>
/// Writes an assessment layer as JSON, CSV, GeoJSON (cell centre points) or a GeoTIFF of its primary value, each with the
/// layer's description, the provenance and the caution. Cells without a value (NaN) are left out of the tables and are
/// nodata in the GeoTIFF.
/// </summary>
public static class AssessmentLayerWriter
{
    public static readonly string[] Formats = ["json", "csv", "geojson", "tif"];

    public static string ContentType(string format) => format switch
    {
        "csv" => "text/csv; charset=utf-8",
        "geojson" => "application/geo+json",
        "tif" => "image/tiff",
        _ => "application/json",
    };

    public static byte[] Write(string format, DatasetRecord dataset, AssessmentLayer layer, IReadOnlyDictionary<int, CellRecord> cells, Provenance provenance) => format switch
    {
        "csv" => Csv(layer, cells, provenance, ValidationReporting.SummaryLines(dataset.MetadataJson)),
        "geojson" => GeoJson(layer, cells, provenance, ValidationReporting.SummaryLines(dataset.MetadataJson), geo: true),
        "tif" => GeoTiff(dataset, layer, cells, provenance),
        _ => GeoJson(layer, cells, provenance, ValidationReporting.SummaryLines(dataset.MetadataJson), geo: false),
    };

    private static IEnumerable<(int Index, CellRecord Cell)> Valued(AssessmentLayer layer, IReadOnlyDictionary<int, CellRecord> cells)
    {
        for (var i = 0; i < layer.CellIds.Length; i++)
            if (double.IsFinite(layer.Primary.Values[i]) && cells.TryGetValue(layer.CellIds[i], out var cell)) yield return (i, cell);
    }

    private static byte[] Csv(AssessmentLayer layer, IReadOnlyDictionary<int, CellRecord> cells, Provenance provenance, IReadOnlyList<string> validation)
    {
        var c = CultureInfo.InvariantCulture;
        var text = new StringBuilder();
        text.Append("# layer: ").Append(layer.Title).Append('\n');
        text.Append("# method: ").Append(layer.Description).Append('\n');
        text.Append("# units: ").Append(string.Join("; ", layer.Columns.Select(k => $"{k.Name} {k.Unit}"))).Append("; lon and lat in degrees (EPSG:4326)\n");
        text.Append("# computed_at: ").Append(layer.ComputedAtUtc.ToString("O", c)).Append('\n');
        foreach (var line in provenance.HeaderLines()) text.Append(line).Append('\n');
        foreach (var line in validation) text.Append("# validation: ").Append(line).Append('\n');
        text.Append("cell_id,lon,lat,").Append(string.Join(',', layer.Columns.Select(k => k.Name))).Append('\n');
        foreach (var (i, cell) in Valued(layer, cells))
        {
            text.Append(cell.CellId.ToString(c)).Append(',').Append(cell.Longitude.ToString("0.######", c)).Append(',').Append(cell.Latitude.ToString("0.######", c));
            foreach (var column in layer.Columns) text.Append(',').Append(double.IsFinite(column.Values[i]) ? column.Values[i].ToString("R", c) : "");
            text.Append('\n');
        }
        return new UTF8Encoding(false).GetBytes(text.ToString());
    }

    private static byte[] GeoJson(AssessmentLayer layer, IReadOnlyDictionary<int, CellRecord> cells, Provenance provenance, IReadOnlyList<string> validation, bool geo)
    {
        using var buffer = new MemoryStream();
        using (var json = new Utf8JsonWriter(buffer))
        {
            json.WriteStartObject();
            if (geo) json.WriteString("type", "FeatureCollection");
            json.WriteStartObject("layer");
            json.WriteString("kind", layer.Kind);
            json.WriteString("title", layer.Title);
            json.WriteString("value", layer.Primary.Name);
            json.WriteString("units", layer.Primary.Unit);
            json.WriteString("method", layer.Description);
            json.WriteString("computed_at", layer.ComputedAtUtc);
            json.WriteStartObject("columns");
            foreach (var column in layer.Columns) json.WriteString(column.Name, column.Unit);
            json.WriteEndObject();
            json.WriteEndObject();
            json.WritePropertyName("provenance");
            JsonSerializer.Serialize(json, provenance, GeoJsonSerialisation.Options);
            json.WriteString("caution", provenance.Caution);
            json.WriteStartArray("validation");
            foreach (var line in validation) json.WriteStringValue(line);
            json.WriteEndArray();
            json.WriteStartArray(geo ? "features" : "cells");
            foreach (var (i, cell) in Valued(layer, cells))
            {
                json.WriteStartObject();
                if (geo)
                {
                    json.WriteString("type", "Feature");
                    json.WriteNumber("id", cell.CellId);
                    json.WriteStartObject("geometry");
                    json.WriteString("type", "Point");
                    json.WritePropertyName("coordinates");
                    LayerGeoJsonWriter.WritePosition(json, cell.Longitude, cell.Latitude);
                    json.WriteEndObject();
                    json.WriteStartObject("properties");
                }
                json.WriteNumber("cell_id", cell.CellId);
                if (!geo)
                {
                    json.WriteNumber("lon", Math.Round(cell.Longitude, 7));
                    json.WriteNumber("lat", Math.Round(cell.Latitude, 7));
                }
                json.WriteNumber("value", layer.Primary.Values[i]);
                foreach (var column in layer.Columns)
                    if (double.IsFinite(column.Values[i])) json.WriteNumber(column.Name, column.Values[i]);
                    else json.WriteNull(column.Name);
                if (cell.DepthMetres is { } depth) json.WriteNumber("depth_m", Math.Round(depth, 2));
                else json.WriteNull("depth_m");
                if (geo) json.WriteEndObject();
                json.WriteEndObject();
            }
            json.WriteEndArray();
            json.WriteEndObject();
        }
        return buffer.ToArray();
    }

    /// <summary>The primary value on the dataset's regular grid (one pixel per cell); mesh and uneven grids are refused.</summary>
    private static byte[] GeoTiff(DatasetRecord dataset, AssessmentLayer layer, IReadOnlyDictionary<int, CellRecord> cells, Provenance provenance)
    {
        if (dataset.GridKind != "regular" || GridAxes.From(dataset.GridJson) is not { IsUniform: true } axes)
            throw new NotSupportedException($"GeoTIFF assessment layers need an evenly spaced regular grid; dataset '{dataset.Slug}' has a {dataset.GridKind} grid. Use csv, geojson or json.");
        var values = Valued(layer, cells)
            .Select(x => new LayerValue(x.Cell.CellId, x.Cell.Longitude, x.Cell.Latitude, x.Cell.GridI, x.Cell.GridJ, x.Cell.DepthMetres, layer.Primary.Values[x.Index]))
            .ToArray();
        var raster = LayerRasteriser.OnRegularGrid(axes, values);
        var items = new List<KeyValuePair<string, string>>
        {
            new("dataset", $"{provenance.Dataset} ({provenance.Title})"),
            new("layer", layer.Title),
            new("value", layer.Primary.Name),
            new("units", layer.Primary.Unit),
            new("method", layer.Description),
            new("source_files", string.Join("; ", provenance.SourceFiles.Select(f => $"{f.Name} sha256={f.Sha256}"))),
            new("software", $"{provenance.Software} {provenance.SoftwareVersion}"),
            new("generated_at", provenance.GeneratedAtUtc.ToString("O", CultureInfo.InvariantCulture)),
            new("caution", provenance.Caution),
        };
        var validation = ValidationReporting.SummaryLines(dataset.MetadataJson);
        if (validation.Count > 0) items.Add(new("validation", string.Join("; ", validation)));
        var metadata = new GeoTiffMetadata($"{layer.Title} ({layer.Primary.Unit}); dataset {provenance.Dataset}. {provenance.Caution}", items,
            layer.Primary.Name, layer.Primary.Unit, provenance.Licence);
        return GeoTiffWriter.Write(raster, metadata, provenance.GeneratedAtUtc);
    }
}
