using System.Buffers.Binary;
using System.Runtime.CompilerServices;
using Atlas.Hindcast;
using Atlas.Storage.Series;

namespace Atlas.Ingest.Ingestion;

/// <summary>
/// The buffers of one block of cells in one year: every cell's packed series (<see cref="SeriesCodec"/>) side by side in
/// one array, and whether the cell has a wave height. A block is reused for every block of every year of an ingest,
/// so the ingest allocates its buffers once instead of once per block (two blocks take turns: one is filled while the
/// other's COPY runs).
/// </summary>
public sealed class CellBlock
{
    private readonly byte[] _payloads;
    private readonly bool[] _candidate;
    private bool[] _hasHs = [];
    private ushort[] _tile = [];   // a tile's quantised values, [step][cell], reused by every scatter of the block

    /// <param name="capacityBytes">The most bytes a block of the ingest holds (<see cref="YearPlan.BlockBytes"/>, largest over the years).</param>
    /// <param name="candidate">Per grid point: may it be a sea cell? Values elsewhere are neither checked nor stored.</param>
    public CellBlock(long capacityBytes, bool[] candidate)
    {
        _payloads = GC.AllocateUninitializedArray<byte>(checked((int)capacityBytes));
        _candidate = candidate;
    }

    public int Year { get; private set; }
    public int FirstCell { get; private set; }
    public int Count { get; private set; }
    public int StepCount { get; private set; }
    public int Mask { get; private set; }
    public int BytesPerCell { get; private set; }

    /// <summary>Makes the block ready for cells <paramref name="firstCell"/>.. of a year: every value missing, no wave height.</summary>
    public void Begin(int year, int firstCell, int count, int stepCount, int mask)
    {
        var bytesPerCell = SeriesCodec.EncodedLength(stepCount, System.Numerics.BitOperations.PopCount((uint)mask));
        if ((long)count * bytesPerCell > _payloads.Length)
            throw new InvalidOperationException($"A block of {count} cells of {bytesPerCell} bytes exceeds the block buffer of {_payloads.Length} bytes.");
        (Year, FirstCell, Count, StepCount, Mask, BytesPerCell) = (year, firstCell, count, stepCount, mask, bytesPerCell);
        if (_hasHs.Length < count) _hasHs = new bool[count];
        else Array.Clear(_hasHs, 0, count);
        for (var c = 0; c < count; c++) SeriesCodec.WriteEmpty(Payload(c), stepCount, mask);
    }

    /// <summary>The packed series of the block's cell <paramref name="c"/> (0-based within the block).</summary>
    public Span<byte> Payload(int c) => _payloads.AsSpan(c * BytesPerCell, BytesPerCell);

    /// <summary>True when cell <paramref name="c"/> of the block has a wave height at some step (stored or new).</summary>
    public bool HasData(int c) => _hasHs[c];

    /// <summary>
    /// Copies the year's stored chunks of the block's cells onto the merged time line: the new files then fill in or
    /// compare against them. A stored chunk counts as data.
    /// </summary>
    public void CopyStored(IReadOnlyDictionary<int, byte[]> stored, long[] storedTimeline, long[] timeline)
    {
        var positions = storedTimeline.Select(t => Array.BinarySearch(timeline, t)).ToArray();
        foreach (var (cell, payload) in stored)
        {
            var target = Payload(cell - FirstCell);
            var oldSteps = SeriesCodec.StepCountOf(payload);
            for (var v = 0; v < SeriesCodec.VariableCount; v++)
            {
                var variable = WaveParameterGroups.SeriesFields[v];
                if (!SeriesCodec.Has(payload, variable) || !SeriesCodec.Has(target, variable)) continue;
                var from = SeriesCodec.OffsetOf(payload[1], oldSteps, variable);
                var to = SeriesCodec.OffsetOf(target[1], timeline.Length, variable);
                for (var i = 0; i < oldSteps; i++)
                {
                    target[to + 2 * positions[i]] = payload[from + 2 * i];
                    target[to + 2 * positions[i] + 1] = payload[from + 2 * i + 1];
                }
            }
            _hasHs[cell - FirstCell] = true;
        }
    }

