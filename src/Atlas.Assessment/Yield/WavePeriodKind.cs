namespace Atlas.Assessment.Yield;

/// <summary>Which wave period a power matrix or a period series is expressed in.</summary>
public enum WavePeriodKind
{
    /// <summary>Energy period Te (Tm-1,0), s; CSV axis name <c>te_s</c>.</summary>
    EnergyPeriod,
    /// <summary>Peak period Tp, s; CSV axis name <c>tp_s</c>.</summary>
    PeakPeriod,
}
