using System.Net;
using System.Text.Json;
using Atlas.Api.Operations;
using Atlas.Api.Tests.Support;
using Microsoft.AspNetCore.Hosting;
using Microsoft.AspNetCore.Mvc.Testing;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Logging;

namespace Atlas.Api.Tests.Operations;

[Collection(AtlasApiCollection.Name)]
public sealed class RequestIdTests(AtlasApiFixture atlas)
{
    [Fact]
    public async Task EveryResponseEchoesItsRequestIdAndProblemsCarryTheSameId()
    {
        var client = atlas.Factory.CreateClient();
        var response = await client.GetAsync("/api/v1/datasets/no-such-coast");
        Assert.Equal(HttpStatusCode.NotFound, response.StatusCode);
        var id = Assert.Single(response.Headers.GetValues(RequestIds.HeaderName));
        Assert.False(string.IsNullOrWhiteSpace(id));
        var problem = JsonDocument.Parse(await response.Content.ReadAsStringAsync()).RootElement;
        Assert.Equal(id, problem.GetProperty("trace_id").GetString());
    }

    [Fact]
    public async Task ASaneIncomingRequestIdIsAdoptedAndScopesTheLogsOfThatRequest()
    {
        var logs = new CapturedLogs();
        await using var factory = WithLogs(logs);
        var client = factory.CreateClient();
        using var request = new HttpRequestMessage(HttpMethod.Post, $"/api/v1/datasets/{SyntheticAtlas.CoastSlug}/jobs");
        request.Headers.Add(RequestIds.HeaderName, "proxy-7f3a.2:b_9");
        request.Headers.Add("X-Api-Key", AtlasApiFixture.ApiKey);
        var response = await client.SendAsync(request);
        Assert.Equal("proxy-7f3a.2:b_9", Assert.Single(response.Headers.GetValues(RequestIds.HeaderName)));
        Assert.Equal(HttpStatusCode.Accepted, response.StatusCode);
        var queued = Assert.Single(logs.Entries, e => e.Message.Contains("queued", StringComparison.Ordinal));
        Assert.Contains(queued.Scope, p => p.Key == "RequestId" && Equals(p.Value, "proxy-7f3a.2:b_9"));
    }

    [Theory]
    [InlineData("<script>alert(1)</script>")]
    [InlineData("id with spaces")]
    [InlineData("0123456789012345678901234567890123456789012345678901234567890123456789")]
    [InlineData("ÿ-latin1")]
    public async Task AMalformedIncomingRequestIdIsReplacedByTheServersOwn(string sent)
    {
        var client = atlas.Factory.CreateClient();
        using var request = new HttpRequestMessage(HttpMethod.Get, "/healthz");
        request.Headers.TryAddWithoutValidation(RequestIds.HeaderName, sent);
        var response = await client.SendAsync(request);
        Assert.Equal(HttpStatusCode.OK, response.StatusCode);
        var id = Assert.Single(response.Headers.GetValues(RequestIds.HeaderName));
        Assert.NotEqual(sent, id);
        Assert.True(RequestIds.IsAcceptable(id), id);
    }

    private WebApplicationFactory<Program> WithLogs(CapturedLogs logs) =>
        atlas.Factory.WithWebHostBuilder(host => host.ConfigureServices(services =>
            services.AddLogging(logging => logging.AddProvider(logs).SetMinimumLevel(LogLevel.Information))));
}
