namespace Atlas.Api.Data;

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
        if (configuration.GetConnectionString(ConfigurationName) is { Length: > 0 } configured)
            return Checked(configured, $"ConnectionStrings:{ConfigurationName}");
        if (AtlasDatabase.ConfiguredConnectionString is { } variable) Checked(variable, AtlasDatabase.ConnectionVariable);
        return AtlasDatabase.ResolveConnectionStringAsync().GetAwaiter().GetResult();
    }

    /// <summary>The read-only connection string, or null when reads share the writer's connection.</summary>
    public static string? ResolveRead(IConfiguration configuration) =>
        configuration.GetConnectionString(ReadConfigurationName) is { Length: > 0 } configured ? Checked(configured, $"ConnectionStrings:{ReadConfigurationName}")
        : Environment.GetEnvironmentVariable(ReadVariable) is { Length: > 0 } variable ? Checked(variable, ReadVariable)
        : null;

    /// <summary>Returns <paramref name="value"/> when Npgsql can parse it and it names a host; otherwise says which setting is wrong.</summary>
    public static string Checked(string value, string source)
    {
        string? problem;
        try
        {
            problem = string.IsNullOrWhiteSpace(new Npgsql.NpgsqlConnectionStringBuilder(value).Host) ? "it names no Host" : null;
        }
        catch (ArgumentException e)
        {
            problem = e.Message;
        }
        if (problem is null) return value;
        throw new InvalidOperationException(
            $"{source} is not a usable PostgreSQL connection string ({problem}). Expected the form Host=db.example.org;Port=5432;Username=atlas;Password=...;Database=atlas.");
    }
}
