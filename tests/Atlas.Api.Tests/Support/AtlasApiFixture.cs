using Atlas.Api.Infrastructure;
using Atlas.Api.Security;
using Atlas.TestSupport;
using Microsoft.AspNetCore.Hosting;
using Microsoft.AspNetCore.Mvc.Testing;
using Npgsql;

namespace Atlas.Api.Tests.Support;

/// <summary>
/// One migrated test database holding the synthetic atlas, and the API running in memory against it (its
/// connection string given through configuration). Shared by every test class of the collection; tests that
/// write (delete, jobs) use their own rows.
/// </summary>
public sealed class AtlasApiFixture : IAsyncLifetime
{
    public const string ApiKey = "test-key-for-the-api-tests";

    private readonly TestDatabase _database = new();

    public WebApplicationFactory<Program> Factory { get; private set; } = null!;
    public string WorkFolder { get; } = Directory.CreateTempSubdirectory("atlas-api-tests-").FullName;
    public string WebRoot => Path.Combine(WorkFolder, "wwwroot");
    public NpgsqlDataSource DataSource => _database.DataSource;
    public string ConnectionString => _database.ConnectionString;

    public async Task InitializeAsync()
    {
        await _database.InitializeAsync();
        Directory.CreateDirectory(WebRoot);
        await File.WriteAllTextAsync(Path.Combine(WebRoot, "index.html"), "<!doctype html><title>map page</title><p>test map page</p>");
        await SyntheticAtlas.SeedAsync(DataSource, WorkFolder);
        Factory = Create(new Dictionary<string, string?>());
    }

    /// <summary>The API with the test settings plus <paramref name="settings"/> (configuration keys).</summary>
    public WebApplicationFactory<Program> Create(IReadOnlyDictionary<string, string?> settings) =>
        new WebApplicationFactory<Program>().WithWebHostBuilder(host =>
        {
            host.UseEnvironment("Production");
            host.UseSetting("ConnectionStrings:Atlas", ConnectionString);
            host.UseSetting("AtlasApiOptions:ApiKeySha256:0", ApiKeyVerifier.DigestOf(ApiKey));
            host.UseSetting("AtlasApiOptions:WebRootPath", WebRoot);
            host.UseSetting("AtlasApiOptions:ExpensiveRequestsPerMinute", "100000");
            foreach (var (key, value) in settings) host.UseSetting(key, value);
        });

    public async Task<long> CountAsync(string sql)
    {
        await using var command = DataSource.CreateCommand(sql);
        return Convert.ToInt64(await command.ExecuteScalarAsync());
    }

    public async Task DisposeAsync()
    {
        await Factory.DisposeAsync();
        await _database.DisposeAsync();
        Directory.Delete(WorkFolder, recursive: true);
    }
}

[CollectionDefinition(Name)]
public sealed class AtlasApiCollection : ICollectionFixture<AtlasApiFixture>
{
    public const string Name = "atlas api";
}
