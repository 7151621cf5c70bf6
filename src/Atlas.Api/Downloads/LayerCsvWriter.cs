namespace Atlas.Api.Downloads;

/// <summary>
/// A layer as CSV: the header <c>cell_id,lon,lat,value</c> and one row per cell with a value, in cell order; what the
/// values are, their unit, the provenance and the caution are in its CSVW metadata (<see cref="Table"/>). A dataset of
/// spectral output points adds the column station (the output point's name) after cell_id.
/// </summary>
public static class LayerCsvWriter
{
    public static byte[] Write(LayerData data)
    {
        var stations = LayerGeoJsonWriter.OfStations(data);
        return Table(data).ToBytes(rows =>
        {
            foreach (var v in data.Values)
            {
                rows.Integer(v.CellId);
                if (stations) rows.Text(StationSpectraAnswers.StationName(data.Dataset, v.CellId));
                rows.Number(v.Longitude, "0.######").Number(v.Latitude, "0.######").Number((float)v.Value, "R");
                rows.EndRow();
            }
        });
    }

    /// <summary>The description of the layer's CSV, from which its header and its metadata are written.</summary>
    public static CsvTable Table(LayerData data)
    {
        var stations = LayerGeoJsonWriter.OfStations(data);
        var what = $"the {ParameterCatalogue.StatisticLongName(data.Request.Statistic)} of {ParameterCatalogue.LongName(data.Request.Parameter)} " +
                   $"over the period {data.Request.Period.Name} of dataset {data.Provenance.Dataset}";
        return new CsvTable(
            data.Title,
            stations ? $"One row per output point with a value: {what}." : $"One row per wet cell with a value: {what}, in cell order.",
            [
                CsvColumn.CellId,
                .. (stations ? [CsvColumn.Text("station", "name of the output point")] : Array.Empty<CsvColumn>()),
                CsvColumn.Longitude, CsvColumn.Latitude,
                CsvColumn.Double("value", data.Title, data.Units,
                    $"parameter {data.Request.Parameter.Symbol()}, statistic {data.Request.Statistic.Name()}, period {data.Request.Period.Name}"),
            ],
            data.Provenance);
    }
}
