namespace Atlas.Api.Downloads;

/// <summary>
/// A layer as CSV: a block of '#' lines (what the values are, their unit, the provenance and the caution), then
/// the header <c>cell_id,lon,lat,value</c> and one row per cell with a value, in cell order.
/// </summary>
public static class LayerCsvWriter
{
    public static byte[] Write(LayerData data)
    {
        var text = new StringBuilder();
        text.Append("# layer: ").Append(data.Title).Append('\n');
        text.Append("# parameter: ").Append(data.Request.Parameter.Symbol()).Append("; statistic: ").Append(data.Request.Statistic.Name())
            .Append("; period: ").Append(data.Request.Period.Name).Append('\n');
        text.Append("# units: value in ").Append(data.Units).Append("; lon and lat in degrees (EPSG:4326)\n");
        foreach (var line in data.Provenance.HeaderLines()) text.Append(line).Append('\n');
        text.Append("cell_id,lon,lat,value\n");
        foreach (var v in data.Values)
            text.Append(v.CellId.ToString(CultureInfo.InvariantCulture)).Append(',')
                .Append(v.Longitude.ToString("0.######", CultureInfo.InvariantCulture)).Append(',')
                .Append(v.Latitude.ToString("0.######", CultureInfo.InvariantCulture)).Append(',')
                .Append(((float)v.Value).ToString("R", CultureInfo.InvariantCulture)).Append('\n');
        return new UTF8Encoding(false).GetBytes(text.ToString());
    }
}
