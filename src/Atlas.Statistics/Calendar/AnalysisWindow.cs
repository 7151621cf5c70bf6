namespace Atlas.Statistics.Calendar;

/// <summary>
/// A custom window for the point analysis: a range of years and/or a set of calendar months. Steps outside it are
/// left out entirely (they are not counted as expected), so the annual period of the analysis is the whole window.
/// </summary>
/// <param name="FirstYear">First year included; null for no lower limit.</param>
/// <param name="LastYear">Last year included; null for no upper limit.</param>
/// <param name="Months">Calendar months included (1 = January); null or empty for all twelve.</param>
public sealed record AnalysisWindow(int? FirstYear = null, int? LastYear = null, IReadOnlyList<int>? Months = null)
{
    /// <summary>The window holding exactly the steps of a period (the annual period gives no restriction).</summary>
    public static AnalysisWindow ForPeriod(AtlasPeriod period) => period.Kind switch
    {
        PeriodKind.Annual => new AnalysisWindow(),
        PeriodKind.Year => new AnalysisWindow(period.YearNumber, period.YearNumber),
        _ => new AnalysisWindow(Months: period.Months),
    };

    /// <summary>True when steps in this calendar year and month (1 = January) are inside the window.</summary>
    public bool Contains(int year, int month) =>
        (FirstYear is null || year >= FirstYear) && (LastYear is null || year <= LastYear) && (Months is null || Months.Count == 0 || Months.Contains(month));

    /// <summary>Throws when the window is not usable, saying why.</summary>
    /// <exception cref="ArgumentException">The years are reversed or a month is outside 1..12.</exception>
    public void Validate()
    {
        if (FirstYear > LastYear)
            throw new ArgumentException($"The window's first year {FirstYear} is after its last year {LastYear}.", "window");
        if (Months is not null)
            foreach (int m in Months)
                if (m is < 1 or > 12) throw new ArgumentException($"The window's month {m} is outside 1..12.", "window");
    }
}
