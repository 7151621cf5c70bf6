using System.Text.Json.Serialization;

namespace Atlas.Statistics.Results;

/// <summary>
/// Summary of one parameter over one period. Values are NaN (JSON null) when no step is valid, with
/// <see cref="Count"/> 0; the standard deviation is the population one (divisor n, as numpy.std and CDO timstd).
/// </summary>
/// <param name="Mean">Arithmetic mean, computed in double.</param>
/// <param name="Sd">Population standard deviation.</param>
/// <param name="Min">Smallest value.</param>
/// <param name="Max">Largest value.</param>
/// <param name="P10">10th percentile.</param>
/// <param name="P50">Median.</param>
/// <param name="P90">90th percentile.</param>
/// <param name="P99">99th percentile.</param>
/// <param name="Count">Number of valid steps.</param>
/// <param name="Coverage">Valid over expected steps, 0..1 (0 when the period expects no step).</param>
public readonly record struct SummaryStatistics(
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double Mean,
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double Sd,
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double Min,
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double Max,
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double P10,
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double P50,
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double P90,
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double P99,
    long Count,
    double Coverage)
{
    /// <summary>The summary of a period with no valid step: NaN everywhere, count 0, coverage 0.</summary>
    public static SummaryStatistics Empty { get; } =
        new(double.NaN, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN, 0, 0);

    /// <summary>One statistic by kind (count and coverage as doubles).</summary>
    public double Get(StatisticKind kind) => kind switch
    {
        StatisticKind.Mean => Mean,
        StatisticKind.Sd => Sd,
        StatisticKind.Min => Min,
        StatisticKind.Max => Max,
        StatisticKind.P10 => P10,
        StatisticKind.P50 => P50,
        StatisticKind.P90 => P90,
        StatisticKind.P99 => P99,
        StatisticKind.Count => Count,
        StatisticKind.Coverage => Coverage,
        _ => throw new ArgumentOutOfRangeException(nameof(kind), kind, "Unknown statistic."),
    };

    /// <summary>True when the coverage is below the threshold (0..1).</summary>
    public bool IsLowCoverage(double threshold) => Coverage < threshold;
}
