using Atlas.Statistics;

namespace Atlas.Assessment.Access;

/// <summary>
/// Weather windows on a regular series: when, per calendar month, a calm spell long enough for an
/// operation starts, how many there are, how long one waits for the next, and how long calm and
/// storm spells last.
/// </summary>
/// <remarks>
/// A missing step (Hs NaN, or Tp NaN under a Tp limit) is neither calm nor storm: it breaks every
/// spell, so no window spans a gap, and statistics that would depend on the missing value are left
/// out rather than guessed (see <see cref="MonthlyWindowStatistics"/>). A run of k steps lasts k
/// steps (each step stands for the interval up to the next), so a window needs
/// ceil(duration / step) consecutive calm steps.
/// </remarks>
public static class WeatherWindowAnalysis
{
    /// <summary>The method in words, for the notes of every answer and layer built on it.</summary>
    public const string MethodNote =
        "a step is within limits when Hs <= hs_max (and Tp <= tp_max when given); a window is a run of at least ceil(hours / step) such steps; " +
        "window_start_probability is the share of a month's steps from which a window starts, among the steps whose answer is known " +
        "(a missing step breaks every spell and is neither within nor beyond limits); mean_windows_per_month counts distinct windows " +
        "starting in the month per month of data; mean_waiting_hours is the mean time from a step to the next window start; spells are " +
        "maximal runs within (calm) or beyond (storm) the limits, censored where cut by a gap or an end of the record.";

    /// <summary>Default lower bounds of the spell-duration classes, hours: 0, 6, 12, 24, 48, 72, 120.</summary>
    public static IReadOnlyList<double> DefaultSpellClassLowerBoundsHours { get; } = [0, 6, 12, 24, 48, 72, 120];

