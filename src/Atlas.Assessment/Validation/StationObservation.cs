namespace Atlas.Assessment.Validation;

/// <summary>One row of a station (buoy) record.</summary>
/// <param name="TimeUnixSeconds">Observation time, Unix seconds (UTC).</param>
/// <param name="HsMetres">Significant wave height, m; NaN only on a flagged row.</param>
/// <param name="TpSeconds">Peak period, s; NaN when absent.</param>
/// <param name="TeSeconds">Energy period, s; NaN when absent.</param>
/// <param name="DirectionFromDegrees">Mean direction the waves come from, degrees true in [0, 360); NaN when absent.</param>
/// <param name="QualityFlag">0 for a good row; anything else marks the row as rejected by the station's quality control.</param>
/// <param name="LineNumber">Line of the input the row came from.</param>
public readonly record struct StationObservation(
    long TimeUnixSeconds,
    double HsMetres,
    double TpSeconds,
    double TeSeconds,
    double DirectionFromDegrees,
    int QualityFlag,
    int LineNumber)
{
    /// <summary>True when the station's quality control rejected this row.</summary>
    public bool IsFlagged => QualityFlag != 0;

    /// <summary>The value of one variable (NaN when absent).</summary>
    public double ValueOf(WaveParameter variable) => variable switch
    {
        WaveParameter.Hs => HsMetres,
        WaveParameter.Tp => TpSeconds,
        WaveParameter.Te => TeSeconds,
        WaveParameter.Dir => DirectionFromDegrees,
        _ => throw new ArgumentOutOfRangeException(nameof(variable), variable, "Unknown station variable."),
    };
}
