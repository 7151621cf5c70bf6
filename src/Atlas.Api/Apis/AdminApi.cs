namespace Atlas.Api.Apis;

/// <summary>The write endpoints: queue a statistics job, delete a dataset. Both need an API key.</summary>
public static partial class AdminApi
{
    public static IEndpointRouteBuilder MapAdminApi(this IEndpointRouteBuilder routes)
    {
        var group = routes.MapGroup("/api/v1/datasets/{slug}").WithTags("Administration");
        group.MapPost("/jobs", EnqueueStatisticsAsync)
            .ProducesProblems(StatusCodes.Status404NotFound)
            .RequireApiKey();
        group.MapGet("/jobs/{jobId:long}", JobStatusAsync)
            .ProducesProblems(StatusCodes.Status404NotFound);
        group.MapDelete("/", DeleteAsync)
            .ProducesProblems(StatusCodes.Status404NotFound, StatusCodes.Status409Conflict)
            .RequireApiKey();
        return routes;
    }

    [EndpointName("QueueStatisticsJob")]
    [EndpointSummary("Queue a statistics job for a dataset (needs X-Api-Key)")]
    [EndpointDescription(
        "A worker (atlas serve or any worker sharing the database) claims the job and recomputes the statistics " +
        "of every cell whose series changed. Poll the returned status link for progress.")]
    public static async Task<Results<Accepted<JobAccepted>, ProblemHttpResult>> EnqueueStatisticsAsync(string slug, DatasetStore datasets,
        JobQueue jobs, ILogger<JobQueue> logger, CancellationToken cancel)
    {
        if (await datasets.FindAsync(slug, cancel) is null) return ApiProblems.UnknownDataset(slug);
        var id = await jobs.EnqueueAsync(JobKind.Statistics, slug, "{}", cancel);
        JobQueued(logger, id, slug);
        var status = $"/api/v1/datasets/{slug}/jobs/{id}";
        return TypedResults.Accepted(status, new JobAccepted(id, "statistics", slug, "queued", status));
    }

    [EndpointName("JobStatus")]
    [EndpointSummary("The state of a queued job")]
    public static async Task<Results<Ok<JobStatus>, ProblemHttpResult>> JobStatusAsync(string slug, long jobId, JobQueue jobs, CancellationToken cancel)
    {
        var job = await jobs.FindAsync(jobId, cancel);
        if (job is null || job.DatasetSlug != slug)
            return ApiProblems.NotFound("Unknown job", $"Dataset '{slug}' has no job {jobId}.");
        return TypedResults.Ok(new JobStatus(job.Id, JobQueue.KindName(job.Kind), job.DatasetSlug, job.State, job.Attempts, job.CreatedAtUtc,
            job.FinishedAtUtc, job.ProgressJson, job.Error, job.Summary));
    }

    [EndpointName("DeleteDataset")]
    [EndpointSummary("Delete a dataset and everything stored for it (needs X-Api-Key)")]
    public static async Task<Results<NoContent, ProblemHttpResult>> DeleteAsync(string slug,
        [FromKeyedServices(AtlasDataSources.Writer)] NpgsqlDataSource writer, DatasetCatalog catalog, ILogger<DatasetStore> logger, CancellationToken cancel)
    {
        var removal = await new DatasetStore(writer).DeleteAsync(slug, cancel);
        if (removal.Outcome == DatasetRemovalOutcome.Unknown) return ApiProblems.UnknownDataset(slug);
        if (removal.BusyReason is { } busy)
            return ApiProblems.Conflict("Dataset in use", $"Dataset '{slug}' was not deleted: {busy}. Delete it once that has finished.");
        catalog.Forget(slug);
        DatasetDeleted(logger, slug);
        return TypedResults.NoContent();
    }

    [LoggerMessage(EventId = 7, Level = LogLevel.Information, Message = "Dataset {Slug} deleted through the API")]
    private static partial void DatasetDeleted(ILogger logger, string slug);

    [LoggerMessage(EventId = 8, Level = LogLevel.Information, Message = "Statistics job {JobId} queued for {Slug} through the API")]
    private static partial void JobQueued(ILogger logger, long jobId, string slug);
}
