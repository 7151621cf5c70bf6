using Atlas.Storage.Series;

namespace Atlas.Ingest.Ingestion;

/// <summary>
/// One year of an ingest plan: its merged time line, the size of the blocks of cells it is loaded in, where each new
/// file's steps of the year fall on the time line, and which of those steps an earlier source gave already.
/// </summary>
public sealed class YearPlan
{
    private YearPlan() { }

    public int Year { get; private init; }

    /// <summary>The year's merged time line (stored and new steps).</summary>
    public long[] Timeline { get; private init; } = null!;

    /// <summary>The year's stored time line, or null when nothing of the year is stored.</summary>
    public long[]? StoredTimeline { get; private init; }

    /// <summary>Bytes of one cell's packed series of the year.</summary>
    public int BytesPerCell { get; private init; }

    /// <summary>Cells per block: half the memory budget (one block is read while the previous one is written).</summary>
    public int BlockSize { get; private init; }

    /// <summary>Per new file (in plan order): its steps of the year.</summary>
    public IReadOnlyList<FilePart> Parts { get; private init; } = null!;

    public SharedSteps Shared { get; private init; } = null!;

    /// <summary>The most bytes a block of the year holds.</summary>
    public long BlockBytes => (long)BlockSize * BytesPerCell;

    public static YearPlan For(IngestPlan plan, int year)
    {
        var timeline = plan.MergedTimelines[year];
        var pointCount = plan.Grid.PointCount;
        var bytesPerCell = SeriesCodec.EncodedLength(timeline.Length, plan.VariableCount);
        var blockSize = (int)Math.Clamp(plan.Request.MemoryBudgetBytes / 2 / Math.Max(1, bytesPerCell), 1, pointCount);
        // Whole grid rows per block: a hyperslab of whole rows is one contiguous read per chunk.
        if (plan.Grid.Nx is { } nx && blockSize > nx && blockSize < pointCount) blockSize -= blockSize % nx;
        var parts = new FilePart[plan.Fresh.Count];
        for (var k = 0; k < parts.Length; k++) parts[k] = FilePart.Of(plan.Fresh[k].Times, year, timeline);
        var stored = plan.StoredTimelines.GetValueOrDefault(year);
        var shared = SharedSteps.ForYear(timeline, stored, plan.StoredMask, plan.Request.ReplaceOverlap,
            parts.Select((part, k) => (part.Positions, IngestPlan.MaskOf(plan.Fresh[k]))).ToList());
        return new YearPlan
        {
            Year = year, Timeline = timeline, StoredTimeline = stored, BytesPerCell = bytesPerCell, BlockSize = blockSize, Parts = parts, Shared = shared,
        };
    }
}

/// <summary>A file's steps of one year: file steps <see cref="First"/>..<see cref="Last"/>, and each one's position on the year's time line.</summary>
public readonly record struct FilePart(int First, int Last, int[] Positions)
{
    public bool IsEmpty => First > Last;

    public static FilePart Of(long[] times, int year, long[] timeline)
    {
        var start = new DateTimeOffset(year, 1, 1, 0, 0, 0, TimeSpan.Zero).ToUnixTimeSeconds();
        var end = new DateTimeOffset(year + 1, 1, 1, 0, 0, 0, TimeSpan.Zero).ToUnixTimeSeconds();
        var first = LowerBound(times, start);
        var last = LowerBound(times, end) - 1;
        var positions = new int[Math.Max(0, last - first + 1)];
        for (var t = first; t <= last; t++) positions[t - first] = Array.BinarySearch(timeline, times[t]);
        return new FilePart(first, last, positions);
    }

    private static int LowerBound(long[] values, long key)
    {
        var index = Array.BinarySearch(values, key);
        return index >= 0 ? index : ~index;
    }
}
