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
    /// variable, time and point, unless the point cannot be a sea cell. Compiled at once with full optimisation: called
    /// once per slab, its loop would otherwise run precompiled code, which cannot inline the quantiser of another
    /// assembly and calls it through a stub for every value (perf: 13 % of an ingest's samples in that call and the
    /// span slicing around it).
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void Scatter(in FileSlab slab, ReadOnlySpan<float> values, in SharedStepCheck shared)
    {
        var offset = SeriesCodec.OffsetOf(Mask, StepCount, slab.Variable);
        var isHs = slab.Variable == WaveParameter.Hs;
        var quantiser = new SeriesQuantiser(slab.Variable);
        for (var s = 0; s < slab.Steps; s++)
        {
            var step = slab.PartStep + s;
            var at = offset + 2 * slab.Part.Positions[step];
            var row = s * Count;
            var holder = shared.Steps.HolderOf(shared.File, step);
            var compare = holder != SharedSteps.None && (shared.Steps.HolderMaskOf(shared.File, step) & SeriesCodec.BitOf(slab.Variable)) != 0;
            for (var c = 0; c < Count; c++)
            {
                var value = values[row + c];
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
