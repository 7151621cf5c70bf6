namespace Atlas.Demo;

/// <summary>The seasonal cycle of the invented North Atlantic climate.</summary>
public static class SeasonalPhase
{
    private const double YearDays = 365.2425;
    private const double StormiestDayOfYear = 20.0;

    /// <summary>
    /// +1 at the stormiest time of year (about 20 January), -1 half a year later, following a
    /// cosine in between.
    /// </summary>
    public static double Winterness(DateTime utc)
    {
        double dayOfYear = utc.DayOfYear - 1 + utc.TimeOfDay.TotalDays;
        return Math.Cos(2 * Math.PI * (dayOfYear - StormiestDayOfYear) / YearDays);
    }
}
