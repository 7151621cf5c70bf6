namespace Atlas.Api.Model;

/// <summary>The process answers.</summary>
public sealed record Liveness(string Status);

/// <summary>The database answers; how many schema migrations are applied of those this build carries.</summary>
public sealed record Readiness(string Status, string Database, int MigrationsApplied, int MigrationsAvailable);
