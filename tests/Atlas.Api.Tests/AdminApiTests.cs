using System.Net;
using System.Text.Json;
using Atlas.Api.Infrastructure;
using Atlas.Api.Tests.Support;
using Atlas.Storage.Cells;
using Atlas.Storage.Datasets;

namespace Atlas.Api.Tests;

[Collection(AtlasApiCollection.Name)]
public sealed class AdminApiTests(AtlasApiFixture atlas)
{
    private readonly HttpClient _client = atlas.Factory.CreateClient();

    private static HttpRequestMessage Request(HttpMethod method, string url, string? key)
    {
        var request = new HttpRequestMessage(method, url);
        if (key is not null) request.Headers.Add("X-Api-Key", key);
        return request;
    }

    private async Task<(long Jobs, long Datasets, long Cells, long Statistics)> CountsAsync() => (
        await atlas.CountAsync("SELECT count(*) FROM job"), await atlas.CountAsync("SELECT count(*) FROM dataset"),
        await atlas.CountAsync("SELECT count(*) FROM cell"), await atlas.CountAsync("SELECT count(*) FROM cell_statistic"));

    [Fact]
    public async Task WritesWithoutAValidKeyAreRefusedAndChangeNothing()
    {
        var before = await CountsAsync();
        var jobs = $"/api/v1/datasets/{SyntheticAtlas.CoastSlug}/jobs";
        var dataset = $"/api/v1/datasets/{SyntheticAtlas.CoastSlug}";
        var missing = await _client.SendAsync(Request(HttpMethod.Post, jobs, null));
        await Problems.AssertAsync(missing, HttpStatusCode.Unauthorized, "X-Api-Key");
        Assert.NotEmpty(missing.Headers.WwwAuthenticate);
        await Problems.AssertAsync(await _client.SendAsync(Request(HttpMethod.Post, jobs, "wrong-key")), HttpStatusCode.Unauthorized, "not one this server accepts");
        await Problems.AssertAsync(await _client.SendAsync(Request(HttpMethod.Delete, dataset, "wrong-key")), HttpStatusCode.Unauthorized);
        await Problems.AssertAsync(await _client.SendAsync(Request(HttpMethod.Post, "/api/v1/datasets/missing/jobs", AtlasApiFixture.ApiKey)), HttpStatusCode.NotFound);
        await Problems.AssertAsync(await _client.SendAsync(Request(HttpMethod.Delete, "/api/v1/datasets/missing", AtlasApiFixture.ApiKey)), HttpStatusCode.NotFound);
        Assert.Equal(before, await CountsAsync());
    }

    [Fact]
    public async Task ServerWithoutKeysRefusesEveryWrite()
    {
        await using var closed = atlas.Create(new Dictionary<string, string?> { ["AtlasApiOptions:ApiKeySha256:0"] = null });
        var response = await closed.CreateClient().SendAsync(Request(HttpMethod.Post, $"/api/v1/datasets/{SyntheticAtlas.CoastSlug}/jobs", AtlasApiFixture.ApiKey));
        await Problems.AssertAsync(response, HttpStatusCode.Forbidden, "no API key configured");
    }

    [Fact]
    public async Task AConfiguredKeyInsteadOfItsDigestStopsStartUp()
    {
        await using var wrong = atlas.Create(new Dictionary<string, string?> { ["AtlasApiOptions:ApiKeySha256:0"] = "my-plain-key" });
        var error = Assert.ThrowsAny<Exception>(() => wrong.CreateClient());
        Assert.Contains("not a SHA-256 digest", error.ToString());
    }

    [Fact]
    public async Task StatisticsJobIsQueuedWithTheKeyAndItsStatusCanBeRead()
    {
        var response = await _client.SendAsync(Request(HttpMethod.Post, $"/api/v1/datasets/{SyntheticAtlas.CoastSlug}/jobs", AtlasApiFixture.ApiKey));
        Assert.Equal(HttpStatusCode.Accepted, response.StatusCode);
        var accepted = JsonDocument.Parse(await response.Content.ReadAsStringAsync()).RootElement;
        var id = accepted.GetProperty("job_id").GetInt64();
        Assert.Equal(1, await atlas.CountAsync($"SELECT count(*) FROM job WHERE job_id = {id} AND kind = 'statistics' AND state = 'queued' AND dataset_slug = '{SyntheticAtlas.CoastSlug}'"));
        var status = JsonDocument.Parse(await _client.GetStringAsync(response.Headers.Location!.ToString())).RootElement;
        Assert.Equal("queued", status.GetProperty("state").GetString());
        await atlas.CountAsync($"DELETE FROM job WHERE job_id = {id}");
    }

    /// <summary>A dataset of one wet cell, to be deleted.</summary>
    private async Task InsertThrowawayAsync(string slug, string title)
    {
        await using var connection = await atlas.DataSource.OpenConnectionAsync();
        await using var transaction = await connection.BeginTransactionAsync();
        var id = await DatasetStore.InsertAsync(connection, transaction, slug, title, "regular", 1, 1, 1, "{}", "{}", CancellationToken.None);
        await CellStore.InsertAsync(connection, id, [new CellRecord(0, 0, 0, 25, 45, 10, true)], CancellationToken.None);
        await transaction.CommitAsync();
    }

    [Fact]
    public async Task DeleteWithTheKeyRemovesTheDatasetAndEverythingStoredForIt()
    {
        const string slug = "test-throwaway";
        await InsertThrowawayAsync(slug, "Throwaway");
        Assert.Equal(HttpStatusCode.OK, (await _client.GetAsync($"/api/v1/datasets/{slug}")).StatusCode);
        var response = await _client.SendAsync(Request(HttpMethod.Delete, $"/api/v1/datasets/{slug}", AtlasApiFixture.ApiKey));
        Assert.Equal(HttpStatusCode.NoContent, response.StatusCode);
        Assert.Equal(0, await atlas.CountAsync($"SELECT count(*) FROM dataset WHERE slug = '{slug}'"));
        Assert.Equal(HttpStatusCode.NotFound, (await _client.GetAsync($"/api/v1/datasets/{slug}")).StatusCode);
    }

    [Fact]
    public async Task DeleteWhileAJobOfTheDatasetRunsIsAConflictAndChangesNothing()
    {
        const string slug = "test-busy-throwaway";
        await InsertThrowawayAsync(slug, "Busy throwaway");
        var queue = new Atlas.Storage.Jobs.JobQueue(atlas.DataSource);
        var job = await queue.EnqueueAsync(Atlas.Storage.Jobs.JobKind.Statistics, slug);
        Assert.NotNull(await queue.ClaimAsync(job, "test-worker"));

        await Problems.AssertAsync(await _client.SendAsync(Request(HttpMethod.Delete, $"/api/v1/datasets/{slug}", AtlasApiFixture.ApiKey)),
            HttpStatusCode.Conflict, $"job {job} of it is running");
        Assert.Equal(1, await atlas.CountAsync($"SELECT count(*) FROM dataset WHERE slug = '{slug}'"));
        Assert.Equal(1, await atlas.CountAsync($"SELECT count(*) FROM cell c JOIN dataset d USING (dataset_id) WHERE d.slug = '{slug}'"));

        await queue.FailAsync(job, "ended by the test");
        Assert.Equal(HttpStatusCode.NoContent, (await _client.SendAsync(Request(HttpMethod.Delete, $"/api/v1/datasets/{slug}", AtlasApiFixture.ApiKey))).StatusCode);
        Assert.Equal(0, await atlas.CountAsync($"SELECT count(*) FROM job WHERE dataset_slug = '{slug}'"));
    }
}
