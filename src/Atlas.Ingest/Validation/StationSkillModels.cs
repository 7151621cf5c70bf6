using Atlas.Assessment.Validation;
using Atlas.Storage.Stations;

namespace Atlas.Ingest.Validation;

/// <summary>A registered station as the API shows it. <c>independent</c> is true for a validation (kept-aside) station.</summary>
public sealed record StationItem(
    string Name, string Slug, string Role, bool Independent, double Lat, double Lon, double? DepthM, string Instrument,
    string SourceFile, string SourceSha256, string SourceFormat, int ObservationCount, int FlaggedCount,
    IReadOnlyList<string> Variables, DateTime TimeStartUtc, DateTime TimeEndUtc, DateTime LoadedAtUtc, string Links)
{
    public static StationItem From(StoredStation s) => new(
        s.Name, s.Slug, StationStore.RoleName(s.Role), s.Role == StationRole.Validation, s.Latitude, s.Longitude,
        // Depth is stored as float4: round away its binary tail (float precision is about 7 digits).
        s.DepthMetres is { } depth ? Math.Round(depth, 3) : null, s.Instrument,
        s.SourceFile, s.SourceSha256, s.SourceFormat, s.ObservationCount, s.FlaggedCount,
        ["hs", .. s.HasTp ? new[] { "tp" } : [], .. s.HasTe ? new[] { "te" } : [], .. s.HasDirection ? new[] { "dir" } : []],
        s.TimeStartUtc, s.TimeEndUtc, s.LoadedAtUtc, $"/api/v1/datasets/{{slug}}/validation?station={s.Slug}");
}

/// <summary>Scalar skill (trade definitions, see <see cref="SkillScores"/>); null where undefined.</summary>
public sealed record SkillRow(
    int N, double? MeanObserved, double? MeanModelled, double? Bias, double? Rmse, double? ScatterIndex, double? BiasCorrectedScatterIndex,
    double? PearsonR, double? SymmetricSlope, double? RegressionSlope, double? RegressionIntercept)
{
    public static SkillRow From(SkillScores s) => new(s.Count, Finite(s.MeanObserved), Finite(s.MeanModelled), Finite(s.Bias), Finite(s.Rmse),
        Finite(s.ScatterIndex), Finite(s.BiasCorrectedScatterIndex), Finite(s.PearsonR), Finite(s.SymmetricSlope), Finite(s.RegressionSlope),
        Finite(s.RegressionIntercept));

    /// <summary>The value, or null for NaN and infinities (JSON has no such numbers).</summary>
    public static double? Finite(double value) => double.IsFinite(value) ? value : null;
}

/// <summary>Skill of directions on the circle, degrees (see <see cref="DirectionalSkillScores"/>); null where undefined.</summary>
public sealed record DirectionalSkillRow(
    int N, double? CircularMeanObserved, double? CircularMeanModelled, double? CircularBias, double? CircularRmse, double? MeanAbsoluteDifference)
{
    public static DirectionalSkillRow From(DirectionalSkillScores s) => new(s.Count, SkillRow.Finite(s.CircularMeanObservedDegrees),
        SkillRow.Finite(s.CircularMeanModelledDegrees), SkillRow.Finite(s.CircularBiasDegrees), SkillRow.Finite(s.CircularRmseDegrees), SkillRow.Finite(s.MeanAbsoluteDifferenceDegrees));
}

public sealed record MatchCountsRow(int Offered, int Matched, int Flagged, int ObservedMissing, int OutsideModelRecord, int ModelGap, int ModelMissing)
{
    public static MatchCountsRow From(MatchCounts c) => new(c.Offered, c.Matched, c.Flagged, c.ObservedMissing, c.OutsideModelRecord, c.ModelGap, c.ModelMissing);
}

/// <summary>A skill group: a season (<c>djf</c>..<c>son</c>) or an Hs class (<c>hs_lower_m</c> to <c>hs_upper_m</c>, null upper = open).</summary>
public sealed record SkillGroup(string? Season, double? HsLowerM, double? HsUpperM, SkillRow? Skill, DirectionalSkillRow? DirectionalSkill);

/// <summary>One variable compared at a station. Scalar variables fill <c>overall</c>; direction fills <c>directional</c>.</summary>
public sealed record VariableSkill(
    string Variable, string Unit, MatchCountsRow Counts, SkillRow? Overall, DirectionalSkillRow? Directional,
    IReadOnlyList<SkillGroup> BySeason, IReadOnlyList<SkillGroup> ByHsClass);

public sealed record MatchingNote(string Method, double ToleranceHours);

public sealed record ValidatedCell(int Id, double Lat, double Lon, double? DepthM, double DistanceM);

public sealed record StationSkill(StationItem Station, ValidatedCell Cell, MatchingNote Matching, IReadOnlyList<VariableSkill> Variables, IReadOnlyList<string> Notes)
{
    public VariableSkill? Find(string variable) => Variables.FirstOrDefault(v => v.Variable == variable);
}

/// <summary>A station the dataset does not cover, with the reason.</summary>
public sealed record StationNotCovered(string Station, string Reason);
