using Atlas.Assessment;
using Atlas.Assessment.Validation;
using Atlas.Ingest.Assessment;
using Atlas.Ingest.Series;
using Atlas.Storage.Cells;
using Atlas.Storage.Stations;

namespace Atlas.Ingest.Validation;

/// <summary>Skill of one Hs class (observed Hs in [LowerMetres, UpperMetres)), for a scalar variable or for directions.</summary>
public sealed record HsClassSkill(double LowerMetres, double UpperMetres, SkillScores? Scalar, DirectionalSkillScores? Directional);

/// <summary>The comparison of one variable: a scalar report (Hs, Tp, Te) or a directional one, and the skill by Hs class.</summary>
public sealed record VariableValidation(
    WaveParameter Variable,
    ScalarValidationReport? Scalar,
    DirectionalValidationReport? Directional,
    IReadOnlyList<HsClassSkill> ByHsClass)
{
    public MatchCounts Counts => Scalar?.Counts ?? Directional!.Counts;
    public MatchedSeries Pairs => Scalar?.Pairs ?? Directional!.Pairs;
}

/// <summary>A station compared with the nearest wet cell of a dataset.</summary>
/// <param name="ToleranceHours">The matcher's tolerance: the larger of 1.5 h and the dataset's median step.</param>
/// <param name="Notes">Variables left out and why.</param>
/// <param name="Model">The cell's series the station was compared with (the years of the station record).</param>
public sealed record StationValidation(
    StoredStation Station,
    NearestCell Cell,
    double ToleranceHours,
    IReadOnlyList<VariableValidation> Variables,
    IReadOnlyList<string> Notes,
    PointSeries Model)
{
    public VariableValidation? Find(WaveParameter variable) => Variables.FirstOrDefault(v => v.Variable == variable);
}

/// <summary>
/// Compares a station's record with a dataset at the station's nearest wet cell (no spatial interpolation): each
/// good observation is paired with the modelled value linearly interpolated in time between the two bracketing model
/// steps (<see cref="TimeMatcher"/>), directions along the shorter arc; flagged rows, gaps and missing values are
/// counted, never paired. Skill comes from <see cref="HindcastValidation"/>; Tp, Te and direction are also scored by
/// class of the observed Hs at the same time.
/// </summary>
public static class StationValidator
{
    /// <summary>Lower bounds of the Hs classes, m: 0-1, 1-2, 2-3, 3-4, 4+ (those of <see cref="ValidationOptions"/>).</summary>
    public static IReadOnlyList<double> HsClassLowerBoundsMetres { get; } = new ValidationOptions().ObservedClassLowerBounds;

    /// <summary>Parses the symbol of a compared variable (<see cref="WaveParameterGroups.StationFields"/>), ignoring case.</summary>
    public static bool TryParse(string? text, out WaveParameter variable)
    {
        if (WaveParameterNames.TryParse(text, out variable) && WaveParameterGroups.StationFields.Contains(variable)) return true;
        variable = WaveParameter.Hs;
        return false;
    }

    /// <summary>The tolerance used with a model time line: 1.5 h, or the median model step when that is longer.</summary>
    public static double ToleranceHoursFor(ReadOnlySpan<long> modelTimes)
    {
        var step = AssessmentSeries.MedianStepHours(modelTimes);
        return double.IsNaN(step) ? TimeMatcher.DefaultToleranceHours : Math.Max(TimeMatcher.DefaultToleranceHours, step);
    }

    /// <param name="model">The cell's series over (at least) the station's years.</param>
    public static StationValidation Validate(StoredStation station, NearestCell cell, StationObservationColumns observations, PointSeries model)
    {
        var tolerance = ToleranceHoursFor(model.Times);
        var matcher = new TimeMatcher(tolerance);
        var flagged = observations.Qc.Select(q => q != 0).ToArray();
        var observedHs = new Dictionary<long, double>(observations.Count);
        for (var i = 0; i < observations.Count; i++)
            if (!flagged[i] && !float.IsNaN(observations.Hs[i])) observedHs[observations.TimesUnixSeconds[i]] = observations.Hs[i];

        var results = new List<VariableValidation>();
        var notes = new List<string>();
        foreach (var variable in WaveParameterGroups.StationFields)
        {
            var (stationHas, modelHas, observed, modelled) = variable switch
            {
                WaveParameter.Hs => (true, true, observations.Hs, model.Hs),
                WaveParameter.Tp => (station.HasTp, model.HasTp, observations.Tp, model.Tp),
                WaveParameter.Te => (station.HasTe, model.HasTe, observations.Te, model.Te),
                _ => (station.HasDirection, model.HasDir, observations.Dir, model.Dir),
            };
            if (!stationHas || !modelHas)
            {
                notes.Add($"{variable.Symbol()} is not compared: the {(stationHas ? "dataset" : "station record")} has no {variable.Symbol()}.");
                continue;
            }
            var circular = variable == WaveParameter.Dir;
            var pairs = matcher.Match(observations.TimesUnixSeconds, Doubles(observed), flagged, model.Times, Doubles(modelled), circular);
            results.Add(circular
                ? new VariableValidation(variable, null, HindcastValidation.AssessDirection(pairs), ByHsClass(pairs, observedHs, circular: true))
                : new VariableValidation(variable, HindcastValidation.Assess(pairs), null, ByHsClass(pairs, observedHs, circular: false)));
        }
        return new StationValidation(station, cell, tolerance, results, notes, model);
    }

    /// <summary>Skill of the pairs whose observation time has an observed Hs in each class (the Hs pairs themselves included).</summary>
    private static IReadOnlyList<HsClassSkill> ByHsClass(MatchedSeries pairs, Dictionary<long, double> observedHs, bool circular)
    {
        var bounds = HsClassLowerBoundsMetres;
        var classes = new List<HsClassSkill>(bounds.Count);
        for (var c = 0; c < bounds.Count; c++)
        {
            double lower = bounds[c], upper = c + 1 < bounds.Count ? bounds[c + 1] : double.PositiveInfinity;
            var observed = new List<double>();
            var modelled = new List<double>();
            for (var i = 0; i < pairs.Count; i++)
            {
                if (!observedHs.TryGetValue(pairs.TimesUnixSeconds[i], out var hs) || hs < lower || hs >= upper) continue;
                observed.Add(pairs.Observed[i]);
                modelled.Add(pairs.Modelled[i]);
            }
            classes.Add(circular
                ? new HsClassSkill(lower, upper, null, SkillMetrics.ComputeDirectional(observed.ToArray(), modelled.ToArray()))
                : new HsClassSkill(lower, upper, SkillMetrics.Compute(observed.ToArray(), modelled.ToArray()), null));
        }
        return classes;
    }

    private static double[] Doubles(float[] values)
    {
        var result = new double[values.Length];
        for (var i = 0; i < result.Length; i++) result[i] = values[i];
        return result;
    }
}
