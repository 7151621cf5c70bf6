namespace Atlas.Storage.Series;

/// <summary>The time-varying fields a series chunk can hold, in payload order.</summary>
public enum SeriesVariable
{
    Hs = 0,
    Te = 1,
    Tp = 2,
    Dir = 3,
    Spread = 4,
}
