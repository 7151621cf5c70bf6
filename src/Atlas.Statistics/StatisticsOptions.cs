using Atlas.WavePhysics;

namespace Atlas.Statistics;

/// <summary>Settings of the statistics pass; the defaults are those the atlas publishes in its download metadata.</summary>
public sealed record StatisticsOptions
{
    /// <summary>Default coverage below which a period is flagged.</summary>
    public const double DefaultLowCoverageThreshold = 0.8;

    /// <summary>Thresholds for the Hs exceedance fractions, m (default 1, 2, 3, 4, 5).</summary>
    public IReadOnlyList<double> HsThresholdsMetres { get; init; } = [1, 2, 3, 4, 5];

    /// <summary>Thresholds for the power exceedance fractions, kW/m (default 5, 10, 20, 30, 50, 75, 100).</summary>
    public IReadOnlyList<double> PowerThresholdsKilowattsPerMetre { get; init; } = [5, 10, 20, 30, 50, 75, 100];

    /// <summary>Coverage (valid over expected steps) below which a period is flagged; default 0.8.</summary>
    public double LowCoverageThreshold { get; init; } = DefaultLowCoverageThreshold;

    /// <summary>Spectrum assumed to derive Te from Tp when the dataset has no Te (default JONSWAP gamma 3.3: Te = 0.9 Tp).</summary>
    public SpectrumShape AssumedSpectrum { get; init; } = SpectrumShape.JonswapGamma33;

    /// <summary>Histogram bins for Hs percentiles in the layer pass.</summary>
    public HistogramBinning HsBinning { get; init; } = HistogramBinning.DefaultHs;

    /// <summary>Histogram bins for Te and Tp percentiles in the layer pass.</summary>
    public HistogramBinning PeriodBinning { get; init; } = HistogramBinning.DefaultPeriod;

    /// <summary>Histogram bins for J percentiles in the layer pass.</summary>
    public HistogramBinning PowerBinning { get; init; } = HistogramBinning.DefaultPower;

    /// <summary>Histogram bins for spread percentiles in the layer pass.</summary>
    public HistogramBinning SpreadBinning { get; init; } = HistogramBinning.DefaultSpread;

    /// <summary>The bins used for a parameter's percentiles.</summary>
    /// <exception cref="ArgumentException">dir, d and depth have no histogram (d of a period is one value, from its mean resolved power).</exception>
    public HistogramBinning BinningFor(WaveParameter parameter) => parameter switch
    {
        WaveParameter.Hs => HsBinning,
        WaveParameter.Te or WaveParameter.Tp => PeriodBinning,
        WaveParameter.J => PowerBinning,
        WaveParameter.Spread => SpreadBinning,
        _ => throw new ArgumentException($"Parameter '{parameter.Symbol()}' has no histogram.", nameof(parameter)),
    };

    /// <summary>Throws when a setting is not usable, naming it.</summary>
    public void Validate()
    {
        CheckThresholds(HsThresholdsMetres, nameof(HsThresholdsMetres));
        CheckThresholds(PowerThresholdsKilowattsPerMetre, nameof(PowerThresholdsKilowattsPerMetre));
        if (!(LowCoverageThreshold >= 0 && LowCoverageThreshold <= 1))
            throw new ArgumentException($"{nameof(LowCoverageThreshold)} is {LowCoverageThreshold}; it must be between 0 and 1.", nameof(LowCoverageThreshold));
        PeriodConversion.EnergyToPeakPeriodRatio(AssumedSpectrum);
        HsBinning.Validate(nameof(HsBinning));
        PeriodBinning.Validate(nameof(PeriodBinning));
        PowerBinning.Validate(nameof(PowerBinning));
        SpreadBinning.Validate(nameof(SpreadBinning));
    }

    private static void CheckThresholds(IReadOnlyList<double> thresholds, string name)
    {
        ArgumentNullException.ThrowIfNull(thresholds, name);
        for (int i = 0; i < thresholds.Count; i++)
        {
            if (!double.IsFinite(thresholds[i]))
                throw new ArgumentException($"{name}[{i}] is {thresholds[i]}; thresholds must be finite.", name);
            if (i > 0 && !(thresholds[i] > thresholds[i - 1]))
                throw new ArgumentException($"{name} must increase: {thresholds[i - 1]} is followed by {thresholds[i]}.", name);
        }
    }
}
