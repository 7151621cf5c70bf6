namespace Atlas.Assessment.Access;

/// <summary>Weather-window statistics of one calendar month, gathered across all years of the record.</summary>
/// <param name="Month">Calendar month, 1..12.</param>
/// <param name="Steps">Steps of the record in this month, missing ones included.</param>
/// <param name="DeterminedSteps">Steps at which it is known whether a window starts: a window starts, or a
/// step beyond the limits arrives before the required duration is reached. Steps whose answer hangs on a
/// missing step or on the end of the record are left out.</param>
/// <param name="WindowStartSteps">Steps from which a calm spell of at least the required duration starts
/// (every step of a long enough spell except its last required-minus-one steps).</param>
/// <param name="WindowStartProbability">WindowStartSteps / DeterminedSteps: the probability that an operation
/// can start at a random time of the month; NaN without determined steps.</param>
/// <param name="WindowCount">Distinct windows: calm spells at least as long as the required duration that
/// start in this month (a long spell counts once).</param>
/// <param name="EquivalentMonths">Non-missing time of this month in the record, in months of that length.</param>
/// <param name="MeanWindowsPerMonth">WindowCount / EquivalentMonths; NaN without data.</param>
/// <param name="WaitingSamples">Steps with a known waiting time (a later window start with no gap before it).</param>
/// <param name="MeanWaitingHours">Mean time from a step to the next window start (0 when one starts at the step); NaN without samples.</param>
/// <param name="Accessibility">Share of non-missing time within limits.</param>
public sealed record MonthlyWindowStatistics(
    int Month,
    int Steps,
    int DeterminedSteps,
    int WindowStartSteps,
    double WindowStartProbability,
    int WindowCount,
    double EquivalentMonths,
    double MeanWindowsPerMonth,
    int WaitingSamples,
    double MeanWaitingHours,
    AccessibilityFraction Accessibility);
