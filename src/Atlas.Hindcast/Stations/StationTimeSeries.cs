namespace Atlas.Hindcast.Stations;

/// <summary>One station's record as decoded from a CF point time series, in SI units, directions "from", in time order.</summary>
/// <param name="SourceFile">The file name without its folder.</param>
/// <param name="TimesUnixSeconds">Time of each observation, Unix seconds UTC.</param>
/// <param name="Hs">Hs, m; NaN where the file holds a fill value.</param>
/// <param name="Tp">Tp, s, or null when the file has none.</param>
/// <param name="Te">Te, s, or null when the file has none.</param>
/// <param name="Dir">Direction the waves come from, degrees, or null when the file has none.</param>
/// <param name="Qc">Quality flag per observation: 0 good, anything else flagged.</param>
/// <param name="Latitude">The station latitude the file states, or null.</param>
/// <param name="Longitude">The station longitude the file states, or null.</param>
public sealed record StationTimeSeries(
    string SourceFile,
    long[] TimesUnixSeconds,
    float[] Hs,
    float[]? Tp,
    float[]? Te,
    float[]? Dir,
    short[] Qc,
    double? Latitude,
    double? Longitude);
