namespace Atlas.Api.Catalog;

/// <summary>Assembles the provenance of a dataset's figures: source files and checksums, software, dates, method.</summary>
public sealed class ProvenanceBuilder(DatasetStore datasets, DatasetCatalog catalog, IMemoryCache cache)
{
    public const string Software = "atlas";

    public static readonly string SoftwareVersion =
        typeof(ProvenanceBuilder).Assembly.GetCustomAttribute<AssemblyInformationalVersionAttribute>()?.InformationalVersion.Split('+')[0]
        ?? typeof(ProvenanceBuilder).Assembly.GetName().Version?.ToString() ?? "unknown";

    /// <summary>How the served figures are computed, in one paragraph.</summary>
    public const string Method =
        "Wave power is computed at every time step from Hm0 and the energy period Te with the group velocity of linear wave " +
        "theory at the cell depth (the deep-water limit where the depth is unknown), and only then averaged; the mean direction " +
        "is the power-weighted circular mean of the direction waves come from; missing steps are skipped and counted " +
        "(count and coverage accompany every statistic); point statistics are computed from the exact stored series, " +
        "layer percentiles from fixed-bin histograms; months and seasons are UTC calendar months gathered across all years.";

    /// <summary>The statistics service's method notes carried into provenance, in this order.</summary>
    private static readonly string[] RecordedNotes =
        ["energy_period", "percentiles_layers", "exceedance_thresholds", "coverage", "climatology", "weighted_percentiles", "seasons", "inter_annual",
         "directionality"];

    public async Task<Provenance> ForAsync(DatasetRecord dataset, CancellationToken cancel)
    {
        // Keyed by the files stamp, so the list follows every load at once (answers cached by that stamp must name their files).
        var loaded = await catalog.SeriesStampAsync(dataset, cancel);
        var files = await cache.GetOrCreateAsync(("files", dataset.Id, dataset.CreatedAtUtc, loaded.Token), async entry =>
        {
            entry.AbsoluteExpirationRelativeToNow = TimeSpan.FromMinutes(10);
            return await datasets.SourceFilesAsync(dataset.Id, cancel);
        });
        var stamp = await catalog.StatisticsStampAsync(dataset, cancel);
        // Everything but the time it is generated follows from the dataset row, its files and its statistics: made once per
        // state of those (the metadata text itself is part of the key), then stamped afresh.
        var made = cache.GetOrCreate(("provenance", dataset.Id, dataset.CreatedAtUtc, loaded.Token, stamp.Token, dataset.Title, dataset.MetadataJson), entry =>
        {
            entry.SlidingExpiration = TimeSpan.FromMinutes(10);
            return Make(dataset, files!, stamp);
        })!;
        return made with { GeneratedAtUtc = DateTime.UtcNow };
    }

    private static Provenance Make(DatasetRecord dataset, IReadOnlyList<SourceFileRecord> files, StatisticsStamp stamp)
    {
        using var metadata = JsonDocument.Parse(dataset.MetadataJson);
        var root = metadata.RootElement;
        var method = Method;
        if (dataset.GridKind == StationSpectraAnswers.StationsKind && root.TryGetProperty("statistics", out var pass)
            && Text(pass, "power") is { } spectralPower)
            method = "At these output points of a spectral hindcast: " + spectralPower + ". " + method.Replace("Wave power is computed", "At grid cells wave power is computed");
        if (Text(root, "depth_note") is { } depthNote) method += " Depth: " + depthNote + ".";
        // The statistics service records its own method notes (thresholds, bin widths) under "statistics".
        if (root.ValueKind == JsonValueKind.Object && root.TryGetProperty("statistics", out var notes) && notes.ValueKind == JsonValueKind.Object)
            foreach (var name in RecordedNotes)
                if (Text(notes, name) is { } note) method += $" {name.Replace('_', ' ')}: {note}.";
        return new Provenance(dataset.Slug, dataset.Title,
            files.Select(f => new ProvenanceFile(f.FileName, f.Checksum, f.TimeStartUtc, f.TimeEndUtc)).ToArray(),
            Software, SoftwareVersion, stamp.ComputedAtUtc, DateTime.UtcNow, method,
            Text(root, "licence"), Text(root, "citation"), AtlasCaution.Text, VariableAssumption.ListFrom(root), Warnings(root));
    }

    /// <summary>The ingest's "warnings" array of the dataset metadata; empty when absent.</summary>
    public static IReadOnlyList<string> Warnings(JsonElement metadata) =>
        metadata.ValueKind == JsonValueKind.Object && metadata.TryGetProperty("warnings", out var list) && list.ValueKind == JsonValueKind.Array
            ? list.EnumerateArray().Where(w => w.ValueKind == JsonValueKind.String).Select(w => w.GetString()!).ToArray()
            : [];

    /// <summary>A string member of a JSON object, or null when absent, null or not a string.</summary>
    public static string? Text(JsonElement element, string name) =>
        element.ValueKind == JsonValueKind.Object && element.TryGetProperty(name, out var value) && value.ValueKind == JsonValueKind.String
            ? value.GetString()
            : null;
}
