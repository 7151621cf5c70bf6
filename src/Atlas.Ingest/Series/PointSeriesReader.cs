using System.Buffers;
using Atlas.Statistics;
using Atlas.Storage.Series;
using Atlas.WavePhysics;

namespace Atlas.Ingest.Series;

/// <summary>One cell's stored series over whole years, decoded onto the dataset's time lines (NaN = missing).</summary>
public sealed record PointSeries(long[] Times, float[] Hs, float[] Te, float[] Tp, float[] Dir, float[] Spread,
    bool HasTe, bool HasTp, bool HasDir, bool HasSpread, double DepthMetres)
{
    /// <summary>The series as the statistics library takes it: absent variables as empty spans.</summary>
    public CellSeries ToCellSeries() => new()
    {
        Times = Times,
        Hs = Hs,
        Te = HasTe ? Te : default,
        Tp = HasTp ? Tp : default,
        Dir = HasDir ? Dir : default,
        Spread = HasSpread ? Spread : default,
        DepthMetres = DepthMetres,
    };

    /// <summary>
    /// Te per step (the stored one, or from Tp for <paramref name="assumedSpectrum"/> when the dataset has only Tp, as
    /// the statistics assume: <see cref="StatisticsOptions.AssumedSpectrum"/>) and power per step from the group
    /// velocity at the cell depth.
    /// </summary>
    public (float[] Te, float[] Power, bool TeFromTp) Derived(SpectrumShape assumedSpectrum)
    {
        var te = Te;
        var fromTp = !HasTe && HasTp;
        if (fromTp)
        {
            te = new float[Tp.Length];
            PeriodConversion.EnergyPeriodFromPeakPeriod(Tp, te, assumedSpectrum);
        }
        var table = new GroupVelocityTable(DepthMetres);
        var power = new float[Hs.Length];
        for (var i = 0; i < power.Length; i++) power[i] = HasTe || fromTp ? (float)table.Power(Hs[i], te[i]) : float.NaN;
        return (te, power, fromTp);
    }
}

/// <summary>Decodes a cell's stored chunks (see <see cref="SeriesCodec"/>); years without a chunk or time line are left out.</summary>
public static class PointSeriesReader
{
    /// <summary>
    /// As <see cref="Decode"/>, into arrays rented from the shared pool (see <see cref="RentedPointSeries"/>); Hs is
    /// always decoded, as in <see cref="Decode"/>, and the other variables only when a chunk holds them.
    /// </summary>
    public static RentedPointSeries DecodeRented(IReadOnlyList<SeriesChunk> chunks, IReadOnlyDictionary<int, long[]> timelines, double depthMetres)
    {
        var (usable, total) = Usable(chunks, timelines);
        var times = ArrayPool<long>.Shared.Rent(total);
        var variables = new float[SeriesCodec.VariableCount][];
        for (var v = 0; v < variables.Length; v++)
        {
            var variable = WaveParameterGroups.SeriesFields[v];
            variables[v] = variable == WaveParameter.Hs || usable.Any(c => SeriesCodec.Has(c.Payload, variable)) ? ArrayPool<float>.Shared.Rent(total) : [];
        }
        var offset = 0;
        foreach (var chunk in usable)
        {
            var n = SeriesCodec.StepCountOf(chunk.Payload);
            timelines[chunk.Year].CopyTo(times, offset);
            for (var v = 0; v < variables.Length; v++)
                if (variables[v].Length > 0) SeriesCodec.Decode(chunk.Payload, WaveParameterGroups.SeriesFields[v], variables[v].AsSpan(offset, n));
            offset += n;
        }
        return new RentedPointSeries(times, variables, total, depthMetres > 0 ? depthMetres : double.NaN);
    }

    public static PointSeries Decode(IReadOnlyList<SeriesChunk> chunks, IReadOnlyDictionary<int, long[]> timelines, double depthMetres)
    {
        var (usable, total) = Usable(chunks, timelines);
        var times = new long[total];
        var hs = new float[total];
        var te = new float[total];
        var tp = new float[total];
        var dir = new float[total];
        var spread = new float[total];
        bool hasTe = false, hasTp = false, hasDir = false, hasSpread = false;
        var offset = 0;
        foreach (var chunk in usable)
        {
            var n = SeriesCodec.StepCountOf(chunk.Payload);
            timelines[chunk.Year].CopyTo(times, offset);
            SeriesCodec.Decode(chunk.Payload, WaveParameter.Hs, hs.AsSpan(offset, n));
            hasTe |= SeriesCodec.Decode(chunk.Payload, WaveParameter.Te, te.AsSpan(offset, n));
            hasTp |= SeriesCodec.Decode(chunk.Payload, WaveParameter.Tp, tp.AsSpan(offset, n));
            hasDir |= SeriesCodec.Decode(chunk.Payload, WaveParameter.Dir, dir.AsSpan(offset, n));
            hasSpread |= SeriesCodec.Decode(chunk.Payload, WaveParameter.Spread, spread.AsSpan(offset, n));
            offset += n;
        }
        var depth = depthMetres > 0 ? depthMetres : double.NaN;
        return new PointSeries(times, hs, te, tp, dir, spread, hasTe, hasTp, hasDir, hasSpread, depth);
    }

    private static (SeriesChunk[] Usable, int Steps) Usable(IReadOnlyList<SeriesChunk> chunks, IReadOnlyDictionary<int, long[]> timelines)
    {
        var usable = chunks.Where(c => timelines.TryGetValue(c.Year, out var t) && t.Length == SeriesCodec.StepCountOf(c.Payload)).ToArray();
        return (usable, usable.Sum(c => SeriesCodec.StepCountOf(c.Payload)));
    }
}
