namespace Atlas.Api.Downloads;

/// <summary>
/// A layer as a GeoJSON FeatureCollection (RFC 7946): one feature per cell with a value, a point at the cell centre or,
/// when footprints are given, the cell's footprint polygon; the layer description, provenance and caution are
/// foreign members of the collection. A dataset of spectral output points gives one feature per output point, named.
/// </summary>
public static class LayerGeoJsonWriter
{
    public static byte[] Write(LayerData data, IReadOnlyDictionary<int, CellFootprint>? footprints) =>
        GeoJsonWriter.FeatureCollection(json =>
        {
            json.WriteStartObject("layer");
            json.WriteString("parameter", data.Request.Parameter.Symbol());
            json.WriteString("statistic", data.Request.Statistic.Name());
            json.WriteString("period", data.Request.Period.Name);
            json.WriteString("title", data.Title);
            json.WriteString("units", data.Units);
            json.WriteString("geometry", OfStations(data) ? "output points" : footprints is null ? "cell centre points" : "cell footprint polygons");
            json.WriteEndObject();
            GeoJsonWriter.WriteMember(json, "provenance", data.Provenance);
            json.WriteString("caution", data.Provenance.Caution);
        }, data.Values.Select(v => Feature(data, v, footprints is not null && footprints.TryGetValue(v.CellId, out var found) ? found : null)));

    /// <summary>True for a dataset of spectral output points, whose cells are named stations.</summary>
    public static bool OfStations(LayerData data) => data.Dataset.GridKind == StationSpectraAnswers.StationsKind;

    private static Feature Feature(LayerData data, LayerValue v, CellFootprint? footprint)
    {
        var properties = new AttributesTable
        {
            { GeoJsonWriter.IdAttribute, v.CellId },
            { "cell_id", v.CellId },
            { "value", Math.Round(v.Value, 6) },
            { "depth_m", v.DepthMetres is { } depth ? Math.Round(depth, 2) : null },
        };
        if (OfStations(data)) properties.Add("station", StationSpectraAnswers.StationName(data.Dataset, v.CellId));
        if (footprint is not null) properties.Add("area_km2", Math.Round(footprint.SquareKilometres, 6));
        Geometry geometry = footprint is not null ? GeoJsonWriter.Shell(footprint.Polygon) : GeoJsonWriter.Point(v.Longitude, v.Latitude);
        return new Feature(geometry, properties);
    }
}
