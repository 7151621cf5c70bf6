using Atlas.Statistics;

namespace Atlas.Assessment.Validation;

/// <summary>
/// Observations paired with modelled values at the observation times, with the counts of those
/// left unmatched and why. The pairs double as scatter-plot points.
/// </summary>
public sealed class MatchedSeries
{
    private readonly long[] _times;
    private readonly double[] _observed;
    private readonly double[] _modelled;

    internal MatchedSeries(long[] times, double[] observed, double[] modelled, bool isCircular, MatchCounts counts)
    {
        _times = times;
        _observed = observed;
        _modelled = modelled;
        IsCircular = isCircular;
        Counts = counts;
    }

    /// <summary>Creates a series from pairs already matched elsewhere (all three spans the same length).</summary>
    /// <exception cref="ArgumentException">The lengths differ.</exception>
    public static MatchedSeries FromPairs(ReadOnlySpan<long> timesUnixSeconds, ReadOnlySpan<double> observed, ReadOnlySpan<double> modelled, bool isCircular)
    {
        if (observed.Length != timesUnixSeconds.Length || modelled.Length != timesUnixSeconds.Length)
            throw new ArgumentException($"{timesUnixSeconds.Length} times, {observed.Length} observed and {modelled.Length} modelled values: lengths must agree.");
        int n = timesUnixSeconds.Length;
        return new MatchedSeries(timesUnixSeconds.ToArray(), observed.ToArray(), modelled.ToArray(), isCircular,
            new MatchCounts(n, n, 0, 0, 0, 0, 0));
    }

    /// <summary>Observation times of the pairs, Unix seconds.</summary>
    public ReadOnlySpan<long> TimesUnixSeconds => _times;

    /// <summary>Observed values of the pairs.</summary>
    public ReadOnlySpan<double> Observed => _observed;

    /// <summary>Modelled values interpolated to the observation times.</summary>
    public ReadOnlySpan<double> Modelled => _modelled;

    /// <summary>Number of pairs.</summary>
    public int Count => _times.Length;

    /// <summary>True for directions (degrees), which are compared on the circle.</summary>
    public bool IsCircular { get; }

    /// <summary>How many observations were matched and why the others were not.</summary>
    public MatchCounts Counts { get; }

    /// <summary>The pairs whose observation time falls in <paramref name="season"/> (UTC calendar, across all years).</summary>
    /// <exception cref="ArgumentException">The period is not a season.</exception>
    public MatchedSeries WhereSeason(AtlasPeriod season)
    {
        if (season.Kind != PeriodKind.Season)
            throw new ArgumentException($"'{season}' is not a season (djf, mam, jja or son).", nameof(season));
        return Where(i => season.ContainsUnixSeconds(_times[i]));
    }

    /// <summary>The pairs whose observed value is in [<paramref name="lower"/>, <paramref name="upper"/>).</summary>
    public MatchedSeries WhereObservedIn(double lower, double upper) =>
        Where(i => _observed[i] >= lower && _observed[i] < upper);

    private MatchedSeries Where(Func<int, bool> keep)
    {
        var indexes = Enumerable.Range(0, Count).Where(keep).ToArray();
        int n = indexes.Length;
        return new MatchedSeries(
            [.. indexes.Select(i => _times[i])],
            [.. indexes.Select(i => _observed[i])],
            [.. indexes.Select(i => _modelled[i])],
            IsCircular,
            new MatchCounts(n, n, 0, 0, 0, 0, 0));
    }
}
