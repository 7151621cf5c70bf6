using NetTopologySuite.IO.Converters;
using NetTopologySuite.Operation.Valid;

namespace Atlas.Api.Areas;

/// <summary>The outcome of reading an area: the polygon, or what is wrong with it (and the HTTP status to say so).</summary>
public sealed record AreaReading(Geometry? Area, int Status, string? Title, string? Problem);

/// <summary>
/// Reads the area of an area request: a GeoJSON Polygon or MultiPolygon geometry, a Feature holding one, or
/// <c>{"bbox": [west, south, east, north]}</c>, in longitude/latitude degrees (RFC 7946). Checks what makes an
/// area unusable, each with a message saying what to fix: not JSON, another geometry type, coordinates off the
/// globe, too many vertices, and invalid rings (self-intersections, unclosed or degenerate rings) with the place
/// where NetTopologySuite's validity check found the fault.
/// </summary>
public static class AreaGeometryReader
{
    private static readonly GeometryFactory Wgs84 = new(new PrecisionModel(), 4326);
    private static readonly JsonSerializerOptions GeoJson = new() { Converters = { new GeoJsonConverterFactory(Wgs84) } };

    public static AreaReading Read(ReadOnlySpan<byte> body, int maxVertices)
    {
        if (body.IsEmpty) return Invalid(400, "No area sent", "Send a GeoJSON Polygon or MultiPolygon (or a Feature with one, or {\"bbox\": [west, south, east, north]}) as the request body.");
        JsonDocument document;
        try
        {
            document = JsonDocument.Parse(body.ToArray());
        }
        catch (JsonException e)
        {
            return Invalid(400, "The body is not JSON", $"The request body is not valid JSON ({e.Message}). Send a GeoJSON geometry.");
        }
        using (document)
        {
            var root = document.RootElement;
            if (root.ValueKind != JsonValueKind.Object)
                return Invalid(400, "The body is not a GeoJSON object", "The request body must be a JSON object: a GeoJSON geometry, a Feature, or {\"bbox\": [...]}.");
            if (root.TryGetProperty("bbox", out var bbox) && !root.TryGetProperty("type", out _))
                return ReadBox(bbox);
            var type = root.TryGetProperty("type", out var t) && t.ValueKind == JsonValueKind.String ? t.GetString() : null;
            var geometryElement = root;
            if (type == "Feature")
            {
                if (!root.TryGetProperty("geometry", out geometryElement) || geometryElement.ValueKind != JsonValueKind.Object)
                    return Invalid(400, "The Feature has no geometry", "The Feature sent has no geometry object; give it a Polygon or MultiPolygon geometry.");
                type = geometryElement.TryGetProperty("type", out var gt) && gt.ValueKind == JsonValueKind.String ? gt.GetString() : null;
            }
            if (type is not ("Polygon" or "MultiPolygon"))
                return Invalid(422, "Not a polygon", $"The geometry type is '{type ?? "(missing)"}'; an area must be a GeoJSON Polygon or MultiPolygon.");
            Geometry geometry;
            try
            {
                geometry = JsonSerializer.Deserialize<Geometry>(geometryElement.GetRawText(), GeoJson)
                           ?? throw new JsonException("the geometry is null");
            }
            catch (Exception e) when (e is JsonException or ArgumentException or InvalidOperationException or FormatException)
            {
                return Invalid(400, "The geometry cannot be read", $"The {type} could not be read as GeoJSON ({e.Message}). Each ring is an array of [longitude, latitude] positions, the first repeated at the end.");
            }
            geometry.SRID = 4326;
            return Check(geometry, maxVertices);
        }
    }

    private static AreaReading ReadBox(JsonElement bbox)
    {
        if (bbox.ValueKind != JsonValueKind.Array || bbox.GetArrayLength() != 4 || bbox.EnumerateArray().Any(v => v.ValueKind != JsonValueKind.Number))
            return Invalid(400, "The bbox cannot be read", "bbox must be four numbers: [west, south, east, north] in degrees.");
        var v = bbox.EnumerateArray().Select(x => x.GetDouble()).ToArray();
        var (west, south, east, north) = (v[0], v[1], v[2], v[3]);
        if (west is < -180 or > 180 || east is < -180 or > 180 || south is < -90 or > 90 || north is < -90 or > 90)
            return Invalid(422, "The bbox is off the globe", $"bbox [{west}, {south}, {east}, {north}] has a longitude outside -180..180 or a latitude outside -90..90.");
        if (!(east > west) || !(north > south))
            return Invalid(422, "The bbox is reversed or empty", $"bbox [{west}, {south}, {east}, {north}] must have west < east and south < north (boxes across the antimeridian are not supported; send a MultiPolygon).");
        return new AreaReading(Wgs84.ToGeometry(new Envelope(west, east, south, north)), 200, null, null);
    }

    private static AreaReading Check(Geometry geometry, int maxVertices)
    {
        if (geometry.IsEmpty) return Invalid(422, "The polygon is empty", "The polygon has no coordinates; send at least one closed ring of four or more positions.");
        if (geometry.NumPoints > maxVertices)
            return Invalid(413, "The polygon has too many vertices", $"The polygon has {geometry.NumPoints} vertices; the limit is {maxVertices}. Simplify it (a tolerance of a tenth of the cell spacing loses nothing at the atlas resolution).");
        foreach (var c in geometry.Coordinates)
            if (c.X is < -180 or > 180 || c.Y is < -90 or > 90 || !double.IsFinite(c.X) || !double.IsFinite(c.Y))
                return Invalid(422, "A position is off the globe", $"The position [{c.X}, {c.Y}] is not [longitude -180..180, latitude -90..90]; GeoJSON positions are [longitude, latitude].");
        var validity = new IsValidOp(geometry).ValidationError;
        if (validity is not null)
        {
            var where = validity.Coordinate is { } at ? $" at [{at.X:0.######}, {at.Y:0.######}]" : "";
            var hint = validity.ErrorType switch
            {
                TopologyValidationErrors.SelfIntersection or TopologyValidationErrors.RingSelfIntersection =>
                    "Edges of the polygon cross each other: reorder the vertices so the outline does not cross itself, or split it into a MultiPolygon.",
                TopologyValidationErrors.RingNotClosed => "Close every ring: repeat its first position at the end.",
                TopologyValidationErrors.TooFewPoints => "Every ring needs at least four positions (three corners and the first repeated).",
                TopologyValidationErrors.HoleOutsideShell => "A hole lies outside its outer ring: put holes inside the first ring.",
                TopologyValidationErrors.NestedShells or TopologyValidationErrors.DisconnectedInteriors =>
                    "Polygons of a MultiPolygon overlap or nest: merge them or remove the overlap.",
                _ => "Fix the geometry so it is a valid OGC Simple Features polygon.",
            };
            return Invalid(422, "The polygon is not valid", $"{validity.Message}{where}. {hint}");
        }
        return new AreaReading(geometry, 200, null, null);
    }

    private static AreaReading Invalid(int status, string title, string problem) => new(null, status, title, problem);
}
