using System.Text.Json.Serialization;

namespace Atlas.Statistics.Series;

/// <summary>Where the energy period used for Te statistics and for power came from.</summary>
[JsonConverter(typeof(JsonStringEnumConverter<EnergyPeriodSource>))]
public enum EnergyPeriodSource
{
    /// <summary>The dataset's own Te.</summary>
    Provided,

    /// <summary>Te = ratio x Tp, the dataset having no Te (ratio of <see cref="StatisticsOptions.AssumedSpectrum"/>).</summary>
    DerivedFromPeakPeriod,

    /// <summary>Neither Te nor Tp: no Te statistics and no power.</summary>
    Unavailable,
}
