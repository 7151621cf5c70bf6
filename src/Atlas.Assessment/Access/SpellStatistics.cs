using Atlas.Statistics;

namespace Atlas.Assessment.Access;

/// <summary>Number of spells whose duration lies in [<paramref name="LowerHours"/>, <paramref name="UpperHours"/>).</summary>
/// <param name="LowerHours">Inclusive lower bound, hours.</param>
/// <param name="UpperHours">Exclusive upper bound, hours; +∞ for the last class.</param>
/// <param name="Count">Spells in the class.</param>
public sealed record SpellDurationClass(double LowerHours, double UpperHours, int Count);

/// <summary>
/// Persistence of calm or storm spells: maximal runs of consecutive steps in one state, each step
/// lasting one step length. A missing step ends a spell. Spells cut by a gap or by either end of
/// the record are included with the length seen and counted in <see cref="CensoredCount"/>.
/// </summary>
/// <param name="Count">Number of spells.</param>
/// <param name="CensoredCount">Spells touching a gap or an end of the record (their true length may be longer).</param>
/// <param name="MeanHours">Mean duration; NaN without spells.</param>
/// <param name="MedianHours">Median duration (Hyndman-Fan type 7, see <see cref="ExactQuantile"/>); NaN without spells.</param>
/// <param name="MaximumHours">Longest duration; NaN without spells.</param>
/// <param name="Classes">Counts by duration class.</param>
public sealed record SpellStatistics(
    int Count,
    int CensoredCount,
    double MeanHours,
    double MedianHours,
    double MaximumHours,
    IReadOnlyList<SpellDurationClass> Classes);
