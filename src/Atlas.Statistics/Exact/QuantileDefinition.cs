using System.Text.Json.Serialization;

namespace Atlas.Statistics.Exact;

/// <summary>
/// How a sample quantile is defined, after Hyndman and Fan (1996), "Sample quantiles in statistical packages",
/// The American Statistician 50(4). With n sorted values and probability p, types 4 to 9 interpolate linearly at
/// the 1-based position n p + m for the type's m; types 1 to 3 pick an observation.
/// </summary>
[JsonConverter(typeof(JsonStringEnumConverter<QuantileDefinition>))]
public enum QuantileDefinition
{
    /// <summary>Type 1: inverse of the empirical distribution function (no interpolation).</summary>
    HyndmanFanType1 = 1,

    /// <summary>Type 2: as type 1, averaging the two observations where the distribution function is flat.</summary>
    HyndmanFanType2 = 2,

    /// <summary>Type 3: the observation nearest n p - 1/2, ties to the even order statistic.</summary>
    HyndmanFanType3 = 3,

    /// <summary>Type 4: linear interpolation of the empirical distribution function, m = 0.</summary>
    HyndmanFanType4 = 4,

    /// <summary>Type 5: piecewise linear with knots at the midpoints of the steps, m = 1/2 (Hazen).</summary>
    HyndmanFanType5 = 5,

    /// <summary>Type 6: m = p, p(k) = k / (n + 1) (Weibull plotting positions).</summary>
    HyndmanFanType6 = 6,

    /// <summary>Type 7: m = 1 - p, position (n - 1) p from the smallest value; the default, equal to NumPy's default ('linear').</summary>
    HyndmanFanType7 = 7,

    /// <summary>Type 8: m = (p + 1) / 3, approximately median-unbiased whatever the distribution.</summary>
    HyndmanFanType8 = 8,

    /// <summary>Type 9: m = p / 4 + 3/8, approximately unbiased for the normal distribution.</summary>
    HyndmanFanType9 = 9,
}
