using Atlas.Storage.Series;
using Atlas.WavePhysics;

namespace Atlas.Api.Points;

/// <summary>One cell's series over whole years, decoded, with power per step.</summary>
public sealed record PointSeries(long[] Times, float[] Hs, float[] Te, float[] Tp, float[] Dir, float[] Spread, float[] Power,
    bool EnergyPeriodFromPeak, bool HasTe, bool HasTp, bool HasDir, bool HasSpread);

/// <summary>
/// Decodes a cell's stored chunks onto the dataset's time lines. Years without a chunk are left out. Te is the
/// stored one when the dataset has it; otherwise it is 0.9 Tp (JONSWAP, gamma 3.3; common practice) and the series
/// says so. Power per step comes from the group velocity at the cell depth (deep water when the depth is unknown).
/// </summary>
public static class PointSeriesReader
{
    public static PointSeries Decode(IReadOnlyList<SeriesChunk> chunks, IReadOnlyDictionary<int, long[]> timelines, double depthMetres)
    {
        var usable = chunks.Where(c => timelines.TryGetValue(c.Year, out var t) && t.Length == SeriesCodec.StepCountOf(c.Payload)).ToArray();
        var total = usable.Sum(c => SeriesCodec.StepCountOf(c.Payload));
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
            SeriesCodec.Decode(chunk.Payload, SeriesVariable.Hs, hs.AsSpan(offset, n));
            hasTe |= SeriesCodec.Decode(chunk.Payload, SeriesVariable.Te, te.AsSpan(offset, n));
            hasTp |= SeriesCodec.Decode(chunk.Payload, SeriesVariable.Tp, tp.AsSpan(offset, n));
            hasDir |= SeriesCodec.Decode(chunk.Payload, SeriesVariable.Dir, dir.AsSpan(offset, n));
            hasSpread |= SeriesCodec.Decode(chunk.Payload, SeriesVariable.Spread, spread.AsSpan(offset, n));
            offset += n;
        }
        var fromPeak = !hasTe && hasTp;
        if (fromPeak) PeriodConversion.EnergyPeriodFromPeakPeriod(tp, te);
        var table = new GroupVelocityTable(depthMetres is > 0 ? depthMetres : double.NaN);
        var power = new float[total];
        for (var i = 0; i < total; i++) power[i] = (float)table.Power(hs[i], te[i]);
        return new PointSeries(times, hs, te, tp, dir, spread, power, fromPeak, hasTe || fromPeak, hasTp, hasDir, hasSpread);
    }
}
