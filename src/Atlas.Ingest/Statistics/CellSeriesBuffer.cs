using Atlas.Statistics;
using Atlas.Storage.Series;
using System.Runtime.CompilerServices;

namespace Atlas.Ingest.Statistics;

/// <summary>
/// One cell's full series on the dataset time line, decoded from its yearly chunks into reusable arrays
/// (NaN where a year has no chunk or a step is missing).
/// </summary>
public sealed class CellSeriesBuffer
{
    private readonly float[][] _values;
    private readonly bool[] _present = new bool[SeriesCodec.VariableCount];
    // Per variable, the years whose steps a chunk has written; the other years of a present variable are made missing
    // once the cell is complete (rather than every value made missing first and most of them written again).
    private readonly HashSet<int>[] _written;
    private IReadOnlyDictionary<int, (int Offset, int Count)>? _yearOffsets;
    private readonly float[] _power;
    private bool _hasPower;

    public CellSeriesBuffer(int stepCount)
    {
        _values = new float[SeriesCodec.VariableCount][];
        for (var v = 0; v < _values.Length; v++) _values[v] = new float[stepCount];
        _written = [.. Enumerable.Range(0, SeriesCodec.VariableCount).Select(_ => new HashSet<int>())];
        _power = new float[stepCount];
    }

    public int CellId { get; private set; }
    public double DepthMetres { get; private set; }

    /// <summary>Empties the buffer for a cell: every step missing until its chunks are added.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void Begin(int cellId, double depthMetres)
    {
        CellId = cellId;
        DepthMetres = depthMetres;
        Array.Clear(_present);
        foreach (var years in _written) years.Clear();
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
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void Add(int year, ReadOnlySpan<byte> payload, IReadOnlyDictionary<int, (int Offset, int Count)> yearOffsets)
    {
        if (!yearOffsets.TryGetValue(year, out var place)) return;
        var steps = SeriesCodec.StepCountOf(payload);
        if (steps != place.Count)
            throw new InvalidDataException($"Cell {CellId}, year {year}: the chunk has {steps} steps but the year's time line has {place.Count}.");
        _yearOffsets = yearOffsets;
        // Only the variables the chunk holds are decoded: the others stay as they are until the cell is complete.
        for (var v = 0; v < SeriesCodec.VariableCount; v++)
            if (SeriesCodec.Has(payload, WaveParameterGroups.SeriesFields[v]))
            {
                SeriesCodec.Decode(payload, WaveParameterGroups.SeriesFields[v], _values[v].AsSpan(place.Offset, steps));
                _present[v] = true;
                _written[v].Add(year);
            }
    }

    /// <summary>
    /// Makes missing every step of a present variable in the years none of the cell's chunks wrote it (a year without
    /// a chunk, or whose chunk lacks the variable), so that the series reads NaN there. Hs is always read, so it counts as
    /// present. Called once the cell's last chunk is added.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void Complete()
    {
        var hs = WaveParameterGroups.SeriesIndex(WaveParameter.Hs);
        for (var v = 0; v < SeriesCodec.VariableCount; v++)
        {
            if (!_present[v] && v != hs) continue;
            if (_yearOffsets is null) { _values[v].AsSpan().Fill(float.NaN); continue; }
            foreach (var (year, place) in _yearOffsets)
                if (!_written[v].Contains(year)) _values[v].AsSpan(place.Offset, place.Count).Fill(float.NaN);
        }
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
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
