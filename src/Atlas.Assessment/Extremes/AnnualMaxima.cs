using Atlas.Statistics;

namespace Atlas.Assessment.Extremes;

/// <summary>The maximum of one calendar year.</summary>
/// <param name="Year">Calendar year (UTC).</param>
/// <param name="Value">Largest non-missing value of the year.</param>
/// <param name="TimeUnixSeconds">When it occurred (the first time, on ties).</param>
/// <param name="Coverage">Non-missing time over the length of the calendar year, 0..1.</param>
public sealed record AnnualMaximum(int Year, double Value, long TimeUnixSeconds, double Coverage);

/// <summary>A calendar year left out for lack of coverage.</summary>
/// <param name="Year">Calendar year (UTC).</param>
/// <param name="Coverage">Non-missing time over the length of the calendar year, 0..1.</param>
public sealed record RejectedYear(int Year, double Coverage);

/// <summary>Annual maxima of a series, with the years left out and why.</summary>
/// <param name="Maxima">Maxima of the years with enough coverage, by year.</param>
/// <param name="RejectedYears">Years the series touches whose coverage fell short.</param>
/// <param name="MinimumCoverage">The coverage a year needed.</param>
public sealed record AnnualMaximaSample(IReadOnlyList<AnnualMaximum> Maxima, IReadOnlyList<RejectedYear> RejectedYears, double MinimumCoverage)
{
    /// <summary>The maximum values, by year.</summary>
    public double[] Values() => [.. Maxima.Select(m => m.Value)];
}

/// <summary>Block maxima by calendar year (UTC).</summary>
public static class AnnualMaxima
{
    /// <summary>
    /// Default share of a calendar year that must be non-missing for its maximum to count: 0.9
    /// (common practice; a year with long gaps can miss its largest storm and bias the fit low).
    /// </summary>
    public const double DefaultMinimumCoverage = 0.9;

    /// <summary>
    /// The maximum of each calendar year whose coverage (non-missing steps × step over the length
    /// of that year, so partial first and last years count as partly covered) reaches
    /// <paramref name="minimumCoverage"/>. Steps belong to the year of their time stamp.
    /// </summary>
    /// <exception cref="ArgumentOutOfRangeException">The coverage is outside 0..1.</exception>
    public static AnnualMaximaSample Extract(RegularSeries series, double minimumCoverage = DefaultMinimumCoverage)
    {
        ArgumentNullException.ThrowIfNull(series);
        if (!(minimumCoverage >= 0 && minimumCoverage <= 1))
            throw new ArgumentOutOfRangeException(nameof(minimumCoverage), minimumCoverage, "Coverage is a fraction in 0..1.");

        var maxima = new List<AnnualMaximum>();
        var rejected = new List<RejectedYear>();
        var values = series.Values;
        int i = 0;
        while (i < values.Length)
        {
            int year = DateTimeOffset.FromUnixTimeSeconds(series.TimeAt(i)).Year;
            long nextYearStart = new DateTimeOffset(year + 1, 1, 1, 0, 0, 0, TimeSpan.Zero).ToUnixTimeSeconds();
            int valid = 0;
            double maximum = double.NegativeInfinity;
            long maximumTime = 0;
            for (; i < values.Length && series.TimeAt(i) < nextYearStart; i++)
            {
                double value = values[i];
                if (double.IsNaN(value)) continue;
                valid++;
                if (value > maximum)
                {
                    maximum = value;
                    maximumTime = series.TimeAt(i);
                }
            }
            double coverage = Math.Min(1.0, valid * series.StepHours / CalendarHours.InYear(year));
            if (valid > 0 && coverage >= minimumCoverage)
                maxima.Add(new AnnualMaximum(year, maximum, maximumTime, coverage));
            else
                rejected.Add(new RejectedYear(year, coverage));
        }
        return new AnnualMaximaSample(maxima, rejected, minimumCoverage);
    }
}
