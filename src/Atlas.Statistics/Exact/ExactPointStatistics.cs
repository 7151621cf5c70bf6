using System.Text.Json.Serialization;

namespace Atlas.Statistics.Exact;

/// <summary>The exact statistics of one point (see <see cref="ExactPointAnalysis"/>).</summary>
/// <param name="DepthMetres">Depth used for power, m; NaN (null) when unknown.</param>
/// <param name="DeepWaterAssumed">True when the depth was unknown and power was computed for deep water.</param>
/// <param name="EnergyPeriodSource">Where Te came from.</param>
/// <param name="QuantileDefinition">Definition of the percentiles.</param>
/// <param name="Window">The window applied, or null for the whole record.</param>
/// <param name="StepsInWindow">Timeline steps inside the window.</param>
/// <param name="Periods">Every period with steps in the window (standard ones, then years); annual is the whole window.</param>
/// <param name="HsExceedance">Exceedance curve of Hs over the window.</param>
/// <param name="PowerExceedance">Exceedance curve of J over the window.</param>
/// <param name="JointOccurrence">Joint occurrence of Hm0 and Te over the window.</param>
/// <param name="InterAnnual">Yearly annual and seasonal means of Hs, Te and J, and their coefficients of variation.</param>
public sealed record ExactPointStatistics(
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double DepthMetres,
    bool DeepWaterAssumed,
    EnergyPeriodSource EnergyPeriodSource,
    QuantileDefinition QuantileDefinition,
    AnalysisWindow? Window,
    long StepsInWindow,
    IReadOnlyList<PeriodStatistics> Periods,
    ExceedanceCurve HsExceedance,
    ExceedanceCurve PowerExceedance,
    JointOccurrenceTable JointOccurrence,
    IReadOnlyList<InterAnnualSeries> InterAnnual)
{
    /// <summary>The statistics of a period, or null when the window has no step in it.</summary>
    public PeriodStatistics? Find(AtlasPeriod period) => Periods.FirstOrDefault(p => p.Period == period);
}
