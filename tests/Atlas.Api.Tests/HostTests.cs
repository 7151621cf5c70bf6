using System.Net;
using System.Text.Json;
using Atlas.Api.Infrastructure;
using Atlas.Api.Tests.Support;

namespace Atlas.Api.Tests;

[Collection(AtlasApiCollection.Name)]
public sealed class HostTests(AtlasApiFixture atlas)
{
    private readonly HttpClient _client = atlas.Factory.CreateClient();

    [Fact]
    public async Task LivenessAndReadinessAnswerWhenTheDatabaseIsUp()
    {
        Assert.Equal(HttpStatusCode.OK, (await _client.GetAsync("/healthz")).StatusCode);
        var ready = JsonDocument.Parse(await _client.GetStringAsync("/readyz")).RootElement;
        Assert.Equal("ready", ready.GetProperty("status").GetString());
        Assert.Equal(ready.GetProperty("migrations_available").GetInt32(), ready.GetProperty("migrations_applied").GetInt32());
    }

    [Fact]
    public async Task PointDocumentationQuotesTheConfiguredCoverageThreshold()
    {
        await using var configured = atlas.Create(new Dictionary<string, string?> { ["Statistics:LowCoverageThreshold"] = "0.6" });
        string Description(JsonElement document) =>
            document.GetProperty("paths").GetProperty("/api/v1/datasets/{slug}/point").GetProperty("get").GetProperty("description").GetString()!;
        var document = JsonDocument.Parse(await configured.CreateClient().GetStringAsync("/swagger/v1/swagger.json")).RootElement;
        Assert.Matches("below 60 ?% are flagged low_coverage", Description(document));
        var defaults = JsonDocument.Parse(await _client.GetStringAsync("/swagger/v1/swagger.json")).RootElement;
        Assert.Matches("below 80 ?% are flagged low_coverage", Description(defaults));
    }

    [Fact]
    public async Task DatabaseOutageIsAServiceUnavailableProblemWithRetryAfter()
    {
        // Nothing listens on port 1 of the loopback: every connection attempt is refused at once.
        await using var down = atlas.Create(new Dictionary<string, string?> { ["ConnectionStrings:Atlas"] = "Host=127.0.0.1;Port=1;Username=x;Password=x;Database=x;Timeout=2" });
        var client = down.CreateClient();
        var response = await client.GetAsync("/api/v1/datasets");
        await Problems.AssertAsync(response, HttpStatusCode.ServiceUnavailable, "database");
        Assert.NotNull(response.Headers.RetryAfter);
        await Problems.AssertAsync(await client.GetAsync("/readyz"), HttpStatusCode.ServiceUnavailable, "database");
        Assert.Equal(HttpStatusCode.OK, (await client.GetAsync("/healthz")).StatusCode);
    }

    [Fact]
    public async Task OpenApiDocumentDescribesEveryEndpoint()
    {
        var document = JsonDocument.Parse(await _client.GetStringAsync("/swagger/v1/swagger.json")).RootElement;
        var paths = document.GetProperty("paths").EnumerateObject().Select(p => p.Name).ToArray();
        foreach (var path in new[]
                 {
                     "/api/v1/datasets", "/api/v1/datasets/{slug}", "/api/v1/datasets/{slug}/point", "/api/v1/datasets/{slug}/point/series",
                     "/api/v1/datasets/{slug}/layers", "/api/v1/datasets/{slug}/layers/{parameter}/{statistic}/{period}.{format}",
                     "/api/v1/datasets/{slug}/area", "/api/v1/datasets/{slug}/screen", "/api/v1/datasets/{slug}/jobs",
                 })
            Assert.Contains(path, paths);
        Assert.Equal(HttpStatusCode.OK, (await _client.GetAsync("/swagger/index.html")).StatusCode);
    }

