namespace Atlas.Assessment.Validation;

/// <summary>What happened to each observation offered for matching; the reasons add up to <see cref="Offered"/>.</summary>
/// <param name="Offered">Observations offered.</param>
/// <param name="Matched">Observations paired with a modelled value.</param>
/// <param name="Flagged">Rejected by the station's quality flag.</param>
/// <param name="ObservedMissing">The observation has no value for the variable (NaN).</param>
/// <param name="OutsideModelRecord">Before the first or after the last model time.</param>
/// <param name="ModelGap">A bracketing model step lies farther away than the tolerance (a gap in the model times).</param>
/// <param name="ModelMissing">A bracketing model step is NaN (a missing modelled value).</param>
public sealed record MatchCounts(
    int Offered,
    int Matched,
    int Flagged,
    int ObservedMissing,
    int OutsideModelRecord,
    int ModelGap,
    int ModelMissing)
{
    /// <summary>Observations not matched, for any reason.</summary>
    public int Unmatched => Offered - Matched;
}
