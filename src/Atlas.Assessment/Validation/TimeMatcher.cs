using Atlas.Statistics;

namespace Atlas.Assessment.Validation;

/// <summary>
/// Pairs observations with a modelled series by linear interpolation in time between the two
/// model steps that bracket each observation.
/// </summary>
/// <remarks>
/// An observation is matched only when both bracketing model steps lie within the tolerance of
/// the observation time and both are valid (not NaN). An observation exactly at a model step uses
/// that step alone. Directions are interpolated along the shorter arc of the circle. Model times
/// may be irregular; they must strictly increase.
/// </remarks>
public sealed class TimeMatcher
{
    /// <summary>
    /// Default tolerance: 1.5 h. Every observation between two steps at most 1.5 h apart is matched,
    /// so hourly output with an occasional omitted step matches fully; for coarser output (e.g.
    /// 3-hourly) pass a tolerance of at least the model step, or only observations near the middle
    /// of each interval are matched.
    /// </summary>
    public const double DefaultToleranceHours = 1.5;

    private readonly long _toleranceSeconds;

    /// <summary>Creates a matcher.</summary>
    /// <param name="toleranceHours">Largest distance in time from the observation to each bracketing model step.</param>
    /// <exception cref="ArgumentOutOfRangeException">The tolerance is negative or not finite.</exception>
    public TimeMatcher(double toleranceHours = DefaultToleranceHours)
    {
        if (!double.IsFinite(toleranceHours) || toleranceHours < 0)
            throw new ArgumentOutOfRangeException(nameof(toleranceHours), toleranceHours, "The tolerance must be a finite number of hours at or above 0.");
        ToleranceHours = toleranceHours;
        _toleranceSeconds = (long)Math.Round(toleranceHours * 3600.0);
    }

    /// <summary>Largest distance in time from an observation to each bracketing model step, hours.</summary>
    public double ToleranceHours { get; }

    /// <summary>Matches one variable of a station record; flagged rows are counted, not matched.</summary>
    /// <exception cref="ArgumentException">The record lacks the variable, or the model series is malformed.</exception>
    public MatchedSeries Match(StationRecord record, WaveParameter variable, ReadOnlySpan<long> modelTimesUnixSeconds, ReadOnlySpan<double> modelValues)
    {
        ArgumentNullException.ThrowIfNull(record);
        if (!record.Has(variable))
            throw new ArgumentException($"Station record '{record.SourceName}' has no column for {variable}.", nameof(variable));
        var observations = record.Observations;
        var times = new long[observations.Count];
        var values = new double[observations.Count];
        var flagged = new bool[observations.Count];
        for (int i = 0; i < observations.Count; i++)
        {
            times[i] = observations[i].TimeUnixSeconds;
            values[i] = observations[i].ValueOf(variable);
            flagged[i] = observations[i].IsFlagged;
        }
        return Match(times, values, flagged, modelTimesUnixSeconds, modelValues, variable == WaveParameter.Dir);
    }

    /// <summary>Matches observations given as spans.</summary>
    /// <param name="observedTimesUnixSeconds">Observation times, any order.</param>
    /// <param name="observedValues">Observed values; NaN counts as <see cref="MatchCounts.ObservedMissing"/>.</param>
    /// <param name="observedFlagged">Per observation, true when quality control rejected it; empty for none.</param>
    /// <param name="modelTimesUnixSeconds">Model times, strictly increasing.</param>
    /// <param name="modelValues">Modelled values; NaN marks a missing step.</param>
    /// <param name="isCircular">True for directions in degrees.</param>
    /// <returns>The pairs in the order of the observations, with counts of the unmatched.</returns>
    /// <exception cref="ArgumentException">Lengths differ or model times do not strictly increase.</exception>
    public MatchedSeries Match(
        ReadOnlySpan<long> observedTimesUnixSeconds,
        ReadOnlySpan<double> observedValues,
        ReadOnlySpan<bool> observedFlagged,
        ReadOnlySpan<long> modelTimesUnixSeconds,
        ReadOnlySpan<double> modelValues,
        bool isCircular)
    {
        if (observedValues.Length != observedTimesUnixSeconds.Length)
            throw new ArgumentException($"{observedTimesUnixSeconds.Length} observation times but {observedValues.Length} observed values.", nameof(observedValues));
        if (!observedFlagged.IsEmpty && observedFlagged.Length != observedTimesUnixSeconds.Length)
            throw new ArgumentException($"{observedTimesUnixSeconds.Length} observation times but {observedFlagged.Length} flags.", nameof(observedFlagged));
        if (modelValues.Length != modelTimesUnixSeconds.Length)
            throw new ArgumentException($"{modelTimesUnixSeconds.Length} model times but {modelValues.Length} modelled values.", nameof(modelValues));
        for (int j = 1; j < modelTimesUnixSeconds.Length; j++)
            if (modelTimesUnixSeconds[j] <= modelTimesUnixSeconds[j - 1])
                throw new ArgumentException($"Model times must strictly increase; time {j} is not after time {j - 1}.", nameof(modelTimesUnixSeconds));

        var times = new List<long>();
        var observed = new List<double>();
        var modelled = new List<double>();
        int flagged = 0, observedMissing = 0, outside = 0, gap = 0, modelMissing = 0;

        for (int i = 0; i < observedTimesUnixSeconds.Length; i++)
        {
            long t = observedTimesUnixSeconds[i];
            if (!observedFlagged.IsEmpty && observedFlagged[i]) { flagged++; continue; }
            if (double.IsNaN(observedValues[i])) { observedMissing++; continue; }
            if (modelTimesUnixSeconds.IsEmpty || t < modelTimesUnixSeconds[0] || t > modelTimesUnixSeconds[^1]) { outside++; continue; }

            int found = modelTimesUnixSeconds.BinarySearch(t);
            double value;
            if (found >= 0)
            {
                value = modelValues[found];
                if (double.IsNaN(value)) { modelMissing++; continue; }
            }
            else
            {
                int after = ~found;
                int before = after - 1;
                long tBefore = modelTimesUnixSeconds[before], tAfter = modelTimesUnixSeconds[after];
                if (t - tBefore > _toleranceSeconds || tAfter - t > _toleranceSeconds) { gap++; continue; }
                double a = modelValues[before], b = modelValues[after];
                if (double.IsNaN(a) || double.IsNaN(b)) { modelMissing++; continue; }
                double weight = (double)(t - tBefore) / (tAfter - tBefore);
                value = isCircular ? CircularArc.Interpolate(a, b, weight) : a + weight * (b - a);
            }
            times.Add(t);
            observed.Add(observedValues[i]);
            modelled.Add(value);
        }

        var counts = new MatchCounts(observedTimesUnixSeconds.Length, times.Count, flagged, observedMissing, outside, gap, modelMissing);
        return new MatchedSeries([.. times], [.. observed], [.. modelled], isCircular, counts);
    }
}
