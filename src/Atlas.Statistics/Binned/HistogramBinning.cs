namespace Atlas.Statistics.Binned;

/// <summary>
/// The fixed bins of a histogram: equal bins of <see cref="BinWidth"/> from 0 to <see cref="UpperBound"/>, and one
/// overflow bin for everything at or above the upper bound. Percentiles from it are within one bin width of the
/// exact ones below the upper bound (see <see cref="FixedBinHistogram"/>).
/// </summary>
/// <param name="BinWidth">Bin width in the parameter's unit, positive.</param>
/// <param name="UpperBound">Upper end of the equal bins, a whole number of bin widths above 0.</param>
public sealed record HistogramBinning(double BinWidth, double UpperBound)
{
    /// <summary>Hs: 0.01 m bins up to 30 m.</summary>
    public static HistogramBinning DefaultHs { get; } = new(0.01, 30);

    /// <summary>Te and Tp: 0.01 s bins up to 40 s.</summary>
    public static HistogramBinning DefaultPeriod { get; } = new(0.01, 40);

    /// <summary>J: 0.1 kW/m bins up to 4000 kW/m.</summary>
    public static HistogramBinning DefaultPower { get; } = new(0.1, 4000);

    /// <summary>Directional spread: 0.1 degree bins up to 180 degrees.</summary>
    public static HistogramBinning DefaultSpread { get; } = new(0.1, 180);

    /// <summary>Number of equal bins below the upper bound.</summary>
    public int EqualBinCount => (int)Math.Round(UpperBound / BinWidth);

    /// <summary>Throws when the binning is not usable.</summary>
    /// <exception cref="ArgumentException">The width is not positive, the bound not a whole number of widths, or the bins too many.</exception>
    public void Validate(string name)
    {
        if (!(BinWidth > 0) || !double.IsFinite(BinWidth))
            throw new ArgumentException($"{name}: bin width {BinWidth} must be positive and finite.", name);
        if (!(UpperBound > 0) || !double.IsFinite(UpperBound))
            throw new ArgumentException($"{name}: upper bound {UpperBound} must be positive and finite.", name);
        double bins = UpperBound / BinWidth;
        if (Math.Abs(bins - Math.Round(bins)) > 1e-6 * bins)
            throw new ArgumentException($"{name}: upper bound {UpperBound} is not a whole number of bins of {BinWidth}.", name);
        if (bins > 10_000_000)
            throw new ArgumentException($"{name}: {bins:F0} bins are too many (at most 10 million).", name);
    }
}
