using Atlas.Hindcast;
using Atlas.Storage.Datasets;

namespace Atlas.Ingest.Ingestion;

/// <summary>What to load: files into a dataset, and how to treat time steps already stored.</summary>
/// <param name="ReplaceOverlap">When false (the default) a file whose time steps are already stored is refused;
/// when true its values replace the stored ones.</param>
/// <param name="MemoryBudgetBytes">Bytes of series buffered at once; the cells are processed in blocks that fit.</param>
/// <param name="Cells">The grid points to load (a part of an ingest in parts), or null for all of them.</param>
public sealed record IngestRequest(
    string DatasetSlug,
    IReadOnlyList<string> Files,
    string? Title = null,
    bool ReplaceOverlap = false,
    VariableMapping? Mapping = null,
    long? JobId = null,
    long MemoryBudgetBytes = 256L << 20,
    CellRange? Cells = null)
{
    /// <summary>For output points: the slug of the gridded dataset of the same hindcast, whose point answers then add the
    /// exact spectral values at the nearest of these points.</summary>
    public string? GridDataset { get; init; }
}

/// <summary>Grid points <paramref name="First"/> to <paramref name="Last"/>, both included.</summary>
public readonly record struct CellRange(int First, int Last)
{
    public int Count => Last - First + 1;
}

/// <summary>The one-line outcome of an ingest.</summary>
public sealed record IngestSummary(
    string DatasetSlug,
    int FilesLoaded,
    int FilesSkipped,
    int StepsLoaded,
    int CellsWritten,
    int WetCells,
    long BytesRead,
    TimeSpan Elapsed,
    bool DatasetCreated)
{
    /// <summary>Steps given twice (stored or in two files) with identical values, stored once.</summary>
    public int SharedSteps { get; init; }

    /// <summary>Per wave variable: the file variable it came from, the conversion and what was assumed.</summary>
    public IReadOnlyList<VariableAssumption> Assumptions { get; init; } = [];

    /// <summary>Warnings about the record as a whole (for instance shorter than one month).</summary>
    public IReadOnlyList<string> Warnings { get; init; } = [];

    /// <summary>For spectral output points: how the spectra were read and integrated, in words.</summary>
    public IReadOnlyList<string> SpectralNotes { get; init; } = [];

    /// <summary>The one-line outcome, then one line per wave variable and one per warning.</summary>
    public string Describe()
    {
        if (FilesLoaded == 0) return $"ingest {DatasetSlug}: nothing new ({FilesSkipped} file(s) already loaded, unchanged)";
        var line = $"ingest {DatasetSlug}: {FilesLoaded} file(s), {StepsLoaded:N0} time steps, {CellsWritten:N0} cell-years for {WetCells:N0} wet cells, " +
                   $"{BytesRead / 1e6:F0} MB in {Progress.ProgressSnapshot.FormatDuration(Elapsed)}" +
                   (FilesSkipped > 0 ? $"; {FilesSkipped} file(s) already loaded were skipped" : "") +
                   (SharedSteps > 0 ? $"; {SharedSteps:N0} step(s) given twice with identical values were stored once" : "") +
                   (DatasetCreated ? " (new dataset)" : "");
        return string.Join('\n', [line, .. Assumptions.Select(a => "  " + a.Describe()), .. SpectralNotes.Select(n => "  spectra: " + n),
            .. Warnings.Select(w => "  warning: " + w)]);
    }
}
