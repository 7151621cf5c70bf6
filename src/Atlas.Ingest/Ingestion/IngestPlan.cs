using System.Text.Json;
using Atlas.Hindcast;
using Atlas.Storage.Datasets;
using Atlas.Storage.Series;
using Npgsql;

namespace Atlas.Ingest.Ingestion;

/// <summary>
/// The first stage of an ingest, plan and validate: which of the opened files are new, checked against each other and
/// against the dataset (one grid for all), which variables they store, their cell depths, and every year's merged time
/// line. It is read inside the ingest's transaction under the dataset's ingest lock, so it holds until the commit.
/// </summary>
public sealed class IngestPlan
{
    private IngestPlan(IngestRequest request, IReadOnlyList<SourceFile> fresh, int skipped, DatasetRecord? dataset)
    {
        Request = request;
        Fresh = fresh;
        Skipped = skipped;
        Dataset = dataset;
    }

    public IngestRequest Request { get; }

    /// <summary>The files not loaded before (by checksum), in time order; empty when there is nothing to do.</summary>
    public IReadOnlyList<SourceFile> Fresh { get; }

    /// <summary>Files skipped because the dataset already holds them.</summary>
    public int Skipped { get; }

    /// <summary>The dataset loaded into, or null when this ingest creates it.</summary>
    public DatasetRecord? Dataset { get; }

    public bool CreatesDataset => Dataset is null;

    public GridDescription Grid { get; private init; } = null!;

    /// <summary>The time lines already stored, by year (empty for a new dataset).</summary>
    public SortedDictionary<int, long[]> StoredTimelines { get; private init; } = [];

    /// <summary>The depths the new files give, or null when none has a depth.</summary>
    public CellDepths? Depths { get; private init; }

    /// <summary>Per grid point: may it be a sea cell (no depth known, or a positive one)? Values elsewhere are not stored.</summary>
    public bool[] Candidate { get; private init; } = [];

    /// <summary>The series variables stored after this ingest (bits of <see cref="SeriesCodec.BitOf"/>).</summary>
    public int Mask { get; private init; }

    /// <summary>The series variables stored before it.</summary>
    public int StoredMask { get; private init; }

    /// <summary>The years the new files touch, in order.</summary>
    public int[] Years { get; private init; } = [];

    /// <summary>Each touched year's time line: the stored steps and the new ones, merged.</summary>
    public IReadOnlyDictionary<int, long[]> MergedTimelines { get; private init; } = new Dictionary<int, long[]>();

    /// <summary>Time steps in the new files (a step given by two files counted twice).</summary>
    public int FreshSteps => Fresh.Sum(f => f.Times.Length);

    public int VariableCount => System.Numerics.BitOperations.PopCount((uint)Mask);

