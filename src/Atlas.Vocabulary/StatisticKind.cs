using System.Text.Json.Serialization;

namespace Atlas.Vocabulary;

/// <summary>The statistics kept for each parameter and period (names in <see cref="StatisticKindNames"/>).</summary>
[JsonConverter(typeof(JsonStringEnumConverter<StatisticKind>))]
public enum StatisticKind
{
    /// <summary>Arithmetic mean ("mean").</summary>
    Mean,

    /// <summary>Population standard deviation, divisor n ("sd").</summary>
    Sd,

    /// <summary>Smallest value ("min").</summary>
    Min,

    /// <summary>Largest value ("max").</summary>
    Max,

    /// <summary>10th percentile ("p10").</summary>
    P10,

    /// <summary>Median ("p50").</summary>
    P50,

    /// <summary>90th percentile ("p90").</summary>
    P90,

    /// <summary>99th percentile ("p99").</summary>
    P99,

    /// <summary>Number of valid steps ("count").</summary>
    Count,

    /// <summary>Valid steps over expected steps, 0..1 ("coverage").</summary>
    Coverage,
}
