namespace Atlas.Assessment.Yield;

/// <summary>
/// A device's power matrix: electrical power in kW at bin centres of Hs (rows) and of a wave period
/// (columns, Te or Tp).
/// </summary>
/// <remarks>
/// The matrix covers, on each axis, the bins around its centres: edges lie halfway between
/// neighbouring centres and the outer edges half a bin width beyond the outer centres. A sea state
/// outside that range on either axis is "outside the matrix" and produces 0 kW (the device is
/// assumed idle or in survival mode); callers count such steps rather than hide them.
/// </remarks>
public sealed class PowerMatrix
{
    private readonly double[] _hs;
    private readonly double[] _period;
    private readonly double[,] _power;

    /// <summary>Creates a matrix, checking it.</summary>
    /// <param name="name">Name for messages and reports.</param>
    /// <param name="periodKind">The period of the columns.</param>
    /// <param name="hsCentresMetres">Hs bin centres, strictly increasing, at least two, at or above 0.</param>
    /// <param name="periodCentresSeconds">Period bin centres, strictly increasing, at least two, above 0.</param>
    /// <param name="powerKw">Power, [Hs index, period index], finite and at or above 0, not all 0.</param>
    /// <param name="ratedPowerKw">Rated power; defaults to the largest matrix value and may not be below it.</param>
    /// <exception cref="ArgumentException">Any of the conditions above fails.</exception>
    public PowerMatrix(string name, WavePeriodKind periodKind, ReadOnlySpan<double> hsCentresMetres, ReadOnlySpan<double> periodCentresSeconds,
        double[,] powerKw, double? ratedPowerKw = null)
    {
        ArgumentNullException.ThrowIfNull(powerKw);
        RequireBins(hsCentresMetres, "Hs", 0, allowLowerBound: true, nameof(hsCentresMetres));
        RequireBins(periodCentresSeconds, "period", 0, allowLowerBound: false, nameof(periodCentresSeconds));
        if (powerKw.GetLength(0) != hsCentresMetres.Length || powerKw.GetLength(1) != periodCentresSeconds.Length)
            throw new ArgumentException(
                $"Power matrix '{name}' is {powerKw.GetLength(0)} x {powerKw.GetLength(1)} but has {hsCentresMetres.Length} Hs and {periodCentresSeconds.Length} period bins.",
                nameof(powerKw));
        double maximum = 0;
        foreach (double value in powerKw)
        {
            if (!double.IsFinite(value) || value < 0)
                throw new ArgumentException($"Power matrix '{name}' holds {value} kW; power must be a finite number at or above 0.", nameof(powerKw));
            maximum = Math.Max(maximum, value);
        }
        if (maximum == 0)
            throw new ArgumentException($"Power matrix '{name}' is 0 kW everywhere: the device would never produce.", nameof(powerKw));
        if (ratedPowerKw is { } rated && (!double.IsFinite(rated) || rated < maximum))
            throw new ArgumentOutOfRangeException(nameof(ratedPowerKw), rated,
                $"The rated power of '{name}' must be at least the largest matrix value, {maximum} kW.");

        Name = name;
        PeriodKind = periodKind;
        _hs = hsCentresMetres.ToArray();
        _period = periodCentresSeconds.ToArray();
        _power = (double[,])powerKw.Clone();
        MaximumPowerKw = maximum;
        RatedPowerKw = ratedPowerKw ?? maximum;
    }

    /// <summary>Name of the matrix (typically the device and file).</summary>
    public string Name { get; }

    /// <summary>The period of the columns.</summary>
    public WavePeriodKind PeriodKind { get; }

    /// <summary>Hs bin centres, m.</summary>
    public IReadOnlyList<double> HsCentresMetres => _hs;

    /// <summary>Period bin centres, s.</summary>
    public IReadOnlyList<double> PeriodCentresSeconds => _period;

    /// <summary>Rated power, kW: as given, or the largest matrix value.</summary>
    public double RatedPowerKw { get; }

    /// <summary>The largest matrix value, kW.</summary>
    public double MaximumPowerKw { get; }

