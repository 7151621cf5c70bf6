namespace Atlas.Api.Downloads;

/// <summary>
/// A layer as CSV: the header <c>cell_id,lon,lat,value</c> and one row per cell with a value, in cell order; what the
/// values are, their unit, the provenance and the caution are in its CSVW metadata (<see cref="Table"/>).
/// </summary>
public static class LayerCsvWriter
{
    public static byte[] Write(LayerData data) => Table(data).ToBytes(rows =>
    {
        foreach (var v in data.Values)
        {
            rows.Integer(v.CellId).Number(v.Longitude, "0.######").Number(v.Latitude, "0.######").Number((float)v.Value, "R");
            rows.EndRow();
        }
    });

    /// <summary>The description of the layer's CSV, from which its header and its metadata are written.</summary>
    public static CsvTable Table(LayerData data) => new(
        data.Title,
        $"One row per wet cell with a value: the {ParameterCatalogue.StatisticLongName(data.Request.Statistic)} of " +
        $"{ParameterCatalogue.LongName(data.Request.Parameter)} over the period {data.Request.Period.Name} of dataset {data.Provenance.Dataset}, in cell order.",
        [
            CsvColumn.CellId, CsvColumn.Longitude, CsvColumn.Latitude,
            CsvColumn.Double("value", data.Title, data.Units,
                $"parameter {data.Request.Parameter.Symbol()}, statistic {data.Request.Statistic.Name()}, period {data.Request.Period.Name}"),
        ],
        data.Provenance);
}
