using Atlas.Storage;

namespace Atlas.Api.Infrastructure;

/// <summary>
/// Which database the API uses: the connection string <c>ConnectionStrings:Atlas</c> from configuration, else the
/// ATLAS_DB environment variable, else the embedded cluster (started on first use).
/// </summary>
public static class AtlasConnection
{
    public const string ConfigurationName = "Atlas";

    public static string Resolve(IConfiguration configuration)
    {
        if (configuration.GetConnectionString(ConfigurationName) is { Length: > 0 } configured) return configured;
        return AtlasDatabase.ResolveConnectionStringAsync().GetAwaiter().GetResult();
    }
}
