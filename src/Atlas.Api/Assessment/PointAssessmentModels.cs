namespace Atlas.Api.Assessment;

public sealed record DeviceSummary(string Name, string Slug, string Axis, double RatedPowerKw);

public sealed record MonthlyYieldRow(int Month, int ValidSteps, double? MeanPowerKw, double? MeanEnergyMwh);

public sealed record YearlyYieldRow(int Year, int ValidSteps, double Coverage, double? MeanPowerKw, double? EnergyMwh, bool Complete);

/// <summary>A device's production at a point, from the exact series (power per step, then averaged).</summary>
public sealed record PointYield(
    string Dataset, PointCell Cell, DeviceSummary Device, string Interpolation, string InterpolationNote, string PeriodSource,
    int? FromYear, int? ToYear,
    double? AnnualEnergyMwh, double? MeanPowerKw, double? CapacityFactor, double? OutsideMatrixFraction,
    int Steps, int ValidSteps, int MissingSteps, int OutsideMatrixSteps,
    IReadOnlyList<MonthlyYieldRow> Months, IReadOnlyList<YearlyYieldRow> Years, double? InterannualCv, int CompleteYears,
    string Method, Provenance Provenance, string Caution)
{
    public static PointYield From(string dataset, PointCell cell, DeviceSummary device, string periodSource, int? fromYear, int? toYear,
        SeriesYield y, Provenance provenance) => new(
        dataset, cell, device, MatrixInterpolationQuery.Name(y.Interpolation), MatrixInterpolationQuery.Note, periodSource,
        fromYear, toYear, SkillRow.Finite(y.AnnualEnergyMwh), SkillRow.Finite(y.MeanPowerKw), SkillRow.Finite(y.CapacityFactor), SkillRow.Finite(y.OutsideMatrixFraction),
        y.Steps, y.ValidSteps, y.MissingSteps, y.OutsideMatrixSteps,
        [.. y.Months.Select(m => new MonthlyYieldRow(m.Month, m.ValidSteps, SkillRow.Finite(m.MeanPowerKw), SkillRow.Finite(m.MeanEnergyMwh)))],
        [.. y.Years.Select(a => new YearlyYieldRow(a.Year, a.ValidSteps, a.Coverage, SkillRow.Finite(a.MeanPowerKw), SkillRow.Finite(a.EnergyMwh), a.IsComplete))],
        SkillRow.Finite(y.InterannualCoefficientOfVariation), y.CompleteYears, YieldMethod, provenance, AtlasCaution.Text);

    public const string YieldMethod = DeviceYield.MethodNote;
}

public sealed record AccessLimitsRow(double HsMaxM, double? TpMaxS);

public sealed record MonthlyWindowRow(
    int Month, int Steps, int DeterminedSteps, int WindowStartSteps, double? WindowStartProbability, int WindowCount, double EquivalentMonths,
    double? MeanWindowsPerMonth, int WaitingSamples, double? MeanWaitingHours, double? AccessibleFraction);

public sealed record SpellClassRow(double LowerHours, double? UpperHours, int Count);

public sealed record SpellRow(int Count, int CensoredCount, double? MeanHours, double? MedianHours, double? MaximumHours, IReadOnlyList<SpellClassRow> Classes)
{
    public static SpellRow From(SpellStatistics s) => new(s.Count, s.CensoredCount, SkillRow.Finite(s.MeanHours), SkillRow.Finite(s.MedianHours), SkillRow.Finite(s.MaximumHours),
        [.. s.Classes.Select(c => new SpellClassRow(c.LowerHours, double.IsFinite(c.UpperHours) ? c.UpperHours : null, c.Count))]);
}

