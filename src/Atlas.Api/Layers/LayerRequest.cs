namespace Atlas.Api.Layers;

/// <summary>
/// One layer download: parameter, statistic, period, format, for GeoJSON the cell geometry, and for CSV whether its
/// CSVW metadata is asked for instead of the table.
/// </summary>
public sealed record LayerRequest(WaveParameter Parameter, StatisticKind Statistic, AtlasPeriod Period, LayerFormat Format, bool Polygons, bool CsvMetadata = false)
{
    public string FileName => $"{Parameter.Symbol()}_{Statistic.Name()}_{Period.Name}.{Format.Extension()}{(CsvMetadata ? CsvMetadataLinks.PathSuffix : "")}";

    public string CacheKey(string stamp) =>
        $"{Parameter.Symbol()}/{Statistic.Name()}/{Period.Name}.{Format.Extension()}{(Polygons ? "?geometry=polygon" : "")}@{stamp}";
}
