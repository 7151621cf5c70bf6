namespace Atlas.Storage.Statistics;

/// <summary>
/// One stored statistic row: a parameter of a cell over a period. <paramref name="Fractions"/> holds the exceedance
/// fractions at the pass's thresholds (hs, j) or the 16-sector shares of power (dir); null for other parameters.
/// The numeric codes of periods and parameters in the tables stay inside Storage. A value, so that a pass's rows cost no
/// allocation each.
/// </summary>
public readonly record struct StatisticRow(
    int CellId,
    AtlasPeriod Period,
    WaveParameter Parameter,
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
    float[]? Fractions);


/// <summary>One cell's value of a layer, with the cell's position.</summary>
public readonly record struct LayerValue(int CellId, double Longitude, double Latitude, int? GridI, int? GridJ, float? DepthMetres, double Value);
