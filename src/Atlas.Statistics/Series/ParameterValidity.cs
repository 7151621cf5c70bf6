namespace Atlas.Statistics.Series;

/// <summary>
/// Which stored values count as valid steps. NaN and infinities never do; heights, power, spread and the
/// directionality coefficient must not be negative; periods must be positive; directions may be any finite angle.
/// Anything else is treated as a missing step, like a fill value.
/// </summary>
internal static class ParameterValidity
{
    /// <summary>The smallest valid value of a parameter (values must also be finite).</summary>
    public static float Lowest(WaveParameter parameter) => parameter switch
    {
        WaveParameter.Te or WaveParameter.Tp => float.Epsilon,
        WaveParameter.Dir => float.MinValue,
        _ => 0f,
    };

    /// <summary>True when the value is a valid step of the parameter.</summary>
    public static bool IsValid(WaveParameter parameter, float value) => value >= Lowest(parameter) && value <= float.MaxValue;
}
