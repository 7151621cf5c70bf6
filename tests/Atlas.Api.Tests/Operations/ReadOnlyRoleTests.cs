using System.Net;
using System.Text;
using Atlas.Api.Tests.Support;
using Npgsql;

namespace Atlas.Api.Tests.Operations;

/// <summary>
/// The API run as db/V4__read_only_role.sql intends: reads through a login role that is a member of atlas_reader,
/// writes through the writer's connection. Each test class makes its own login role (roles are cluster-wide) and
/// drops it at the end.
/// </summary>
[Collection(AtlasApiCollection.Name)]
public sealed class ReadOnlyRoleTests(AtlasApiFixture atlas) : IAsyncLifetime
{
    private readonly string _role = "atlas_test_reader_" + Guid.NewGuid().ToString("N")[..10];
    private string ReaderConnectionString => new NpgsqlConnectionStringBuilder(atlas.ConnectionString) { Username = _role, Pooling = false }.ConnectionString;

    public async Task InitializeAsync()
    {
        await using var command = atlas.DataSource.CreateCommand($"CREATE ROLE {_role} LOGIN IN ROLE atlas_reader");
        await command.ExecuteNonQueryAsync();
    }

    public async Task DisposeAsync()
    {
        NpgsqlConnection.ClearAllPools();
        await using var command = atlas.DataSource.CreateCommand($"DROP ROLE IF EXISTS {_role}");
        await command.ExecuteNonQueryAsync();
    }

    [Fact]
    public async Task TheReaderRoleCanInsertUpdateDeleteOrTruncateNoTable()
    {
        var tables = new List<(string Table, string Column)>();
        await using (var list = atlas.DataSource.CreateCommand("""
            SELECT t.tablename, (SELECT a.attname FROM pg_attribute a WHERE a.attrelid = format('public.%I', t.tablename)::regclass AND a.attnum > 0
                       AND NOT a.attisdropped AND a.attidentity = '' AND a.attgenerated = '' ORDER BY a.attnum LIMIT 1)
              FROM pg_tables t WHERE t.schemaname = 'public' ORDER BY 1
            """))
        await using (var reader = await list.ExecuteReaderAsync())
            while (await reader.ReadAsync()) tables.Add((reader.GetString(0), reader.GetString(1)));
        Assert.Contains(tables, t => t.Table == "series_chunk" || t.Table.StartsWith("series", StringComparison.Ordinal));
        Assert.Contains(tables, t => t.Table == "job");

        await using var connection = new NpgsqlConnection(ReaderConnectionString);
        await connection.OpenAsync();
        foreach (var (table, column) in tables)
        {
            // SELECT works on every table; each change is refused for lack of privilege (SQLSTATE 42501), not by a constraint.
            await using (var select = new NpgsqlCommand($"SELECT count(*) FROM \"{table}\"", connection)) await select.ExecuteScalarAsync();
            foreach (var change in new[]
                     {
                         $"INSERT INTO \"{table}\" DEFAULT VALUES", $"UPDATE \"{table}\" SET \"{column}\" = \"{column}\"",
                         $"DELETE FROM \"{table}\"", $"TRUNCATE \"{table}\"",
                     })
            {
                await using var command = new NpgsqlCommand(change, connection);
                var refused = await Assert.ThrowsAsync<PostgresException>(() => command.ExecuteNonQueryAsync());
                Assert.True(refused.SqlState == PostgresErrorCodes.InsufficientPrivilege, $"{change}: {refused.SqlState} {refused.MessageText}");
            }
        }
        await using var create = new NpgsqlCommand("CREATE TABLE reader_was_here (x int)", connection);
        Assert.Equal(PostgresErrorCodes.InsufficientPrivilege, (await Assert.ThrowsAsync<PostgresException>(() => create.ExecuteNonQueryAsync())).SqlState);
    }

    [Fact]
    public async Task ReadEndpointsAnswerThroughTheReadOnlyConnection()
    {
        await using var api = atlas.Create(new Dictionary<string, string?> { ["ConnectionStrings:AtlasRead"] = ReaderConnectionString });
        var client = api.CreateClient();
        var coast = $"/api/v1/datasets/{SyntheticAtlas.CoastSlug}";
        foreach (var url in new[]
                 {
                     "/readyz", "/api/v1/datasets", coast, $"{coast}/point?lat=40.45&lon=20.45", $"{coast}/point?lat=40.45&lon=20.45&format=csv",
                     $"{coast}/point/series?lat=40.45&lon=20.45&format=csv", $"{coast}/layers", $"{coast}/layers/hs/mean/annual.csv",
                     $"{coast}/layers/j/mean/djf.tif", $"{coast}/layers/hs/mean/annual.geojson", $"{coast}/land",
                     $"{coast}/screen?min_power_kw_m=1", "/api/v1/stations", "/api/v1/devices",
                     $"{coast}/point/windows?lat=40.45&lon=20.45&hs_max=2&hours=12", $"{coast}/point/extremes?lat=40.45&lon=20.45",
                     // Assessment layers are rendered on a read and cached through the writer.
                     $"{coast}/layers/accessibility.csv?hs_max=2", $"{coast}/layers/accessibility.json?hs_max=1.5&hours=12",
                 })
        {
            var response = await client.GetAsync(url);
            Assert.True(response.StatusCode == HttpStatusCode.OK, $"{url}: {(int)response.StatusCode} {await response.Content.ReadAsStringAsync()}");
        }
        var area = await client.PostAsync($"{coast}/area?parameter=j&statistic=mean&period=annual",
            new StringContent("""{"type":"Polygon","coordinates":[[[20.12,40.13],[20.71,40.21],[20.64,40.77],[20.18,40.69],[20.12,40.13]]]}""", Encoding.UTF8, "application/geo+json"));
        Assert.Equal(HttpStatusCode.OK, area.StatusCode);
    }

    [Fact]
    public async Task WritesGoThroughTheWriterWhileReadsUseTheReader()
    {
        await using var api = atlas.Create(new Dictionary<string, string?> { ["ConnectionStrings:AtlasRead"] = ReaderConnectionString });
        var client = api.CreateClient();
        var before = await atlas.CountAsync("SELECT count(*) FROM job");
        using var job = new HttpRequestMessage(HttpMethod.Post, $"/api/v1/datasets/{SyntheticAtlas.CoastSlug}/jobs");
        job.Headers.Add("X-Api-Key", AtlasApiFixture.ApiKey);
        Assert.Equal(HttpStatusCode.Accepted, (await client.SendAsync(job)).StatusCode);
        Assert.Equal(before + 1, await atlas.CountAsync("SELECT count(*) FROM job"));

        using var device = new HttpRequestMessage(HttpMethod.Post, "/api/v1/devices?name=Reader%20Split%20Device")
        {
            Content = new StringContent("hs_m\\te_s,6,8\n1,10,20\n2,30,40\n", Encoding.UTF8, "text/csv"),
        };
        device.Headers.Add("X-Api-Key", AtlasApiFixture.ApiKey);
        var stored = await client.SendAsync(device);
        Assert.True(stored.StatusCode == HttpStatusCode.Created, await stored.Content.ReadAsStringAsync());
        Assert.Equal(HttpStatusCode.OK, (await client.GetAsync("/api/v1/devices/reader-split-device")).StatusCode);
        using var remove = new HttpRequestMessage(HttpMethod.Delete, "/api/v1/devices/reader-split-device");
        remove.Headers.Add("X-Api-Key", AtlasApiFixture.ApiKey);
        Assert.Equal(HttpStatusCode.NoContent, (await client.SendAsync(remove)).StatusCode);
    }
}
