using Atlas.Statistics;

namespace Atlas.Assessment.Yield;

/// <summary>Production in one calendar month, gathered across all years.</summary>
/// <param name="Month">Calendar month, 1..12.</param>
/// <param name="ValidSteps">Steps with both Hs and period present.</param>
/// <param name="MeanPowerKw">Mean power over those steps; NaN without any.</param>
/// <param name="MeanEnergyMwh">Mean production of the month: mean power × the month's mean length
/// (<see cref="CalendarHours.InMeanMonth"/>, February 28.25 days) / 1000.</param>
public sealed record MonthlyYield(int Month, int ValidSteps, double MeanPowerKw, double MeanEnergyMwh);

/// <summary>Production in one calendar year.</summary>
/// <param name="Year">Calendar year (UTC).</param>
/// <param name="ValidSteps">Steps with both Hs and period present.</param>
/// <param name="Coverage">Non-missing time over the length of the year, 0..1.</param>
/// <param name="MeanPowerKw">Mean power over the valid steps; NaN without any.</param>
/// <param name="EnergyMwh">Mean power × hours in that year (8760 or 8784) / 1000: the year's production
/// with its gaps filled at the year's mean.</param>
/// <param name="IsComplete">Coverage reaches the minimum; only complete years enter the coefficient of variation.</param>
public sealed record YearlyYield(int Year, int ValidSteps, double Coverage, double MeanPowerKw, double EnergyMwh, bool IsComplete);

/// <summary>Device production over a time series.</summary>
/// <param name="MatrixName">The power matrix used.</param>
/// <param name="Interpolation">How the matrix was read.</param>
/// <param name="RatedPowerKw">Rated power, kW.</param>
/// <param name="Steps">Steps in the series.</param>
/// <param name="ValidSteps">Steps with both Hs and period present.</param>
/// <param name="MissingSteps">Steps with Hs or period missing, left out of every mean.</param>
/// <param name="OutsideMatrixSteps">Valid steps outside the matrix range, counted at 0 kW.</param>
/// <param name="OutsideMatrixFraction">OutsideMatrixSteps / ValidSteps.</param>
/// <param name="MeanPowerKw">Mean power over the valid steps (power per step, then averaged).</param>
/// <param name="AnnualEnergyMwh">Mean annual energy production: mean power × 8766 h / 1000 (a mean year of 365.25 days).</param>
/// <param name="CapacityFactor">Mean power / rated power.</param>
/// <param name="Months">Production per calendar month, January to December.</param>
/// <param name="Years">Production per calendar year, in order.</param>
/// <param name="InterannualCoefficientOfVariation">Sample standard deviation (divisor n - 1) over the mean of the
/// complete years' production; NaN with fewer than two complete years.</param>
/// <param name="CompleteYears">Years entering the coefficient of variation.</param>
public sealed record SeriesYield(
    string MatrixName,
    PowerMatrixInterpolation Interpolation,
    double RatedPowerKw,
    int Steps,
    int ValidSteps,
    int MissingSteps,
    int OutsideMatrixSteps,
    double OutsideMatrixFraction,
    double MeanPowerKw,
    double AnnualEnergyMwh,
    double CapacityFactor,
    IReadOnlyList<MonthlyYield> Months,
    IReadOnlyList<YearlyYield> Years,
    double InterannualCoefficientOfVariation,
    int CompleteYears);
