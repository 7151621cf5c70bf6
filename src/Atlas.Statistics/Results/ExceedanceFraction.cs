using System.Text.Json.Serialization;

namespace Atlas.Statistics.Results;

/// <summary>The fraction of valid steps whose value is strictly above a threshold; NaN (JSON null) when no step is valid.</summary>
/// <param name="Threshold">Threshold in the parameter's unit.</param>
/// <param name="Fraction">Fraction of valid steps above it, 0..1.</param>
public readonly record struct ExceedanceFraction(
    double Threshold,
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double Fraction);
