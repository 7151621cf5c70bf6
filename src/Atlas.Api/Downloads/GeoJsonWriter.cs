using NetTopologySuite.IO.Converters;

namespace Atlas.Api.Downloads;

/// <summary>
/// The API's one GeoJSON writer (RFC 7946). Features and their geometries are written by NetTopologySuite's GeoJSON
/// converters, with exterior rings counter-clockwise and holes clockwise and the attribute <see cref="IdAttribute"/>
/// as the feature's id; the collection's foreign members (the layer described, its provenance and caution, counts)
/// are written before the features. Positions are in EPSG:4326 degrees, rounded to 7 decimals (about 1 cm).
/// </summary>
public static class GeoJsonWriter
{
    /// <summary>The attribute that becomes a feature's "id" member instead of a property.</summary>
    public const string IdAttribute = "id";

    private const int PositionDecimals = 7;

    private static readonly GeometryFactory Factory = new(new PrecisionModel(), 4326);

    /// <summary>
    /// The API's JSON conventions for documents written by hand: snake_case members, and GeoJSON for features and
    /// geometries.
    /// </summary>
    public static readonly JsonSerializerOptions Options = new()
    {
        PropertyNamingPolicy = JsonNamingPolicy.SnakeCaseLower,
        Converters = { new GeoJsonConverterFactory(Factory, false, IdAttribute, RingOrientationOption.EnforceRfc9746) },
    };

    /// <summary>A point at a position, rounded as written.</summary>
    public static Point Point(double longitude, double latitude) =>
        Factory.CreatePoint(new Coordinate(Math.Round(longitude, PositionDecimals), Math.Round(latitude, PositionDecimals)));

    /// <summary>A copy of a geometry with its positions rounded as written.</summary>
    public static T Rounded<T>(T geometry) where T : Geometry
    {
        var copy = (T)geometry.Copy();
        copy.Apply(new PositionRounding());
        return copy;
    }

    /// <summary>A polygon of the shell of <paramref name="polygon"/> only, rounded as written.</summary>
    public static Polygon Shell(Polygon polygon) => Rounded(Factory.CreatePolygon(polygon.Shell.Coordinates));

    public static MultiPolygon MultiPolygon(IEnumerable<Polygon> parts) => Factory.CreateMultiPolygon([.. parts.Select(Rounded)]);

    /// <summary>
    /// A FeatureCollection: its <c>type</c>, then the foreign members <paramref name="members"/> writes, then the features.
    /// </summary>
    public static byte[] FeatureCollection(Action<Utf8JsonWriter> members, IEnumerable<IFeature> features) =>
        Document(json =>
        {
            json.WriteString("type", "FeatureCollection");
            members(json);
            json.WriteStartArray("features");
            foreach (var feature in features) JsonSerializer.Serialize(json, feature, Options);
            json.WriteEndArray();
        });

    /// <summary>
    /// The same document without geometry: the members, then an array named <paramref name="arrayName"/> of each
    /// feature's attributes (the JSON twin of a download whose features are cell centres).
    /// </summary>
    public static byte[] AttributeDocument(Action<Utf8JsonWriter> members, string arrayName, IEnumerable<IAttributesTable> rows) =>
        Document(json =>
        {
            members(json);
            json.WriteStartArray(arrayName);
            foreach (var row in rows) JsonSerializer.Serialize(json, row, Options);
            json.WriteEndArray();
        });

    /// <summary>A member holding a value written in the API's conventions (a record such as the provenance).</summary>
    public static void WriteMember<T>(Utf8JsonWriter json, string name, T value)
    {
        json.WritePropertyName(name);
        JsonSerializer.Serialize(json, value, Options);
    }

    private static byte[] Document(Action<Utf8JsonWriter> body)
    {
        using var buffer = new MemoryStream();
        using (var json = new Utf8JsonWriter(buffer))
        {
            json.WriteStartObject();
            body(json);
            json.WriteEndObject();
        }
        return buffer.ToArray();
    }

    private sealed class PositionRounding : ICoordinateSequenceFilter
    {
        public void Filter(CoordinateSequence seq, int i)
        {
            seq.SetX(i, Math.Round(seq.GetX(i), PositionDecimals));
            seq.SetY(i, Math.Round(seq.GetY(i), PositionDecimals));
        }

        public bool Done => false;

        public bool GeometryChanged => true;
    }
}
