namespace Atlas.Vocabulary;

/// <summary>
/// The parameters each part of the atlas handles, all named by <see cref="WaveParameter"/>: what a hindcast file
/// carries, what a stored cell series holds, what a buoy record may measure. J and D are always derived, never read.
/// </summary>
public static class WaveParameterGroups
{
    /// <summary>The fields read from a hindcast file, in reading order: Hs, Te, Tp, Dir, Spread, Depth.</summary>
    public static IReadOnlyList<WaveParameter> HindcastFields { get; } =
        [WaveParameter.Hs, WaveParameter.Te, WaveParameter.Tp, WaveParameter.Dir, WaveParameter.Spread, WaveParameter.Depth];

    /// <summary>The time-varying fields of a stored cell series: Hs, Te, Tp, Dir, Spread (depth is one value per cell).</summary>
    public static IReadOnlyList<WaveParameter> SeriesFields { get; } =
        [WaveParameter.Hs, WaveParameter.Te, WaveParameter.Tp, WaveParameter.Dir, WaveParameter.Spread];

    /// <summary>The position of a parameter in <see cref="SeriesFields"/>; -1 for one a series does not hold.</summary>
    public static int SeriesIndex(WaveParameter parameter) => parameter switch
    {
        WaveParameter.Hs => 0,
        WaveParameter.Te => 1,
        WaveParameter.Tp => 2,
        WaveParameter.Dir => 3,
        WaveParameter.Spread => 4,
        _ => -1,
    };

    /// <summary>The fields a buoy record may carry and validation compares: Hs, Tp, Te, Dir.</summary>
    public static IReadOnlyList<WaveParameter> StationFields { get; } =
        [WaveParameter.Hs, WaveParameter.Tp, WaveParameter.Te, WaveParameter.Dir];
}
