namespace Atlas.Assessment;

/// <summary>Meteorological seasons of the northern-hemisphere convention, by calendar month (UTC).</summary>
public enum CalendarSeason
{
    /// <summary>December, January, February (a season gathers its months across all years).</summary>
    Djf,
    /// <summary>March, April, May.</summary>
    Mam,
    /// <summary>June, July, August.</summary>
    Jja,
    /// <summary>September, October, November.</summary>
    Son,
}