    /// <summary>
    /// Plans the load of <paramref name="files"/> (opened, in any order) into the request's dataset, refusing files of
    /// different grids, or of another grid than the dataset's, by name. A plan with no <see cref="Fresh"/> file means
    /// every file is loaded already.
    /// </summary>
    public static async Task<IngestPlan> BuildAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, IngestRequest request,
        List<SourceFile> files, CancellationToken cancel)
    {
        files.Sort((a, b) => a.Times[0].CompareTo(b.Times[0]));
        CheckSameGrid(files);
        var dataset = await DatasetStore.FindAsync(connection, transaction, request.DatasetSlug, cancel);
        var loaded = dataset is null ? [] : await DatasetStore.LoadedChecksumsAsync(connection, transaction, dataset.Id, cancel);
        var fresh = FreshFiles(files, loaded);
        if (fresh.Count == 0) return new IngestPlan(request, fresh, files.Count, dataset);

        var grid = GridDescription.Of(fresh[0].Grid);
        if (dataset is not null && !GridDescription.Matches(dataset, grid))
            throw new IngestException($"{fresh[0].Name}: its grid ({grid.Describe()}) differs from the grid of dataset '{dataset.Slug}' " +
                $"({dataset.GridKind}, {dataset.PointCount} points); files of one dataset must share one grid.");
        var stored = dataset is null ? new SortedDictionary<int, long[]>() : await DatasetStore.TimelinesAsync(connection, transaction, dataset.Id, cancel);

        var depths = CellDepths.Read(fresh);
        var candidate = new bool[grid.PointCount];
        for (var p = 0; p < candidate.Length; p++) candidate[p] = depths is null || depths.StoredDepth(p) is not null;

        var storedMask = dataset is null ? 0 : MaskFromMetadata(dataset.MetadataJson);
        var mask = storedMask;
        foreach (var file in fresh) mask |= MaskOf(file);

        var years = fresh.SelectMany(f => f.Times.Select(YearTimeline.YearOf)).Distinct().Order().ToArray();
        var merged = years.ToDictionary(y => y, y => YearTimeline.Merge(stored.GetValueOrDefault(y, []),
            fresh.SelectMany(f => f.Times).Where(t => YearTimeline.YearOf(t) == y)));
        return new IngestPlan(request, fresh, files.Count - fresh.Count, dataset)
        {
            Grid = grid,
            StoredTimelines = stored,
            Depths = depths,
            Candidate = candidate,
            Mask = mask,
            StoredMask = storedMask,
            Years = years,
            MergedTimelines = merged,
        };
    }

    /// <summary>The series variables a file gives.</summary>
    public static int MaskOf(SourceFile file)
    {
        var mask = 0;
        foreach (var variable in WaveParameterGroups.SeriesFields)
            if (file.Has(variable)) mask |= SeriesCodec.BitOf(variable);
        return mask;
    }

    private static int MaskFromMetadata(string metadataJson)
    {
        using var document = JsonDocument.Parse(metadataJson);
        if (!document.RootElement.TryGetProperty("stored_variable_mask", out var value)) return 0;
        return value.GetInt32();
    }

    private static void CheckSameGrid(List<SourceFile> files)
    {
        for (var i = 1; i < files.Count; i++)
            if (!files[i].Grid.IsSameAs(files[0].Grid))
                throw new IngestException($"{files[i].Name}: its grid ({GridDescription.Of(files[i].Grid).Describe()}) differs from the grid of " +
                    $"{files[0].Name} ({GridDescription.Of(files[0].Grid).Describe()}); files of one dataset must share one grid.");
    }

    /// <summary>
    /// The files whose bytes are neither loaded already nor those of an earlier file of the list. Files of the same
    /// bytes have the same size and the same decoded time axis: where nothing is loaded, a file that no other given file
    /// matches in both (yearly files, monthly files) is fresh without its checksum, which then goes on beside the load.
    /// A dataset loaded before checksums were BLAKE3 holds SHA-256 ones: a given file is compared with those by SHA-256.
    /// </summary>
    private static List<SourceFile> FreshFiles(List<SourceFile> files, IReadOnlyCollection<string> loaded)
    {
        var seen = new HashSet<string>(loaded, StringComparer.OrdinalIgnoreCase);
        var olderAlgorithms = loaded.Select(FileChecksum.AlgorithmOf).Where(a => a != FileChecksum.Blake3).Distinct().ToArray();
        var alike = files.GroupBy(Likeness).Where(g => g.Count() > 1).Select(g => g.Key).ToHashSet();
        return files.Where(f => (loaded.Count == 0 && !alike.Contains(Likeness(f))) ||
            (olderAlgorithms.All(a => !seen.Contains(f.ChecksumBy(a))) && seen.Add(f.Checksum))).ToList();
    }

    private static (long Size, int Steps, long First, long Last) Likeness(SourceFile file) =>
        (file.SizeBytes, file.Times.Length, file.Times.Length == 0 ? 0 : file.Times[0], file.Times.Length == 0 ? 0 : file.Times[^1]);
}
