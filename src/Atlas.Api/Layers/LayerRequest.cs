namespace Atlas.Api.Layers;

/// <summary>One layer download: parameter, statistic, period, format, and for GeoJSON the cell geometry.</summary>
public sealed record LayerRequest(WaveParameter Parameter, StatisticKind Statistic, AtlasPeriod Period, LayerFormat Format, bool Polygons)
{
    public string FileName => $"{Parameter.Symbol()}_{Statistic.Name()}_{Period.Name}.{Format.Extension()}";

    public string CacheKey(string stamp) =>
        $"{Parameter.Symbol()}/{Statistic.Name()}/{Period.Name}.{Format.Extension()}{(Polygons ? "?geometry=polygon" : "")}@{stamp}";
}
