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
        "csv" => CsvTable.ContentType,
        "geojson" => "application/geo+json",
        "tif" => "image/tiff",
        _ => "application/json",
    };

    public static byte[] Write(string format, DatasetRecord dataset, AssessmentLayer layer, IReadOnlyDictionary<int, CellRecord> cells, Provenance provenance) => format switch
    {
        "csv" => Csv(dataset, layer, cells, provenance),
        "geojson" => GeoJson(layer, cells, provenance, ValidationReporting.SummaryLines(dataset.MetadataJson), geo: true),
        "tif" => GeoTiff(dataset, layer, cells, provenance),
        _ => GeoJson(layer, cells, provenance, ValidationReporting.SummaryLines(dataset.MetadataJson), geo: false),
    };

    private static IEnumerable<(int Index, CellRecord Cell)> Valued(AssessmentLayer layer, IReadOnlyDictionary<int, CellRecord> cells)
    {
        for (var i = 0; i < layer.CellIds.Length; i++)
            if (double.IsFinite(layer.Primary.Values[i]) && cells.TryGetValue(layer.CellIds[i], out var cell)) yield return (i, cell);
    }

    /// <summary>The description of the layer's CSV, from which its header and its CSVW metadata are written.</summary>
    public static CsvTable CsvTableOf(DatasetRecord dataset, AssessmentLayer layer, Provenance provenance)
    {
        List<string> notes = [$"Method: {layer.Description}", $"Layer computed at {layer.ComputedAtUtc.ToString("yyyy-MM-dd'T'HH:mm:ss'Z'", CultureInfo.InvariantCulture)}."];
        notes.AddRange(ValidationReporting.SummaryLines(dataset.MetadataJson).Select(line => "Validation: " + line));
        return new CsvTable(layer.Title, $"One row per wet cell with a value of the layer '{layer.Title}' of dataset {provenance.Dataset}, in cell order.",
            [CsvColumn.CellId, CsvColumn.Longitude, CsvColumn.Latitude, .. layer.Columns.Select(k => CsvColumn.Double(k.Name, k.Name.Replace('_', ' '), k.Unit))],
            provenance, notes);
    }

    private static byte[] Csv(DatasetRecord dataset, AssessmentLayer layer, IReadOnlyDictionary<int, CellRecord> cells, Provenance provenance) =>
        CsvTableOf(dataset, layer, provenance).ToBytes(rows =>
        {
            foreach (var (i, cell) in Valued(layer, cells))
            {
                rows.Integer(cell.CellId).Number(cell.Longitude, "0.######").Number(cell.Latitude, "0.######");
                foreach (var column in layer.Columns) rows.Number(column.Values[i]);
                rows.EndRow();
            }
        });

    private static byte[] GeoJson(AssessmentLayer layer, IReadOnlyDictionary<int, CellRecord> cells, Provenance provenance, IReadOnlyList<string> validation, bool geo)
    {
        void Members(Utf8JsonWriter json)
        {
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
            GeoJsonWriter.WriteMember(json, "provenance", provenance);
            json.WriteString("caution", provenance.Caution);
            GeoJsonWriter.WriteMember(json, "validation", validation);
        }

        // The GeoJSON features carry the cell as their point; the plain JSON rows carry its lon and lat instead.
        AttributesTable Row(int i, CellRecord cell)
        {
            var row = new AttributesTable();
            if (geo) row.Add(GeoJsonWriter.IdAttribute, cell.CellId);
            row.Add("cell_id", cell.CellId);
            if (!geo)
            {
                row.Add("lon", Math.Round(cell.Longitude, 7));
                row.Add("lat", Math.Round(cell.Latitude, 7));
            }
            row.Add("value", layer.Primary.Values[i]);
            foreach (var column in layer.Columns) row.Add(column.Name, double.IsFinite(column.Values[i]) ? column.Values[i] : null);
            row.Add("depth_m", cell.DepthMetres is { } depth ? Math.Round(depth, 2) : null);
            return row;
        }

        var rows = Valued(layer, cells).Select(x => (x.Cell, Row: Row(x.Index, x.Cell)));
        return geo
            ? GeoJsonWriter.FeatureCollection(Members, rows.Select(x => new Feature(GeoJsonWriter.Point(x.Cell.Longitude, x.Cell.Latitude), x.Row)))
            : GeoJsonWriter.AttributeDocument(Members, "cells", rows.Select(x => x.Row));
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
            new("source_files", provenance.SourceFilesText()),
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
