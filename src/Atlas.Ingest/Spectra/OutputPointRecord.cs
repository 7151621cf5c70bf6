using Atlas.Ingest.Series;
using Atlas.Statistics.Spectral;

namespace Atlas.Ingest.Spectra;

/// <summary>
/// Everything stored for one output point, read and decoded once: its series and spectral values per step over every
/// usable year (a year whose chunk matches its time line), its monthly spectrum sums, and the axes and name from the
/// dataset's metadata. A point answer of a gridded dataset adds the nearest output point's values to every answer; with
/// the record in memory that costs arithmetic instead of three queries, their decoding and a JSON parse.
/// </summary>
public sealed class OutputPointRecord
{
    private readonly int[] _years;
    private readonly int[] _starts;

    internal OutputPointRecord(int cellId, string station, double[] frequencies, double[] directions, int[] years, int[] starts,
        PointSeries series, AlignedStationSteps steps, IReadOnlyList<MonthSpectrum> months)
    {
        CellId = cellId;
        Station = station;
        Frequencies = frequencies;
        Directions = directions;
        _years = years;
        _starts = starts;
        Series = series;
        Steps = steps;
        Months = months;
    }

    public int CellId { get; }

    public string Station { get; }

    public double[] Frequencies { get; }

    public double[] Directions { get; }

    /// <summary>The series over every usable year, in year order.</summary>
    public PointSeries Series { get; }

    /// <summary>The spectral values per step, aligned with <see cref="Series"/>.</summary>
    public AlignedStationSteps Steps { get; }

    public IReadOnlyList<MonthSpectrum> Months { get; }

    /// <summary>The bytes the record holds, roughly (for a bounded cache).</summary>
    public long Bytes => Series.Times.Length * (8L + 5 * 4 + SpectralProducts.Count * 4) + Months.Count * 8L * (Frequencies.Length + Directions.Length + 4) + 512;

    /// <summary>
    /// The steps of the usable years from <paramref name="firstYear"/> to <paramref name="lastYear"/> (either open): the
    /// range a read of those years' chunks decodes to. Empty when no usable year is inside.
    /// </summary>
    public Range StepsOf(int? firstYear, int? lastYear)
    {
        int from = 0, to = _years.Length;
        while (from < _years.Length && firstYear is { } f && _years[from] < f) from++;
        while (to > from && lastYear is { } l && _years[to - 1] > l) to--;
        return from >= to ? new Range(0, 0) : new Range(_starts[from], _starts[to]);
    }
}
