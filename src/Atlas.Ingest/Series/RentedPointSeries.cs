using System.Buffers;
using Atlas.Statistics;
using Atlas.Storage.Series;

namespace Atlas.Ingest.Series;

/// <summary>
/// A cell's stored series decoded into arrays rented from the shared pool, for a request that needs them only while
/// it computes (the point statistics): decades of hourly steps fill megabytes, which would otherwise be allocated on
/// the large-object heap, and collected, on every request. A variable that no chunk holds is left out (empty).
/// The arrays go back to the pool on <see cref="Dispose"/>; the series must not be used afterwards.
/// </summary>
public sealed class RentedPointSeries : IDisposable
{
    private long[] _times;
    private readonly float[][] _variables;
    private readonly int _length;

    internal RentedPointSeries(long[] times, float[][] variables, int length, double depthMetres)
    {
        _times = times;
        _variables = variables;
        _length = length;
        DepthMetres = depthMetres;
    }

    public ReadOnlySpan<long> Times => _times.AsSpan(0, _length);

    public double DepthMetres { get; }

    /// <summary>The values of a variable; empty when no chunk holds it.</summary>
    public ReadOnlySpan<float> Values(WaveParameter variable) => WaveParameterGroups.SeriesIndex(variable) is >= 0 and var k && _variables[k] is { Length: > 0 } v ? v.AsSpan(0, _length) : [];

    /// <summary>The series as the statistics library takes it: absent variables as empty spans.</summary>
    public CellSeries ToCellSeries() => new()
    {
        Times = Times,
        Hs = Values(WaveParameter.Hs),
        Te = Values(WaveParameter.Te),
        Tp = Values(WaveParameter.Tp),
        Dir = Values(WaveParameter.Dir),
        Spread = Values(WaveParameter.Spread),
        DepthMetres = DepthMetres,
    };

    public void Dispose()
    {
        if (_times.Length > 0) ArrayPool<long>.Shared.Return(_times);
        _times = [];
        for (var v = 0; v < _variables.Length; v++)
        {
            if (_variables[v].Length > 0) ArrayPool<float>.Shared.Return(_variables[v]);
            _variables[v] = [];
        }
    }
}
