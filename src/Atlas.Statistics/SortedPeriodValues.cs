using System.Buffers;

namespace Atlas.Statistics;

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
    private readonly int[] _starts;
    private readonly int[] _counts;

    /// <summary>Rents room for the periods' runs; <paramref name="counts"/> gives the length of each.</summary>
    public SortedPeriodValues(int[] counts)
    {
        _counts = counts;
        _starts = new int[counts.Length];
        int total = 0;
        for (int p = 0; p < counts.Length; p++)
        {
            _starts[p] = total;
            total += counts[p];
        }
        _values = ArrayPool<double>.Shared.Rent(total);
    }

    /// <summary>The sorted values of a period (by its index among the window's periods).</summary>
    public ReadOnlySpan<double> Of(int period) => _values.AsSpan(_starts[period], _counts[period]);

    /// <summary>The whole array and where each period's run starts, for filling the runs.</summary>
    internal (double[] Values, int[] Starts) Runs => (_values, _starts);

    public void Dispose()
    {
        if (_values.Length > 0) ArrayPool<double>.Shared.Return(_values);
        _values = [];
    }
}
