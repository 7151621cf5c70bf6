using System.Diagnostics.Metrics;

namespace Atlas.Api.Operations;

/// <summary>
/// The gauge <c>atlas.job.queue</c>: jobs in the shared queue by kind and state, read from the database at each
/// scrape. The API runs no jobs itself, so this is how its scrape shows a queue that backs up or jobs that fail,
/// whichever worker ran them. A scrape while the database is down simply carries no queue figures.
/// </summary>
public sealed partial class JobQueueGauge : IDisposable
{
    public const string MeterName = "Atlas.Api";

    private readonly Meter _meter = new(MeterName);
    private readonly JobQueue _queue;
    private readonly ILogger<JobQueueGauge> _logger;

    public JobQueueGauge(JobQueue queue, ILogger<JobQueueGauge> logger)
    {
        _queue = queue;
        _logger = logger;
        _meter.CreateObservableGauge("atlas.job.queue", Observe, "{job}", "Jobs in the shared queue, by kind and state");
    }

    private IEnumerable<Measurement<long>> Observe()
    {
        IReadOnlyList<(string Kind, string State, long Count)> counts;
        try
        {
            // Scrapes are synchronous callbacks; the query is one small GROUP BY on an indexed table.
            using var timeout = new CancellationTokenSource(TimeSpan.FromSeconds(3));
            counts = _queue.CountByStateAsync(timeout.Token).GetAwaiter().GetResult();
        }
        catch (Exception e) when (DatabaseOutage.Is(e) || e is OperationCanceledException)
        {
            JobQueueUnreadable(_logger, e.Message);
            return [];
        }
        return counts.Select(c => new Measurement<long>(c.Count,
            new KeyValuePair<string, object?>("atlas.job.kind", c.Kind), new KeyValuePair<string, object?>("atlas.job.state", c.State)));
    }

    public void Dispose() => _meter.Dispose();

    [LoggerMessage(EventId = 9, Level = LogLevel.Warning, Message = "The job queue could not be read for the metrics scrape: {Error}")]
    private static partial void JobQueueUnreadable(ILogger logger, string error);
}
