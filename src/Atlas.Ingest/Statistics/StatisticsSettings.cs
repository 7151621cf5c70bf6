using Atlas.Statistics;
using Atlas.WavePhysics;

namespace Atlas.Ingest.Statistics;

/// <summary>
/// The statistics options as configuration gives them, section <c>Statistics</c>: every key optional, an unset one
/// keeps the published default of <see cref="StatisticsOptions"/>. The hosts bind this plain class and build the
/// options from it, so that the statistics library stays free of configuration (and a list given in configuration
/// replaces the default list instead of being appended to it, as binding onto a filled list would).
/// </summary>
public sealed class StatisticsSettings
{
    /// <summary>The configuration section.</summary>
    public const string Section = "Statistics";

    /// <summary>Hs exceedance thresholds, m, increasing (<c>Statistics:HsThresholdsMetres:0</c>, ...).</summary>
    public double[]? HsThresholdsMetres { get; set; }

    /// <summary>Power exceedance thresholds, kW/m, increasing.</summary>
    public double[]? PowerThresholdsKilowattsPerMetre { get; set; }

    /// <summary>Coverage below which a period is flagged, 0 to 1.</summary>
    public double? LowCoverageThreshold { get; set; }

    /// <summary>Spectrum assumed for Te from Tp: JonswapGamma33 or PiersonMoskowitz.</summary>
    public SpectrumShape? AssumedSpectrum { get; set; }

    /// <summary>Histogram bins of Hs percentiles in layers (<c>Statistics:HsBinning:BinWidth</c>, <c>...:UpperBound</c>), m.</summary>
    public BinningSettings? HsBinning { get; set; }

    /// <summary>Histogram bins of Te and Tp percentiles, s.</summary>
    public BinningSettings? PeriodBinning { get; set; }

    /// <summary>Histogram bins of J percentiles, kW/m.</summary>
    public BinningSettings? PowerBinning { get; set; }

    /// <summary>Histogram bins of spread percentiles, degree.</summary>
    public BinningSettings? SpreadBinning { get; set; }

    /// <summary>The options these settings give (not yet validated: see <see cref="StatisticsOptions.Validate"/>).</summary>
    public StatisticsOptions ToOptions()
    {
        var defaults = new StatisticsOptions();
        return new StatisticsOptions
        {
            HsThresholdsMetres = HsThresholdsMetres ?? defaults.HsThresholdsMetres,
            PowerThresholdsKilowattsPerMetre = PowerThresholdsKilowattsPerMetre ?? defaults.PowerThresholdsKilowattsPerMetre,
            LowCoverageThreshold = LowCoverageThreshold ?? defaults.LowCoverageThreshold,
            AssumedSpectrum = AssumedSpectrum ?? defaults.AssumedSpectrum,
            HsBinning = HsBinning?.ToBinning(defaults.HsBinning) ?? defaults.HsBinning,
            PeriodBinning = PeriodBinning?.ToBinning(defaults.PeriodBinning) ?? defaults.PeriodBinning,
            PowerBinning = PowerBinning?.ToBinning(defaults.PowerBinning) ?? defaults.PowerBinning,
            SpreadBinning = SpreadBinning?.ToBinning(defaults.SpreadBinning) ?? defaults.SpreadBinning,
        };
    }
}

/// <summary>Histogram bins as configuration gives them; an unset value keeps the default's.</summary>
public sealed class BinningSettings
{
    public double? BinWidth { get; set; }
    public double? UpperBound { get; set; }

    public HistogramBinning ToBinning(HistogramBinning defaults) => new(BinWidth ?? defaults.BinWidth, UpperBound ?? defaults.UpperBound);
}
