namespace Atlas.Api.Data;

/// <summary>
/// The API's two connections. The plain <see cref="NpgsqlDataSource"/> that every read endpoint takes is the reader:
/// the connection string <c>ConnectionStrings:AtlasRead</c> or <c>ATLAS_DB_READ</c> (a role with SELECT only, see
/// db/V4__read_only_role.sql, or a streaming replica), else the writer. The writer, keyed <see cref="Writer"/>,
/// serves the write endpoints (uploads, job triggers, deletes), the layer cache fills and the migrations.
/// </summary>
public static class AtlasDataSources
{
    public const string Writer = "writer";

    public static IServiceCollection AddAtlasDataSources(this IServiceCollection services)
    {
        services.AddSingleton(sp => new DatabaseConnectionString(AtlasConnection.Resolve(sp.GetRequiredService<IConfiguration>())));
        services.AddSingleton(sp => new ReadConnectionString(AtlasConnection.ResolveRead(sp.GetRequiredService<IConfiguration>())));
        services.AddKeyedSingleton<NpgsqlDataSource>(Writer, (sp, _) =>
            AtlasDatabase.CreateDataSource(sp.GetRequiredService<DatabaseConnectionString>().Value));
        services.AddSingleton(sp => sp.GetRequiredService<ReadConnectionString>().Value is { } read
            ? AtlasDatabase.CreateDataSource(read)
            : sp.GetRequiredKeyedService<NpgsqlDataSource>(Writer));
        // Written on behalf of readers too: a job trigger, and a rendered layer stored by a GET.
        services.AddSingleton(sp => new JobQueue(sp.GetRequiredKeyedService<NpgsqlDataSource>(Writer)));
        services.AddSingleton(sp => new LayerCacheStore(sp.GetRequiredKeyedService<NpgsqlDataSource>(Writer)));
        return services;
    }
}

/// <summary>The read-only connection string, when one is configured.</summary>
public sealed record ReadConnectionString(string? Value);
