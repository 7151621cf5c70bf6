using Atlas.Statistics;
using Atlas.Storage.Series;

namespace Atlas.Ingest.Statistics;

/// <summary>
/// One cell's full series on the dataset time line, decoded from its yearly chunks into reusable arrays
/// (NaN where a year has no chunk or a step is missing).
/// </summary>
public sealed class CellSeriesBuffer
{
    private readonly float[][] _values;
    private readonly bool[] _present = new bool[SeriesCodec.VariableCount];
    private readonly float[] _power;
    private bool _hasPower;

    public CellSeriesBuffer(int stepCount)
    {
        _values = new float[SeriesCodec.VariableCount][];
        for (var v = 0; v < _values.Length; v++) _values[v] = new float[stepCount];
        _power = new float[stepCount];
    }

    public int CellId { get; private set; }
    public double DepthMetres { get; private set; }

    /// <summary>Empties the buffer for a cell: every step missing until its chunks are added.</summary>
    public void Begin(int cellId, double depthMetres)
    {
        CellId = cellId;
        DepthMetres = depthMetres;
        Array.Clear(_present);
        foreach (var values in _values) values.AsSpan().Fill(float.NaN);
        _hasPower = false;
    }

    /// <summary>
    /// Places one year of power integrated from an output point's spectra (aligned with the year's time line): the cell's
    /// power is then this rather than the one derived from Hs and Te. Steps of years without it stay missing.
    /// </summary>
    public void AddPower(int year, ReadOnlySpan<float> power, IReadOnlyDictionary<int, (int Offset, int Count)> yearOffsets)
    {
        if (!yearOffsets.TryGetValue(year, out var place) || power.Length != place.Count) return;
        if (!_hasPower) _power.AsSpan().Fill(float.NaN);
        power.CopyTo(_power.AsSpan(place.Offset, place.Count));
        _hasPower = true;
    }

    /// <summary>
    /// Decodes one chunk of the cell into its place on the time line; <paramref name="yearOffsets"/> gives each year's
    /// first step and step count. A year outside the time line is ignored.
    /// </summary>
    public void Add(int year, ReadOnlySpan<byte> payload, IReadOnlyDictionary<int, (int Offset, int Count)> yearOffsets)
    {
        if (!yearOffsets.TryGetValue(year, out var place)) return;
        var steps = SeriesCodec.StepCountOf(payload);
        if (steps != place.Count)
            throw new InvalidDataException($"Cell {CellId}, year {year}: the chunk has {steps} steps but the year's time line has {place.Count}.");
        for (var v = 0; v < SeriesCodec.VariableCount; v++)
            if (SeriesCodec.Decode(payload, WaveParameterGroups.SeriesFields[v], _values[v].AsSpan(place.Offset, steps)))
                _present[v] = true;
    }

    public CellSeries AsSeries(long[] times) => new()
    {
        Times = times,
        Hs = _values[WaveParameterGroups.SeriesIndex(WaveParameter.Hs)],
        Te = Present(WaveParameter.Te),
        Tp = Present(WaveParameter.Tp),
        Dir = Present(WaveParameter.Dir),
        Spread = Present(WaveParameter.Spread),
        Power = _hasPower ? _power : ReadOnlySpan<float>.Empty,
        DepthMetres = UsableDepth(DepthMetres),
    };

    /// <summary>A variable's values, or empty when no chunk of the cell holds it.</summary>
    private ReadOnlySpan<float> Present(WaveParameter variable)
    {
        int k = WaveParameterGroups.SeriesIndex(variable);
        return _present[k] ? _values[k] : ReadOnlySpan<float>.Empty;
    }

    private static double UsableDepth(double depth) => depth > 0 ? depth : double.NaN;
}