    /// <summary>Power at one bin, kW.</summary>
    public double PowerAtBinKw(int hsIndex, int periodIndex) => _power[hsIndex, periodIndex];

    /// <summary>Lower edge of the Hs range covered, m.</summary>
    public double HsLowerEdgeMetres => LowerEdge(_hs);

    /// <summary>Upper edge of the Hs range covered, m.</summary>
    public double HsUpperEdgeMetres => UpperEdge(_hs);

    /// <summary>Lower edge of the period range covered, s.</summary>
    public double PeriodLowerEdgeSeconds => LowerEdge(_period);

    /// <summary>Upper edge of the period range covered, s.</summary>
    public double PeriodUpperEdgeSeconds => UpperEdge(_period);

    /// <summary>True when the sea state lies within the matrix range on both axes (edges included).</summary>
    public bool Contains(double hsMetres, double periodSeconds) =>
        hsMetres >= HsLowerEdgeMetres && hsMetres <= HsUpperEdgeMetres &&
        periodSeconds >= PeriodLowerEdgeSeconds && periodSeconds <= PeriodUpperEdgeSeconds;

    /// <summary>
    /// Power for a sea state, kW: NaN when either input is NaN, 0 outside the matrix, otherwise read
    /// by <paramref name="interpolation"/>.
    /// </summary>
    public double PowerKw(double hsMetres, double periodSeconds, PowerMatrixInterpolation interpolation)
    {
        if (double.IsNaN(hsMetres) || double.IsNaN(periodSeconds))
            return double.NaN;
        if (!Contains(hsMetres, periodSeconds))
            return 0.0;
        if (interpolation == PowerMatrixInterpolation.NearestBin)
            return _power[BinOf(_hs, hsMetres), BinOf(_period, periodSeconds)];

        var (i, wi) = Bracket(_hs, hsMetres);
        var (j, wj) = Bracket(_period, periodSeconds);
        int i1 = Math.Min(i + 1, _hs.Length - 1), j1 = Math.Min(j + 1, _period.Length - 1);
        return (1 - wi) * ((1 - wj) * _power[i, j] + wj * _power[i, j1])
             + wi * ((1 - wj) * _power[i1, j] + wj * _power[i1, j1]);
    }

    private static double LowerEdge(double[] centres) => centres[0] - 0.5 * (centres[1] - centres[0]);

    private static double UpperEdge(double[] centres) => centres[^1] + 0.5 * (centres[^1] - centres[^2]);

    /// <summary>Index of the bin containing x (edges halfway between centres; an edge goes to the upper bin).</summary>
    private static int BinOf(double[] centres, double x)
    {
        int bin = 0;
        while (bin + 1 < centres.Length && x >= 0.5 * (centres[bin] + centres[bin + 1]))
            bin++;
        return bin;
    }

    /// <summary>Lower centre index and weight of the upper one, with x held within the outer centres.</summary>
    private static (int Index, double Weight) Bracket(double[] centres, double x)
    {
        if (x <= centres[0]) return (0, 0.0);
        if (x >= centres[^1]) return (centres.Length - 1, 0.0);
        int found = Array.BinarySearch(centres, x);
        if (found >= 0) return (found, 0.0);
        int lower = ~found - 1;
        return (lower, (x - centres[lower]) / (centres[lower + 1] - centres[lower]));
    }

    private static void RequireBins(ReadOnlySpan<double> centres, string axis, double bound, bool allowLowerBound, string parameter)
    {
        if (centres.Length < 2)
            throw new ArgumentException($"The {axis} axis needs at least two bin centres to fix the bin widths; got {centres.Length}.", parameter);
        for (int i = 0; i < centres.Length; i++)
        {
            double c = centres[i];
            if (!double.IsFinite(c) || c < bound || (!allowLowerBound && c == bound))
                throw new ArgumentException($"{axis} bin centre {c} is out of range.", parameter);
            if (i > 0 && !(c > centres[i - 1]))
                throw new ArgumentException($"{axis} bin centres must strictly increase; {c} follows {centres[i - 1]}.", parameter);
        }
    }
}
