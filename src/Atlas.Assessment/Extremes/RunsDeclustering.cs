namespace Atlas.Assessment.Extremes;

/// <summary>One storm: a cluster of steps above the threshold.</summary>
/// <param name="StartUnixSeconds">First step above the threshold.</param>
/// <param name="EndUnixSeconds">Last step above the threshold.</param>
/// <param name="PeakUnixSeconds">Time of the largest value (the first, on ties).</param>
/// <param name="PeakValue">The largest value of the cluster.</param>
/// <param name="StepsAboveThreshold">Steps of the cluster that exceed the threshold.</param>
public sealed record StormPeak(long StartUnixSeconds, long EndUnixSeconds, long PeakUnixSeconds, double PeakValue, int StepsAboveThreshold);

/// <summary>
/// Runs declustering (Coles 2001, §5.3.2): a cluster of exceedances ends once the series has
/// stayed at or below the threshold for at least the separation; each cluster contributes its peak.
/// </summary>
public static class RunsDeclustering
{
    /// <summary>Default separation: 48 h (common practice for storms in wave records).</summary>
    public const double DefaultSeparationHours = 48;

    /// <summary>
    /// The peaks of the clusters of values strictly above <paramref name="threshold"/>. Two
    /// exceedances belong to different clusters when the steps between them (each lasting one
    /// step) add up to at least <paramref name="separationHours"/>. Missing steps count as not
    /// exceeding, so a gap at least as long as the separation also splits a storm. A separation of
    /// 0 makes each unbroken run of exceedances its own cluster.
    /// </summary>
    /// <exception cref="ArgumentOutOfRangeException">The separation is negative or not finite, or the threshold is NaN.</exception>
    public static IReadOnlyList<StormPeak> Decluster(RegularSeries series, double threshold, double separationHours = DefaultSeparationHours)
    {
        ArgumentNullException.ThrowIfNull(series);
        if (double.IsNaN(threshold))
            throw new ArgumentOutOfRangeException(nameof(threshold), threshold, "The threshold must be a number.");
        if (!double.IsFinite(separationHours) || separationHours < 0)
            throw new ArgumentOutOfRangeException(nameof(separationHours), separationHours, "The separation is a finite number of hours at or above 0.");

        double separationSteps = separationHours / series.StepHours;
        var peaks = new List<StormPeak>();
        var values = series.Values;
        int start = -1, last = -1, peakIndex = -1, count = 0;
        for (int i = 0; i < values.Length; i++)
        {
            if (!(values[i] > threshold)) continue;
            int stepsBetween = i - last - 1;
            if (start >= 0 && stepsBetween > 0 && stepsBetween >= separationSteps - 1e-9)
            {
                peaks.Add(Close(series, start, last, peakIndex, count));
                start = -1;
            }
            if (start < 0)
            {
                start = i;
                peakIndex = i;
                count = 0;
            }
            if (values[i] > values[peakIndex])
                peakIndex = i;
            last = i;
            count++;
        }
        if (start >= 0)
            peaks.Add(Close(series, start, last, peakIndex, count));
        return peaks;
    }

    private static StormPeak Close(RegularSeries series, int start, int last, int peakIndex, int count) =>
        new(series.TimeAt(start), series.TimeAt(last), series.TimeAt(peakIndex), series.Values[peakIndex], count);
}
