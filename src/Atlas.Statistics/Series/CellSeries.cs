namespace Atlas.Statistics.Series;

/// <summary>
/// The full series of one cell (or point) on the dataset's timeline, as spans over the caller's buffers.
/// </summary>
/// <remarks>
/// <see cref="Times"/> is the dataset's timeline in Unix seconds (UTC), the same for every cell. Every series
/// given has one value per time; NaN marks a missing step (fill value, dry cell, gap). <see cref="Hs"/> is required.
/// <see cref="Te"/> may be empty or all NaN when the dataset has no energy period: it is then derived from
/// <see cref="Tp"/> with the ratio of <see cref="StatisticsOptions.AssumedSpectrum"/>. <see cref="Tp"/>,
/// <see cref="Dir"/> and <see cref="Spread"/> may be empty (absent). A NaN <see cref="DepthMetres"/> means the depth
/// is unknown and the cell is treated as deep water.
/// </remarks>
public readonly ref struct CellSeries
{
    /// <summary>Time of each step, Unix seconds UTC.</summary>
    public ReadOnlySpan<long> Times { get; init; }

    /// <summary>Hm0 per step, m.</summary>
    public ReadOnlySpan<float> Hs { get; init; }

    /// <summary>Te per step, s; empty or all NaN when absent.</summary>
    public ReadOnlySpan<float> Te { get; init; }

    /// <summary>Tp per step, s; empty when absent.</summary>
    public ReadOnlySpan<float> Tp { get; init; }

    /// <summary>Mean direction the waves come from per step, degrees true; empty when absent.</summary>
    public ReadOnlySpan<float> Dir { get; init; }

    /// <summary>Directional spread per step, degrees; empty when absent.</summary>
    public ReadOnlySpan<float> Spread { get; init; }

    /// <summary>
    /// Power per step integrated from the spectrum, kW/m (an output point of a spectral hindcast); empty for a cell of
    /// gridded fields, whose power is derived from Hs and Te at the cell depth. When given it is used as the power.
    /// </summary>
    public ReadOnlySpan<float> Power { get; init; }

    /// <summary>Cell depth, m (positive down); NaN when unknown, which means deep water.</summary>
    public double DepthMetres { get; init; }

    /// <summary>Throws when a series given has a different length from <see cref="Times"/> or the depth is not usable.</summary>
    /// <exception cref="ArgumentException">A series length or the depth is wrong; the message names the field.</exception>
    public void Validate()
    {
        int n = Times.Length;
        if (Hs.Length != n)
            throw new ArgumentException($"CellSeries.Hs has {Hs.Length} steps but Times has {n}.", "series");
        CheckOptional(Te.Length, n, nameof(Te));
        CheckOptional(Tp.Length, n, nameof(Tp));
        CheckOptional(Dir.Length, n, nameof(Dir));
        CheckOptional(Spread.Length, n, nameof(Spread));
        CheckOptional(Power.Length, n, nameof(Power));
        double depth = DepthMetres;
        if (!double.IsNaN(depth) && !double.IsPositiveInfinity(depth) && !(depth > 0))
            throw new ArgumentException($"CellSeries.DepthMetres is {depth}; a depth must be positive (m), or NaN when unknown.", "series");
    }

    private static void CheckOptional(int length, int n, string name)
    {
        if (length != 0 && length != n)
            throw new ArgumentException($"CellSeries.{name} has {length} steps but Times has {n} (give all of them, or none when the variable is absent).", "series");
    }
}
