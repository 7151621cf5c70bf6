namespace Atlas.Assessment.Access;

/// <summary>Weather windows for one set of limits and one required duration.</summary>
/// <param name="Limits">The limits.</param>
/// <param name="RequiredHours">The duration asked for, hours.</param>
/// <param name="RequiredSteps">Steps a window needs: the duration over the step, rounded up.</param>
/// <param name="StepHours">The series step, hours.</param>
/// <param name="Months">Statistics per calendar month, January to December.</param>
/// <param name="CalmSpells">Persistence of spells within limits.</param>
/// <param name="StormSpells">Persistence of spells beyond limits.</param>
/// <param name="Accessibility">Share of all non-missing time within limits.</param>
public sealed record WeatherWindowResult(
    AccessLimits Limits,
    double RequiredHours,
    int RequiredSteps,
    double StepHours,
    IReadOnlyList<MonthlyWindowStatistics> Months,
    SpellStatistics CalmSpells,
    SpellStatistics StormSpells,
    AccessibilityFraction Accessibility);
