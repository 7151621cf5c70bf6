using Atlas.Assessment;
using Atlas.Ingest.Series;
using Atlas.Storage.Cells;
using Atlas.Storage.Series;

namespace Atlas.Ingest.Assessment;

/// <summary>A cell's stored series read for the assessment analyses, which want regular steps.</summary>
public static class AssessmentSeries
{
    /// <summary>The cell's series over the stored years in [fromYear, toYear] (all years when null).</summary>
    public static async Task<PointSeries> ReadAsync(SeriesStore series, IReadOnlyDictionary<int, long[]> timelines, int datasetId, CellRecord cell,
        int? fromYear, int? toYear, CancellationToken cancel)
    {
        var chunks = await series.ReadCellAsync(datasetId, cell.CellId, fromYear, toYear, cancel);
        return PointSeriesReader.Decode(chunks, timelines, cell.DepthMetres is { } d ? d : double.NaN);
    }

    /// <summary>
    /// The values on the dataset's regular step (steps the time line skips become NaN). Throws
    /// <see cref="ArgumentException"/> when the time line has fewer than two steps or is not on a common step.
    /// </summary>
    public static RegularSeries Regular(long[] times, float[] values)
    {
        var doubles = new double[values.Length];
        for (var i = 0; i < doubles.Length; i++) doubles[i] = values[i];
        return RegularSeries.FromTimes(times, doubles);
    }

    /// <summary>The median spacing of a time line, hours; NaN with fewer than two times.</summary>
    public static double MedianStepHours(ReadOnlySpan<long> times)
    {
        if (times.Length < 2) return double.NaN;
        var steps = new long[times.Length - 1];
        for (var i = 1; i < times.Length; i++) steps[i - 1] = times[i] - times[i - 1];
        Array.Sort(steps);
        return steps[steps.Length / 2] / 3600.0;
    }
}
