using Atlas.Storage.Series;

namespace Atlas.Ingest.Ingestion;

/// <summary>The SI unit each stored series variable is held in.</summary>
public static class SeriesUnits
{
    public static string Of(WaveParameter variable) => variable switch
    {
        WaveParameter.Hs => "m",
        WaveParameter.Te or WaveParameter.Tp => "s",
        _ => "degree",
    };
}
