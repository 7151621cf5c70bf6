namespace Atlas.Api.Layers;

/// <summary>
/// One layer download: parameter, statistic, period, format, for GeoJSON the cell geometry, and whether a companion
/// document is asked for instead (the CSV's CSVW metadata, the figure's provenance sidecar).
/// </summary>
public sealed record LayerRequest(WaveParameter Parameter, StatisticKind Statistic, AtlasPeriod Period, LayerFormat Format, bool Polygons,
    LayerCompanion Companion = LayerCompanion.None)
{
    public string FileName => $"{Parameter.Symbol()}_{Statistic.Name()}_{Period.Name}" + Companion switch
    {
        LayerCompanion.CsvMetadata => ".csv" + CsvMetadataLinks.PathSuffix,
        LayerCompanion.FigureProvenance => LayerCompanions.FigureSuffix,
        _ => "." + Format.Extension(),
    };

    public string CacheKey(string stamp) =>
        $"{Parameter.Symbol()}/{Statistic.Name()}/{Period.Name}.{Format.Extension()}{(Polygons ? "?geometry=polygon" : "")}@{stamp}";
}

/// <summary>A document that goes with a layer download rather than the download itself.</summary>
public enum LayerCompanion { None, CsvMetadata, FigureProvenance }

public static class LayerCompanions
{
    /// <summary>The ending of the figure's provenance sidecar: <c>.../annual.figure.json</c>.</summary>
    public const string FigureSuffix = ".figure.json";

    /// <summary>
    /// The companion a route's <c>{period}.{format}</c> asks for (ASP.NET matches <c>annual.figure.json</c> as period
    /// <c>annual.figure</c> and format <c>json</c>), with the period and the format of the layer it belongs to.
    /// </summary>
    public static LayerCompanion Read(ref string period, ref string format)
    {
        if (CsvMetadataLinks.AsksForMetadata(ref period, ref format)) return LayerCompanion.CsvMetadata;
        const string figure = ".figure";
        if (format != "json" || !period.EndsWith(figure, StringComparison.Ordinal)) return LayerCompanion.None;
        period = period[..^figure.Length];
        format = "png";
        return LayerCompanion.FigureProvenance;
    }
}
