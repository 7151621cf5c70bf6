using System.Buffers;

namespace Atlas.Statistics.Exact;

/// <summary>
/// One parameter's valid values inside the analysis window, sorted, once per period they belong to: the periods'
/// runs lie one after another in a single array rented from the shared pool, given back on <see cref="Dispose"/>.
/// </summary>
/// <remarks>
/// A point request over decades of hourly steps holds several megabytes of sorted values per parameter for a few
/// milliseconds; renting them instead of allocating spares the large-object heap a collection per request.
/// </remarks>
internal sealed class SortedPeriodValues : IDisposable
{
    private double[] _values;
    private byte[] _months;
    private readonly int[] _starts;
    private readonly int[] _counts;
    private readonly long[] _monthCounts;

    /// <summary>Rents room for the periods' runs; <paramref name="counts"/> gives the length of each, <paramref name="monthCounts"/> the valid values of each calendar month in each (12 per period).</summary>
    public SortedPeriodValues(int[] counts, long[] monthCounts)
    {
        _counts = counts;
        _monthCounts = monthCounts;
        _starts = new int[counts.Length];
        int total = 0;
        for (int p = 0; p < counts.Length; p++)
        {
            _starts[p] = total;
            total += counts[p];
        }
        _values = ArrayPool<double>.Shared.Rent(total);
        _months = ArrayPool<byte>.Shared.Rent(total);
    }

    /// <summary>The sorted values of a period (by its index among the window's periods).</summary>
    public ReadOnlySpan<double> Of(int period) => _values.AsSpan(_starts[period], _counts[period]);

    /// <summary>The sorted values of a period as memory (valid until <see cref="Dispose"/>).</summary>
    public ReadOnlyMemory<double> MemoryOf(int period) => _values.AsMemory(_starts[period], _counts[period]);

    /// <summary>The calendar month (0 = January) of each value of a season's or the annual run (unset for the others).</summary>
    public ReadOnlySpan<byte> MonthsOf(int period) => _months.AsSpan(_starts[period], _counts[period]);

    /// <summary>Valid values of each calendar month (index 0 = January) in a period.</summary>
    public ReadOnlySpan<long> MonthCountsOf(int period) => _monthCounts.AsSpan(period * 12, 12);

    /// <summary>The whole arrays and where each period's run starts, for filling the runs.</summary>
    internal (double[] Values, byte[] Months, int[] Starts) Runs => (_values, _months, _starts);

    public void Dispose()
    {
        if (_values.Length > 0) ArrayPool<double>.Shared.Return(_values);
        if (_months.Length > 0) ArrayPool<byte>.Shared.Return(_months);
        _values = [];
        _months = [];
    }
}