/// <summary>Weather windows at a point for one set of access limits and a required duration.</summary>
public sealed record PointWindows(
    string Dataset, PointCell Cell, AccessLimitsRow Limits, double RequiredHours, int RequiredSteps, double StepHours, int? FromYear, int? ToYear,
    IReadOnlyList<MonthlyWindowRow> Months, SpellRow CalmSpells, SpellRow StormSpells, double? AccessibleFraction, string Method,
    Provenance Provenance, string Caution)
{
    public static PointWindows From(string dataset, PointCell cell, int? fromYear, int? toYear, WeatherWindowResult r, Provenance provenance) => new(
        dataset, cell, new AccessLimitsRow(r.Limits.HsLimitMetres, r.Limits.TpLimitSeconds), r.RequiredHours, r.RequiredSteps, r.StepHours, fromYear, toYear,
        [.. r.Months.Select(m => new MonthlyWindowRow(m.Month, m.Steps, m.DeterminedSteps, m.WindowStartSteps, SkillRow.Finite(m.WindowStartProbability), m.WindowCount,
            m.EquivalentMonths, SkillRow.Finite(m.MeanWindowsPerMonth), m.WaitingSamples, SkillRow.Finite(m.MeanWaitingHours), SkillRow.Finite(m.Accessibility.Fraction)))],
        SpellRow.From(r.CalmSpells), SpellRow.From(r.StormSpells), SkillRow.Finite(r.Accessibility.Fraction), WindowMethod, provenance,
        AtlasCaution.Text);

    public const string WindowMethod = WeatherWindowAnalysis.MethodNote;
}

public sealed record ReturnLevelRow(double ReturnPeriodYears, double? Level, double? Lower, double? Upper, bool UpperUnbounded, double ConfidenceLevel,
    bool LongExtrapolation, string? Note)
{
    public static ReturnLevelRow From(ReturnLevel r) => new(r.ReturnPeriodYears, SkillRow.Finite(r.Level), SkillRow.Finite(r.Lower), SkillRow.Finite(r.Upper),
        double.IsPositiveInfinity(r.Upper), r.ConfidenceLevel, r.IsLongExtrapolation, r.Note);
}

public sealed record PlotPointRow(double Value, double EmpiricalProbability, double? FittedProbability, double? FittedQuantile)
{
    public static PlotPointRow From(ProbabilityPlotPoint p) => new(p.Value, p.EmpiricalProbability, SkillRow.Finite(p.FittedProbability), SkillRow.Finite(p.FittedQuantile));
}

public sealed record CautionRow(string Kind, string Text)
{
    public static CautionRow From(ExtremeCaution c) => new(c.Kind switch
    {
        ExtremeCautionKind.General => "general",
        ExtremeCautionKind.LongExtrapolation => "long_extrapolation",
        ExtremeCautionKind.SmallSample => "small_sample",
        ExtremeCautionKind.UndefinedLevel => "undefined_level",
        _ => "open_interval",
    }, c.Text);
}

public sealed record DistributionFit(string Distribution, double? Location, double Scale, double Shape, double? ScipyShapeC, double LogLikelihood,
    IReadOnlyList<ReturnLevelRow> ReturnLevels, IReadOnlyList<PlotPointRow> Diagnostics);

public sealed record AnnualMaximumRow(int Year, double Value, DateTime Time, double Coverage);

public sealed record RejectedYearRow(int Year, double Coverage);

public sealed record AnnualMaximaExtremes(
    bool Available, string? Reason, double MinimumCoverage, IReadOnlyList<AnnualMaximumRow> Maxima, IReadOnlyList<RejectedYearRow> RejectedYears,
    DistributionFit? Gumbel, DistributionFit? Gev, IReadOnlyList<CautionRow> Cautions);

public sealed record StormPeakRow(DateTime Start, DateTime End, DateTime Peak, double Value, int StepsAboveThreshold);

public sealed record PeaksOverThresholdExtremes(
    bool Available, string? Reason, double? Threshold, double? ThresholdQuantile, double? SeparationHours, double? RecordYears, double? ExceedancesPerYear,
    IReadOnlyList<StormPeakRow> Peaks, DistributionFit? Gpd, IReadOnlyList<CautionRow> Cautions);

/// <summary>
/// Extreme Hs at a point. <c>strong_caution</c> repeats the strongest caution (long extrapolation beyond the record, or too
/// few values for a stable fit) so that no reader misses it; it is null only when neither applies.
/// </summary>
public sealed record PointExtremes(
    string Dataset, PointCell Cell, string Variable, string Unit, double RecordYears, int? FromYear, int? ToYear,
    AnnualMaximaExtremes? AnnualMaxima, PeaksOverThresholdExtremes? PeaksOverThreshold, string? StrongCaution,
    Provenance Provenance, string Caution);
