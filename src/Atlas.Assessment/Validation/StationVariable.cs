namespace Atlas.Assessment.Validation;

/// <summary>A variable a station record may carry.</summary>
public enum StationVariable
{
    /// <summary>Significant wave height, m (column <c>hs_m</c>).</summary>
    Hs,
    /// <summary>Peak period, s (column <c>tp_s</c>).</summary>
    Tp,
    /// <summary>Energy period, s (column <c>te_s</c>).</summary>
    Te,
    /// <summary>Mean direction waves come from, degrees true (column <c>dir_deg</c>); compared on the circle.</summary>
    Direction,
}
