using System.Text.Json;
using Atlas.Api.Footprints;
using Atlas.Api.Layers;
using Atlas.Statistics;

namespace Atlas.Api.Downloads;

/// <summary>
/// A layer as a GeoJSON FeatureCollection (RFC 7946): one feature per cell with a value, a point at the cell centre or,
/// when footprints are given, the cell's footprint polygon; the layer description, provenance and caution are
/// foreign members of the collection.
/// </summary>
public static class LayerGeoJsonWriter
{
    public static byte[] Write(LayerData data, IReadOnlyDictionary<int, CellFootprint>? footprints)
    {
        using var buffer = new MemoryStream();
        using (var json = new Utf8JsonWriter(buffer))
        {
            json.WriteStartObject();
            json.WriteString("type", "FeatureCollection");
            json.WriteStartObject("layer");
            json.WriteString("parameter", data.Request.Parameter.Symbol());
            json.WriteString("statistic", data.Request.Statistic.Name());
            json.WriteString("period", data.Request.Period.Name);
            json.WriteString("title", data.Title);
            json.WriteString("units", data.Units);
            json.WriteString("geometry", footprints is null ? "cell centre points" : "cell footprint polygons");
            json.WriteEndObject();
            json.WritePropertyName("provenance");
            JsonSerializer.Serialize(json, data.Provenance, GeoJsonSerialisation.Options);
            json.WriteString("caution", data.Provenance.Caution);
            json.WriteStartArray("features");
            foreach (var v in data.Values)
            {
                json.WriteStartObject();
                json.WriteString("type", "Feature");
                json.WriteNumber("id", v.CellId);
                json.WriteStartObject("geometry");
                CellFootprint? footprint = null;
                if (footprints is not null && footprints.TryGetValue(v.CellId, out var found)) footprint = found;
                if (footprint is not null)
                {
                    json.WriteString("type", "Polygon");
                    json.WriteStartArray("coordinates");
                    json.WriteStartArray();
                    // RFC 7946: exterior rings counter-clockwise.
                    var ring = footprint.Polygon.Shell.IsCCW ? footprint.Polygon.Shell.Coordinates : footprint.Polygon.Shell.Coordinates.Reverse().ToArray();
                    foreach (var p in ring) WritePosition(json, p.X, p.Y);
                    json.WriteEndArray();
                    json.WriteEndArray();
                }
                else
                {
                    json.WriteString("type", "Point");
                    json.WritePropertyName("coordinates");
                    WritePosition(json, v.Longitude, v.Latitude);
                }
                json.WriteEndObject();
                json.WriteStartObject("properties");
                json.WriteNumber("cell_id", v.CellId);
                json.WriteNumber("value", Math.Round(v.Value, 6));
                if (v.DepthMetres is { } depth) json.WriteNumber("depth_m", Math.Round(depth, 2));
                else json.WriteNull("depth_m");
                if (footprint is not null) json.WriteNumber("area_km2", Math.Round(footprint.SquareKilometres, 6));
                json.WriteEndObject();
                json.WriteEndObject();
            }
            json.WriteEndArray();
            json.WriteEndObject();
        }
        return buffer.ToArray();
    }

    public static void WritePosition(Utf8JsonWriter json, double longitude, double latitude)
    {
        json.WriteStartArray();
        json.WriteNumberValue(Math.Round(longitude, 7));
        json.WriteNumberValue(Math.Round(latitude, 7));
        json.WriteEndArray();
    }
}

/// <summary>The JSON conventions of the API (snake_case members), for documents written by hand.</summary>
public static class GeoJsonSerialisation
{
    public static readonly JsonSerializerOptions Options = new() { PropertyNamingPolicy = JsonNamingPolicy.SnakeCaseLower };
}