    /// <summary>
    /// Transposes one slab read from a file, <paramref name="values"/>[step][cell] over the block's cells, into the
    /// cells' series at their time-line positions. At a step an earlier source gave (stored, or an earlier file) the
    /// value already there is compared with the new one and a difference recorded; the new value is written either
    /// way (equal, or the load is refused at its end). A value outside the storable range is refused, naming the file,
    /// variable, time and point, unless the point cannot be a sea cell.
    /// <para>
    /// Steps go in tiles of <see cref="TileSteps"/>. A tile's values are quantised row by row in vector registers
    /// (<see cref="SeriesQuantiser.TryQuantise"/>: one division per value had been 90 % of the transposition), and
    /// where its steps are consecutive on the time line and compared with nothing, each cell receives its 32 values
    /// as one run of 64 bytes (a cache line), cell after cell, instead of one value per cell per step across the
    /// 128 MB block buffer (half the time again). Other tiles, and a tile holding a value out of range, go step by step
    /// (the latter value by value, which names the first such value in step order). Every way writes the same bytes.
    /// </para>
    /// Compiled at once with full optimisation: called once per slab, its loops would otherwise run precompiled code.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void Scatter(in FileSlab slab, ReadOnlySpan<float> values, in SharedStepCheck shared)
    {
        var offset = SeriesCodec.OffsetOf(Mask, StepCount, slab.Variable);
        var quantiser = new SeriesQuantiser(slab.Variable);
        if (_tile.Length < TileSteps * Count) _tile = new ushort[TileSteps * Count];
        for (var s0 = 0; s0 < slab.Steps; s0 += TileSteps)
        {
            var n = Math.Min(TileSteps, slab.Steps - s0);
            var quantised = true;
            for (var t = 0; t < n && quantised; t++)
                quantised = quantiser.TryQuantise(values.Slice((s0 + t) * Count, Count), _tile.AsSpan(t * Count, Count));
            if (quantised && IsPlainTile(slab, shared, s0, n))
            {
                WriteTile(slab, s0, n, offset);
                continue;
            }
            for (var s = s0; s < s0 + n; s++)
            {
                if (quantised) WriteStep(slab, _tile.AsSpan((s - s0) * Count, Count), shared, s, offset);
                else ScatterStepValueByValue(slab, values.Slice(s * Count, Count), shared, s, offset, quantiser);
            }
        }
    }

    /// <summary>Steps per tile: 32 values of 2 bytes fill one 64-byte cache line of a cell's series.</summary>
    public const int TileSteps = 32;

    /// <summary>Are steps <paramref name="s0"/>.. of the slab consecutive on the time line, and none compared with an earlier source?</summary>
    private static bool IsPlainTile(in FileSlab slab, in SharedStepCheck shared, int s0, int n)
    {
        var positions = slab.Part.Positions;
        var first = slab.PartStep + s0;
        if (positions[first + n - 1] - positions[first] != n - 1) return false;
        for (var step = first; step < first + n; step++)
            if (ComparedWith(slab, shared, step) != SharedSteps.None) return false;
        return true;
    }

    /// <summary>The earlier source whose value of the slab's variable at <paramref name="step"/> the new one is compared with, or <see cref="SharedSteps.None"/>.</summary>
    private static int ComparedWith(in FileSlab slab, in SharedStepCheck shared, int step)
    {
        var holder = shared.Steps.HolderOf(shared.File, step);
        return holder != SharedSteps.None && (shared.Steps.HolderMaskOf(shared.File, step) & SeriesCodec.BitOf(slab.Variable)) != 0 ? holder : SharedSteps.None;
    }

    /// <summary>Writes a plain tile's quantised values (<see cref="_tile"/>) cell by cell, each cell's as one run.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void WriteTile(in FileSlab slab, int s0, int n, int offset)
    {
        var isHs = slab.Variable == WaveParameter.Hs;
        var at = offset + 2 * slab.Part.Positions[slab.PartStep + s0];
        var count = Count;
        var tile = _tile.AsSpan(0, n * count);
        for (var c = 0; c < count; c++)
        {
            var run = _payloads.AsSpan(c * BytesPerCell + at, 2 * n);
            var any = false;
            for (var t = 0; t < n; t++)
            {
                var q = tile[t * count + c];
                BinaryPrimitives.WriteUInt16LittleEndian(run.Slice(2 * t), q);
                any |= q != SeriesCodec.Missing;
            }
            if (isHs && any) _hasHs[c] = true;
        }
    }