    /// <summary>Analyses the windows of a series.</summary>
    /// <param name="hs">Hs series, m.</param>
    /// <param name="tp">Tp series on the same times, s; required when the limits set a Tp limit, otherwise ignored.</param>
    /// <param name="limits">Access limits.</param>
    /// <param name="requiredHours">Duration the operation needs, hours.</param>
    /// <param name="spellClassLowerBoundsHours">Lower bounds of the spell-duration classes, ascending from 0; default
    /// <see cref="DefaultSpellClassLowerBoundsHours"/>.</param>
    /// <exception cref="ArgumentException">The duration is not positive, Tp is needed but missing or misaligned, or the
    /// class bounds are not ascending.</exception>
    public static WeatherWindowResult Analyse(
        RegularSeries hs, RegularSeries? tp, AccessLimits limits, double requiredHours,
        IReadOnlyList<double>? spellClassLowerBoundsHours = null)
    {
        ArgumentNullException.ThrowIfNull(hs);
        ArgumentNullException.ThrowIfNull(limits);
        if (!double.IsFinite(requiredHours) || requiredHours <= 0)
            throw new ArgumentOutOfRangeException(nameof(requiredHours), requiredHours, "The required duration must be a positive number of hours.");
        if (limits.TpLimitSeconds is not null)
        {
            if (tp is null)
                throw new ArgumentException("A Tp limit is set but no Tp series was given.", nameof(tp));
            hs.RequireAlignedWith(tp, nameof(tp));
        }
        var bounds = spellClassLowerBoundsHours ?? DefaultSpellClassLowerBoundsHours;
        for (int i = 1; i < bounds.Count; i++)
            if (!(bounds[i] > bounds[i - 1]))
                throw new ArgumentException($"Spell class bounds must ascend; {bounds[i]} follows {bounds[i - 1]}.", nameof(spellClassLowerBoundsHours));

        int n = hs.Count;
        double stepHours = hs.StepHours;
        int required = (int)Math.Ceiling(requiredHours / stepHours - 1e-9);
        var states = new SeaStateClass[n];
        var hsValues = hs.Values;
        for (int i = 0; i < n; i++)
            states[i] = Accessibility.Classify(hsValues[i], limits.TpLimitSeconds is null ? double.NaN : tp!.Values[i], limits);

        // Backward passes: calm run length from each step, the next window start, the next missing step.
        var calmRun = new int[n + 1];
        var nextStart = new int[n + 1];
        var nextMissing = new int[n + 1];
        nextStart[n] = nextMissing[n] = -1;
        for (int i = n - 1; i >= 0; i--)
        {
            calmRun[i] = states[i] == SeaStateClass.Calm ? calmRun[i + 1] + 1 : 0;
            nextStart[i] = calmRun[i] >= required ? i : nextStart[i + 1];
            nextMissing[i] = states[i] == SeaStateClass.Missing ? i : nextMissing[i + 1];
        }

        var months = new MonthAccumulator[12];
        for (int m = 0; m < 12; m++)
            months[m] = new MonthAccumulator();
        foreach (var (year, month, start, end) in hs.MonthBlocks())
        {
            var accumulator = months[month - 1];
            int valid = 0;
            for (int i = start; i < end; i++)
            {
                accumulator.Steps++;
                if (states[i] != SeaStateClass.Missing)
                {
                    valid++;
                    accumulator.ValidSteps++;
                    if (states[i] == SeaStateClass.Calm) accumulator.CalmSteps++;
                }
                bool startsWindow = calmRun[i] >= required;
                int firstNotCalm = i + calmRun[i];
                bool determined = startsWindow || (firstNotCalm < n && states[firstNotCalm] == SeaStateClass.Storm);
                if (determined) accumulator.DeterminedSteps++;
                if (startsWindow) accumulator.WindowStartSteps++;
                if (startsWindow && (i == 0 || states[i - 1] != SeaStateClass.Calm)) accumulator.WindowCount++;
                int next = nextStart[i];
                if (next >= 0 && (nextMissing[i] < 0 || nextMissing[i] > next))
                {
                    accumulator.WaitingSamples++;
                    accumulator.WaitingHoursSum += (next - i) * stepHours;
                }
            }
            accumulator.EquivalentMonths += valid * stepHours / CalendarHours.InMonth(year, month);
        }

        var monthly = months.Select((a, m) => new MonthlyWindowStatistics(
            m + 1, a.Steps, a.DeterminedSteps, a.WindowStartSteps,
            a.DeterminedSteps > 0 ? (double)a.WindowStartSteps / a.DeterminedSteps : double.NaN,
            a.WindowCount, a.EquivalentMonths,
            a.EquivalentMonths > 0 ? a.WindowCount / a.EquivalentMonths : double.NaN,
            a.WaitingSamples,
            a.WaitingSamples > 0 ? a.WaitingHoursSum / a.WaitingSamples : double.NaN,
            new AccessibilityFraction(a.CalmSteps, a.ValidSteps))).ToArray();

        int calmTotal = months.Sum(a => a.CalmSteps), validTotal = months.Sum(a => a.ValidSteps);
        return new WeatherWindowResult(
            limits, requiredHours, required, stepHours, monthly,
            Spells(states, SeaStateClass.Calm, stepHours, bounds),
            Spells(states, SeaStateClass.Storm, stepHours, bounds),
            new AccessibilityFraction(calmTotal, validTotal));
    }

    private static SpellStatistics Spells(SeaStateClass[] states, SeaStateClass kind, double stepHours, IReadOnlyList<double> bounds)
    {
        var durations = new List<double>();
        int censored = 0;
        for (int i = 0; i < states.Length;)
        {
            if (states[i] != kind) { i++; continue; }
            int start = i;
            while (i < states.Length && states[i] == kind) i++;
            durations.Add((i - start) * stepHours);
            bool cutAtStart = start == 0 || states[start - 1] == SeaStateClass.Missing;
            bool cutAtEnd = i == states.Length || states[i] == SeaStateClass.Missing;
            if (cutAtStart || cutAtEnd) censored++;
        }
        var classes = bounds.Select((lower, c) =>
        {
            double upper = c + 1 < bounds.Count ? bounds[c + 1] : double.PositiveInfinity;
            return new SpellDurationClass(lower, upper, durations.Count(d => d >= lower && d < upper));
        }).ToArray();
        if (durations.Count == 0)
            return new SpellStatistics(0, 0, double.NaN, double.NaN, double.NaN, classes);
        double[] sorted = [.. durations.Order()];
        return new SpellStatistics(durations.Count, censored, durations.Average(), ExactQuantile.OfSorted(sorted, 0.5), sorted[^1], classes);
    }

    private sealed class MonthAccumulator
    {
        public int Steps, ValidSteps, CalmSteps, DeterminedSteps, WindowStartSteps, WindowCount, WaitingSamples;
        public double EquivalentMonths, WaitingHoursSum;
    }
}
