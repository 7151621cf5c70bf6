using Atlas.Storage.Series;

namespace Atlas.Ingest.Ingestion;

/// <summary>The SI unit each stored series variable is held in.</summary>
public static class SeriesUnits
{
    public static string Of(SeriesVariable variable) => variable switch
    {
        SeriesVariable.Hs => "m",
        SeriesVariable.Te or SeriesVariable.Tp => "s",
        _ => "degree",
    };
}
