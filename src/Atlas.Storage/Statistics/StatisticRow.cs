namespace Atlas.Storage.Statistics;

/// <summary>
/// One stored statistic row: a parameter of a cell over a period. Codes are those of Atlas.Statistics
/// (period: 0 annual, 1..12 months, 13..16 seasons, a year number; parameter: the WaveParameter value).
/// </summary>
public sealed record StatisticRow(
    int CellId,
    short Period,
    short Parameter,
    float? Mean,
    float? Sd,
    float? Min,
    float? Max,
    float? P10,
    float? P50,
    float? P90,
    float? P99,
    int Count,
    float Coverage,
    float[]? Extra);

/// <summary>The statistic columns a layer can be drawn from.</summary>
public enum StoredStatistic { Mean, Sd, Min, Max, P10, P50, P90, P99, Count, Coverage }

/// <summary>One cell's value of a layer, with the cell's position.</summary>
public readonly record struct LayerValue(int CellId, double Longitude, double Latitude, int? GridI, int? GridJ, float? DepthMetres, double Value);
