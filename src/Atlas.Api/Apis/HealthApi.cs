namespace Atlas.Api.Apis;

/// <summary><c>/healthz</c> (the process answers) and <c>/readyz</c> (the database answers and its schema is current).</summary>
public static class HealthApi
{
    public static IEndpointRouteBuilder MapHealthApi(this IEndpointRouteBuilder routes)
    {
        routes.MapGet("/healthz", () => TypedResults.Ok(new Liveness("ok"))).WithTags("Health").WithName("Liveness")
            .WithSummary("The process is up (it does not touch the database)");
        routes.MapGet("/readyz", ReadinessAsync).WithTags("Health")
            .ProducesProblems(StatusCodes.Status503ServiceUnavailable);
        return routes;
    }

    [EndpointName("Readiness")]
    [EndpointSummary("The database answers and every schema migration is applied")]
    public static async Task<Results<Ok<Readiness>, ProblemHttpResult>> ReadinessAsync(NpgsqlDataSource dataSource, CancellationToken cancel)
    {
        var available = SchemaMigrator.AvailableMigrationCount;
        IReadOnlyList<string> applied;
        try
        {
            await using var ping = dataSource.CreateCommand("SELECT 1");
            await ping.ExecuteScalarAsync(cancel);
            applied = await SchemaMigrator.AppliedVersionsAsync(dataSource, cancel);
        }
        catch (Exception e) when (DatabaseOutage.Is(e))
        {
            return TypedResults.Problem(statusCode: 503, title: "Not ready: the database is unavailable",
                detail: $"The database cannot be reached ({e.Message}). Start it (atlas db start) or fix the connection string.");
        }
        if (applied.Count < available)
            return TypedResults.Problem(statusCode: 503, title: "Not ready: the schema is behind",
                detail: $"{applied.Count} of {available} schema migrations are applied. Run atlas db migrate (or restart the server, which migrates at start-up).");
        return TypedResults.Ok(new Readiness("ready", "ok", applied.Count, available));
    }
}
