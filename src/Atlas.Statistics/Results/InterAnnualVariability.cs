using System.Text.Json.Serialization;

namespace Atlas.Statistics.Results;

/// <summary>Means of one year (or one season of one year) at a point.</summary>
/// <param name="Year">The year of the period: the calendar year, and for a season the year of its months, the winter
/// (DJF) of a year being its January and February with the December before (DJF of 2011 is December 2010 to February 2011).</param>
/// <param name="Label">The period's months: the year for annual, else the ISO 8601 interval of its first and last months, e.g. 2010-12/2011-02.</param>
/// <param name="Hs">Mean Hs, m; NaN (null) when no step.</param>
/// <param name="Te">Mean Te, s.</param>
/// <param name="J">Mean of the per-step power, kW/m.</param>
/// <param name="Coverage">Coverage of the core series (J when power can be computed, else Hs), against the calendar: a
/// winter whose December lies before the record (or a window) starts is two-thirds covered at most.</param>
/// <param name="LowCoverage">Coverage below the threshold: the year is listed but left out of the coefficients of variation.</param>
public sealed record YearlyMeans(
    int Year,
    string Label,
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double Hs,
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double Te,
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double J,
    double Coverage,
    bool LowCoverage);

/// <summary>Year-to-year variability of one period's mean.</summary>
/// <param name="Period">annual, djf, mam, jja or son.</param>
/// <param name="Years">One row per year of the window.</param>
/// <param name="YearsUsed">Years with enough coverage, used for the coefficients.</param>
/// <param name="YearsLeftOut">Years listed but left out of the coefficients for their low coverage (partial years, cut winters).</param>
/// <param name="HsCoefficientOfVariation">Sample standard deviation (n - 1) of the yearly means over their mean; NaN (null) with fewer than two years used.</param>
/// <param name="TeCoefficientOfVariation">As for Hs, of Te.</param>
/// <param name="JCoefficientOfVariation">As for Hs, of J.</param>
public sealed record InterAnnualSeries(
    AtlasPeriod Period,
    IReadOnlyList<YearlyMeans> Years,
    int YearsUsed,
    IReadOnlyList<int> YearsLeftOut,
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double HsCoefficientOfVariation,
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double TeCoefficientOfVariation,
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double JCoefficientOfVariation);
