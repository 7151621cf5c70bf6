using Atlas.Storage;

namespace Atlas.Api.Infrastructure;

/// <summary>
/// Which database the API uses: the connection string <c>ConnectionStrings:Atlas</c> from configuration, else the
/// ATLAS_DB environment variable, else the embedded cluster (started on first use). Reads may go through a
/// second, read-only connection: <c>ConnectionStrings:AtlasRead</c>, else ATLAS_DB_READ.
/// </summary>
public static class AtlasConnection
{
    public const string ConfigurationName = "Atlas";
    public const string ReadConfigurationName = "AtlasRead";
    public const string ReadVariable = "ATLAS_DB_READ";

    public static string Resolve(IConfiguration configuration)
    {
        if (configuration.GetConnectionString(ConfigurationName) is { Length: > 0 } configured) return configured;
        return AtlasDatabase.ResolveConnectionStringAsync().GetAwaiter().GetResult();
    }

    /// <summary>The read-only connection string, or null when reads share the writer's connection.</summary>
    public static string? ResolveRead(IConfiguration configuration) =>
        configuration.GetConnectionString(ReadConfigurationName) is { Length: > 0 } configured ? configured
        : Environment.GetEnvironmentVariable(ReadVariable) is { Length: > 0 } variable ? variable
        : null;
}
