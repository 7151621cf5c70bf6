using System.Text.Json.Serialization;
using System.Runtime.CompilerServices;

namespace Atlas.Statistics.Binned;

/// <summary>The statistics of one cell: one entry per period present in the timeline.</summary>
/// <param name="DepthMetres">The cell depth, m; NaN (JSON null) when unknown.</param>
/// <param name="DeepWaterAssumed">True when the depth was unknown and power was computed for deep water.</param>
/// <param name="EnergyPeriodSource">Where Te came from.</param>
/// <param name="Periods">The standard periods present (jan..dec, djf, mam, jja, son, annual, in that order), then each year present.
/// A period is present when at least one step of the timeline falls in it.</param>
public sealed record BinnedCellStatistics(
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double DepthMetres,
    bool DeepWaterAssumed,
    EnergyPeriodSource EnergyPeriodSource,
    IReadOnlyList<PeriodStatistics> Periods)
{
    /// <summary>The statistics of a period, or null when the timeline has no step in it.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public PeriodStatistics? Find(AtlasPeriod period)
    {
        foreach (PeriodStatistics p in Periods)
            if (p.Period == period) return p;
        return null;
    }
}