    [Theory]
    [InlineData("/api/v1/datasets/{slug}/point", "200:application/json,text/csv,application/csvm+json", "400", "404", "422", "429")]
    [InlineData("/api/v1/datasets/{slug}/point/series", "200:text/csv,application/json,application/csvm+json", "400", "404", "422", "429")]
    [InlineData("/api/v1/datasets/{slug}/point/yield", "200:application/json", "400", "404", "422", "429")]
    [InlineData("/api/v1/datasets/{slug}/point/windows", "200:application/json", "400", "404", "422", "429")]
    [InlineData("/api/v1/datasets/{slug}/point/extremes", "200:application/json", "400", "404", "422", "429")]
    [InlineData("/api/v1/datasets/{slug}/layers", "200:application/json", "404")]
    [InlineData("/api/v1/datasets/{slug}/layers/{parameter}/{statistic}/{period}.{format}",
        "200:image/tiff; application=geotiff; profile=cloud-optimized,text/csv; charset=utf-8,application/geo+json,application/x-netcdf,image/png,application/csvm+json",
        "400", "404", "422", "429")]
    [InlineData("/api/v1/datasets/{slug}/layers/accessibility.{format}", "200:application/json,application/geo+json,image/tiff,application/csvm+json", "400", "404", "422", "429")]
    [InlineData("/api/v1/datasets/{slug}/screen", "200:application/geo+json,text/csv,application/csvm+json", "400", "404", "429")]
    public async Task OpenApiDocumentsTheAnswersAndProblemsOfPointAndLayerEndpoints(string path, string ok, params string[] problems)
    {
        // OpenAPI 3 (the Responses Object): each status an operation answers with is a key of its "responses", and
        // its "content" names the media types; the problem answers are application/problem+json (RFC 9457).
        var document = JsonDocument.Parse(await _client.GetStringAsync("/swagger/v1/swagger.json")).RootElement;
        var responses = document.GetProperty("paths").GetProperty(path).GetProperty("get").GetProperty("responses");
        var (status, types) = (ok.Split(':', 2)[0], ok.Split(':', 2)[1].Split(','));
        var content = responses.GetProperty(status).GetProperty("content").EnumerateObject().Select(c => c.Name).ToArray();
        foreach (var type in types) Assert.Contains(type, content);
        foreach (var problem in problems)
            Assert.True(responses.TryGetProperty(problem, out var answer) && answer.GetProperty("content").TryGetProperty("application/problem+json", out _),
                $"{path} does not document a {problem} problem: {responses}");
    }

    [Fact]
    public async Task UnknownRoutesAndMethodsAreProblemsToo()
    {
        await Problems.AssertAsync(await _client.GetAsync("/api/v1/nothing-here"), HttpStatusCode.NotFound);
        await Problems.AssertAsync(await _client.PutAsync("/api/v1/datasets", new StringContent("{}")), HttpStatusCode.MethodNotAllowed);
    }

    [Fact]
    public async Task MapPageIsServedAtTheRoot()
    {
        var page = await _client.GetStringAsync("/");
        Assert.Contains("test map page", page);
    }

    [Fact]
    public async Task ResponsesAreGzippedWhenAskedAndCarryNoCorsHeadersByDefault()
    {
        using var request = new HttpRequestMessage(HttpMethod.Get, $"/api/v1/datasets/{SyntheticAtlas.CoastSlug}");
        request.Headers.AcceptEncoding.ParseAdd("gzip");
        request.Headers.Add("Origin", "http://elsewhere.invalid");
        var response = await _client.SendAsync(request);
        Assert.Equal("gzip", Assert.Single(response.Content.Headers.ContentEncoding));
        Assert.False(response.Headers.Contains("Access-Control-Allow-Origin"));
    }

    [Fact]
    public async Task ExpensiveEndpointsAreRateLimitedWithAProblem()
    {
        await using var strict = atlas.Create(new Dictionary<string, string?> { ["AtlasApiOptions:ExpensiveRequestsPerMinute"] = "2" });
        var client = strict.CreateClient();
        var url = $"/api/v1/datasets/{SyntheticAtlas.CoastSlug}/screen";
        Assert.Equal(HttpStatusCode.OK, (await client.GetAsync(url)).StatusCode);
        Assert.Equal(HttpStatusCode.OK, (await client.GetAsync(url)).StatusCode);
        var third = await client.GetAsync(url);
        await Problems.AssertAsync(third, HttpStatusCode.TooManyRequests, "Retry after");
        Assert.NotNull(third.Headers.RetryAfter);
        // The cheap endpoints stay available.
        Assert.Equal(HttpStatusCode.OK, (await client.GetAsync("/api/v1/datasets")).StatusCode);
    }
}