    /// <summary>Writes step <paramref name="s"/>'s quantised values into every cell, comparing where an earlier source gave the step.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void WriteStep(in FileSlab slab, ReadOnlySpan<ushort> quantised, in SharedStepCheck shared, int s, int offset)
    {
        var isHs = slab.Variable == WaveParameter.Hs;
        var step = slab.PartStep + s;
        var at = offset + 2 * slab.Part.Positions[step];
        var holder = ComparedWith(slab, shared, step);
        var compare = holder != SharedSteps.None;
        for (var c = 0; c < Count; c++)
        {
            var q = quantised[c];
            var payload = Payload(c);
            if (compare && _candidate[FirstCell + c])
            {
                var old = BinaryPrimitives.ReadUInt16LittleEndian(payload.Slice(at));
                if (old != q)
                    shared.Conflicts.Record(slab.File.Name, shared.HolderName(holder), slab.File.Times[slab.Part.First + step], slab.Variable, old, q, FirstCell + c);
            }
            BinaryPrimitives.WriteUInt16LittleEndian(payload.Slice(at), q);
            if (isHs && q != SeriesCodec.Missing) _hasHs[c] = true;
        }
    }

    /// <summary>
    /// Step <paramref name="s"/> of a tile holding a value out of range, value by value: such a value is refused
    /// (named) at a point that may be a sea cell and left out elsewhere; the others are written as in
    /// <see cref="WriteStep"/>.
    /// </summary>
    private void ScatterStepValueByValue(in FileSlab slab, ReadOnlySpan<float> stepValues, in SharedStepCheck shared, int s, int offset,
        SeriesQuantiser quantiser)
    {
        var isHs = slab.Variable == WaveParameter.Hs;
        var step = slab.PartStep + s;
        var at = offset + 2 * slab.Part.Positions[step];
        var holder = ComparedWith(slab, shared, step);
        var compare = holder != SharedSteps.None;
        for (var c = 0; c < Count; c++)
        {
            var value = stepValues[c];
            var candidate = _candidate[FirstCell + c];
            var quantised = quantiser.Quantise(value);
            if (quantised == SeriesQuantiser.OutOfRange)
            {
                if (!candidate) continue;
                throw new IngestException($"{slab.File.Name}: variable '{slab.Variable}': value {value} at {YearTimeline.Iso(slab.File.Times[slab.Part.First + step])}, " +
                    $"point {FirstCell + c} is outside the physical range 0 to {SeriesCodec.MaximumOf(slab.Variable)} ({slab.Variable.Unit()}); " +
                    "check the units and fill values.");
            }
            var q = (ushort)quantised;
            var payload = Payload(c);
            if (compare && candidate)
            {
                var old = BinaryPrimitives.ReadUInt16LittleEndian(payload.Slice(at));
                if (old != q)
                    shared.Conflicts.Record(slab.File.Name, shared.HolderName(holder), slab.File.Times[slab.Part.First + step], slab.Variable, old, q, FirstCell + c);
            }
            BinaryPrimitives.WriteUInt16LittleEndian(payload.Slice(at), q);
            if (isHs && q != SeriesCodec.Missing) _hasHs[c] = true;
        }
    }

    /// <summary>
    /// The block's chunks to store: cells that may be sea cells and have a wave height. Their payloads are views of
    /// this block's buffer, so the block must not begin again before their COPY completes.
    /// </summary>
    public List<StreamedSeriesChunk> Chunks()
    {
        var chunks = new List<StreamedSeriesChunk>();
        for (var c = 0; c < Count; c++)
            if (_hasHs[c] && _candidate[FirstCell + c])
                chunks.Add(new StreamedSeriesChunk(FirstCell + c, Year, _payloads.AsMemory(c * BytesPerCell, BytesPerCell)));
        return chunks;
    }
}

/// <summary>
/// One hyperslab read from a file for a block: <see cref="Steps"/> steps of one variable from step
/// <see cref="PartStep"/> of the file's <see cref="Part"/> of the year.
/// </summary>
public readonly record struct FileSlab(SourceFile File, FilePart Part, WaveParameter Variable, int PartStep, int Steps);

/// <summary>The shared-step bookkeeping <see cref="CellBlock.Scatter"/> compares against, for one file.</summary>
public readonly record struct SharedStepCheck(SharedSteps Steps, int File, SharedStepConflicts Conflicts, Func<int, string> HolderName);
