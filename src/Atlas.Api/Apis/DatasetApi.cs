namespace Atlas.Api.Apis;

/// <summary><c>/api/v1/datasets</c>: the catalogue and what each dataset holds.</summary>
public static class DatasetApi
{
    public static IEndpointRouteBuilder MapDatasetApi(this IEndpointRouteBuilder routes)
    {
        var group = routes.MapGroup("/api/v1/datasets").WithTags("Datasets");
        group.MapGet("/", ListAsync);
        group.MapGet("/{slug}", DescribeAsync)
            .ProducesProblems(StatusCodes.Status404NotFound);
        return routes;
    }

    [EndpointName("ListDatasets")]
    [EndpointSummary("The datasets this server holds")]
    [EndpointDescription("Slug, title, grid kind, extent, cell counts and time coverage of every dataset.")]
    public static async Task<Ok<DatasetList>> ListAsync(DatasetStore datasets, CancellationToken cancel)
    {
        var items = new List<DatasetListItem>();
        foreach (var dataset in await datasets.ListAsync(cancel))
        {
            var summary = await datasets.SummariseAsync(dataset.Slug, cancel);
            if (summary is null) continue; // deleted between the two reads
            items.Add(new DatasetListItem(dataset.Slug, dataset.Title, dataset.GridKind, ExtentOf(summary), dataset.PointCount,
                summary.WetCellCount, TimeOf(summary), LinksOf(dataset.Slug)));
        }
        return TypedResults.Ok(new DatasetList(items, AtlasCaution.Text));
    }

    [EndpointName("DescribeDataset")]
    [EndpointSummary("What one dataset holds")]
    [EndpointDescription(
        "Extent, grid kind, cell counts, time coverage and step, variables with units, source files with " +
        "checksums (blake3: or sha256:), method notes, licence and citation, the validation summary when one is stored, and the caution.")]
    public static async Task<Results<Ok<DatasetDetail>, ProblemHttpResult>> DescribeAsync(string slug, DatasetStore datasets,
        ProvenanceBuilder provenance, OutputPoints outputPoints, CancellationToken cancel)
    {
        var summary = await datasets.SummariseAsync(slug, cancel);
        if (summary is null) return ApiProblems.UnknownDataset(slug);
        var dataset = summary.Dataset;
        var files = await datasets.SourceFilesAsync(dataset.Id, cancel);
        var source = await provenance.ForAsync(dataset, cancel);
        using var metadata = JsonDocument.Parse(dataset.MetadataJson);
        var root = metadata.RootElement.Clone();
        return TypedResults.Ok(new DatasetDetail(
            dataset.Slug, dataset.Title, dataset.GridKind, ExtentOf(summary), dataset.Nx, dataset.Ny, dataset.PointCount,
            summary.WetCellCount, summary.StatisticsCellCount, TimeOf(summary),
            Member(root, "variables"), ParameterCatalogue.Items,
            files.Select(f => new SourceFileItem(f.FileName, f.Checksum, f.SizeBytes, f.TimeStartUtc, f.TimeEndUtc, f.StepCount, f.LoadedAtUtc)).ToArray(),
            source.MethodNotes, source.Licence, source.Citation, Member(root, "validation"), root, dataset.CreatedAtUtc,
            AtlasCaution.Text, LinksOf(dataset.Slug))
        {
            OutputPoints = await outputPoints.ListAsync(dataset, cancel),
        });
    }

    private static JsonElement? Member(JsonElement root, string name) =>
        root.ValueKind == JsonValueKind.Object && root.TryGetProperty(name, out var value) && value.ValueKind != JsonValueKind.Null ? value : null;

    private static Extent? ExtentOf(DatasetSummary s) =>
        s.West is { } w && s.South is { } so && s.East is { } e && s.North is { } n ? new Extent(w, so, e, n) : null;

    private static TimeCoverage TimeOf(DatasetSummary s) => new(s.FirstTimeUtc, s.LastTimeUtc, s.StepCount, s.MedianStepSeconds, s.Years);

    public static DatasetLinks LinksOf(string slug)
    {
        var root = $"/api/v1/datasets/{slug}";
        return new DatasetLinks(root, root + "/layers", root + "/point?lat={lat}&lon={lon}", root + "/point/series?lat={lat}&lon={lon}",
            root + "/area", root + "/screen");
    }
}
