using System.Buffers;
using Atlas.WavePhysics;
using System.Runtime.CompilerServices;

namespace Atlas.Statistics.Series;

/// <summary>The series computed from a cell's stored ones: Te (given or from Tp) and power per step.</summary>
internal readonly ref struct DerivedSeries
{
    public ReadOnlySpan<float> Te { get; init; }
    public ReadOnlySpan<float> Power { get; init; }
    public EnergyPeriodSource EnergyPeriodSource { get; init; }
    public bool DeepWaterAssumed { get; init; }
}

/// <summary>
/// Reusable buffers that turn a <see cref="CellSeries"/> into its <see cref="DerivedSeries"/>; one per worker, no
/// allocation once the buffers have grown to the timeline's length. Built with a pool, the buffers are rented from
/// it and given back on <see cref="Dispose"/> (for a single analysis, which would otherwise allocate them each time).
/// </summary>
internal sealed class DerivedSeriesBuffers(ArrayPool<float>? pool = null) : IDisposable
{
    private float[] _te = [];
    private float[] _power = [];

    /// <summary>
    /// Te is the dataset's when it has any valid step; otherwise ratio x Tp when Tp is given (the ratio of
    /// <see cref="StatisticsOptions.AssumedSpectrum"/>); otherwise unavailable. A step with Te present but missing stays
    /// missing (Te and Tp are never mixed within one series). Power needs Hs and Te at the step and uses the group
    /// velocity at the cell depth, deep water when the depth is unknown; a power given with the series (integrated from
    /// a spectrum) is used as it is.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public DerivedSeries Derive(in CellSeries series, StatisticsOptions options)
    {
        int n = series.Times.Length;
        Grow(ref _te, n);
        Grow(ref _power, n);

        ReadOnlySpan<float> te;
        EnergyPeriodSource source;
        if (HasValidStep(series.Te))
        {
            te = series.Te;
            source = EnergyPeriodSource.Provided;
        }
        else if (series.Tp.Length == n && n > 0)
        {
            PeriodConversion.EnergyPeriodFromPeakPeriod(series.Tp, _te.AsSpan(0, n), options.AssumedSpectrum);
            te = _te.AsSpan(0, n);
            source = EnergyPeriodSource.DerivedFromPeakPeriod;
        }
        else
        {
            te = [];
            source = EnergyPeriodSource.Unavailable;
        }

        ReadOnlySpan<float> power = [];
        if (series.Power.Length == n && n > 0) power = series.Power;
        else if (te.Length == n && n > 0)
        {
            WavePower.OmnidirectionalPower(series.Hs, te, new GroupVelocityTable(series.DepthMetres), _power.AsSpan(0, n));
            power = _power.AsSpan(0, n);
        }

        return new DerivedSeries
        {
            Te = te,
            Power = power,
            EnergyPeriodSource = source,
            DeepWaterAssumed = DispersionRelation.IsDeepWater(series.DepthMetres),
        };
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static bool HasValidStep(ReadOnlySpan<float> values)
    {
        foreach (float v in values)
            if (ParameterValidity.IsValid(WaveParameter.Te, v)) return true;
        return false;
    }

    private void Grow(ref float[] buffer, int length)
    {
        if (buffer.Length >= length) return;
        Return(buffer);
        buffer = pool?.Rent(length) ?? new float[length];
    }

    private void Return(float[] buffer)
    {
        if (pool is not null && buffer.Length > 0) pool.Return(buffer);
    }

    public void Dispose()
    {
        Return(_te);
        Return(_power);
        _te = _power = [];
    }
}
