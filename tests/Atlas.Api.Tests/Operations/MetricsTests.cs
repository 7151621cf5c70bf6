using System.Net;
using Atlas.Api.Tests.Support;
using Atlas.TestSupport;

namespace Atlas.Api.Tests.Operations;

[Collection(AtlasApiCollection.Name)]
public sealed class MetricsTests(AtlasApiFixture atlas)
{
    private readonly HttpClient _client = atlas.Factory.CreateClient();

    [Fact]
    public async Task MetricsScrapeShowsRequestDurationsAndTheJobQueue()
    {
        Assert.Equal(HttpStatusCode.OK, (await _client.GetAsync("/api/v1/datasets")).StatusCode);
        using var job = new HttpRequestMessage(HttpMethod.Post, $"/api/v1/datasets/{SyntheticAtlas.CoastSlug}/jobs");
        job.Headers.Add("X-Api-Key", AtlasApiFixture.ApiKey);
        Assert.Equal(HttpStatusCode.Accepted, (await _client.SendAsync(job)).StatusCode);

        // The exporter caches a scrape for a short while; a second scrape after the first sees the requests above.
        var text = await ScrapeUntilAsync(t => t.Contains("http_server_request_duration_seconds_bucket") && t.Contains("atlas_job_queue{"));
        // Names and labels as the OpenTelemetry HTTP semantic conventions and their Prometheus mapping give them.
        Assert.Matches("http_server_request_duration_seconds_count\\{[^}]*http_request_method=\"GET\"[^}]*http_response_status_code=\"200\"[^}]*http_route=\"/api/v1/datasets/\"[^}]*\\} [1-9]", text);
        Assert.Matches("atlas_job_queue\\{[^}]*atlas_job_kind=\"statistics\"[^}]*atlas_job_state=\"queued\"[^}]*\\} [1-9]", text);
    }

    [Fact]
    public async Task MetricsAreServedInThePrometheusTextFormat()
    {
        var response = await _client.GetAsync("/metrics");
        Assert.Equal(HttpStatusCode.OK, response.StatusCode);
        Assert.StartsWith("text/plain", response.Content.Headers.ContentType!.MediaType);
        var text = await response.Content.ReadAsStringAsync();
        Assert.Contains("# TYPE ", text);
        Assert.Contains("target_info{", text);
        Assert.Contains("service_name=\"atlas-api\"", text);
    }

    private Task<string> ScrapeUntilAsync(Func<string, bool> done) =>
        Patience.UntilAsync(() => _client.GetStringAsync("/metrics"), done, "the scrape to show the expected series");
}
