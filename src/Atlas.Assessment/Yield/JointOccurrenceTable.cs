namespace Atlas.Assessment.Yield;

/// <summary>
/// Joint occurrence of Hs and a wave period: counts or fractions per bin, identified by bin centres
/// (e.g. the 0.5 m by 1 s table of IEC TS 62600-101). Occurrences are normalised by their sum.
/// </summary>
public sealed class JointOccurrenceTable
{
    private readonly double[] _hs;
    private readonly double[] _period;
    private readonly double[,] _occurrence;

    /// <summary>Creates a table.</summary>
    /// <param name="periodKind">The period of the columns; must match the power matrix it is combined with.</param>
    /// <param name="hsCentresMetres">Hs bin centres (rows).</param>
    /// <param name="periodCentresSeconds">Period bin centres (columns).</param>
    /// <param name="occurrence">Counts or fractions, [Hs index, period index], finite and at or above 0, with a positive sum.</param>
    /// <exception cref="ArgumentException">Shapes disagree, a value is negative or not finite, or every value is 0.</exception>
    public JointOccurrenceTable(WavePeriodKind periodKind, ReadOnlySpan<double> hsCentresMetres, ReadOnlySpan<double> periodCentresSeconds, double[,] occurrence)
    {
        ArgumentNullException.ThrowIfNull(occurrence);
        if (occurrence.GetLength(0) != hsCentresMetres.Length || occurrence.GetLength(1) != periodCentresSeconds.Length)
            throw new ArgumentException(
                $"The table is {occurrence.GetLength(0)} x {occurrence.GetLength(1)} but has {hsCentresMetres.Length} Hs and {periodCentresSeconds.Length} period bins.",
                nameof(occurrence));
        double total = 0;
        foreach (double value in occurrence)
        {
            if (!double.IsFinite(value) || value < 0)
                throw new ArgumentException($"Occurrence {value} is not a finite number at or above 0.", nameof(occurrence));
            total += value;
        }
        if (total == 0)
            throw new ArgumentException("Every occurrence is 0: the table describes no sea states.", nameof(occurrence));
        PeriodKind = periodKind;
        _hs = hsCentresMetres.ToArray();
        _period = periodCentresSeconds.ToArray();
        _occurrence = (double[,])occurrence.Clone();
        Total = total;
    }

    /// <summary>The period of the columns.</summary>
    public WavePeriodKind PeriodKind { get; }

    /// <summary>Hs bin centres, m.</summary>
    public IReadOnlyList<double> HsCentresMetres => _hs;

    /// <summary>Period bin centres, s.</summary>
    public IReadOnlyList<double> PeriodCentresSeconds => _period;

    /// <summary>Sum of all occurrences as given.</summary>
    public double Total { get; }

    /// <summary>Occurrence of one bin as given.</summary>
    public double OccurrenceAt(int hsIndex, int periodIndex) => _occurrence[hsIndex, periodIndex];
}
