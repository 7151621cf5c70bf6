namespace Atlas.Api.Model;

public sealed record LayerChoice(string Parameter, string Statistic, string Period, string Units);

/// <summary>Statistics of one layer over the wet cells inside an area.</summary>
public sealed record AreaStatistics(
    string Dataset,
    LayerChoice Layer,
    double AreaKm2,
    int CellCount,
    int CellsWithValue,
    double CellAreaKm2,
    double? Mean,
    double? AreaWeightedMean,
    double? Min,
    double? Max,
    double? P10,
    double? P50,
    double? P90,
    double? Threshold,
    int? CellsAboveThreshold,
    double? AreaAboveThresholdKm2,
    string Method,
    Provenance Provenance,
    string Caution);
