using Atlas.Ingest.Hosting;

namespace Atlas.Api.Operations;

/// <summary>What an operator needs from the running API: metrics at <c>/metrics</c> and request ids in logs and headers.</summary>
public static class OperationsRegistration
{
    public const string ServiceName = "atlas-api";

    public static WebApplicationBuilder AddAtlasOperations(this WebApplicationBuilder builder)
    {
        builder.Services.AddAtlasMetrics(ServiceName);
        builder.Services.AddSingleton<JobQueueGauge>();
        return builder;
    }

    /// <summary>First in the pipeline, so that error responses carry the request id too.</summary>
    public static WebApplication UseAtlasOperations(this WebApplication app)
    {
        app.UseRequestIds();
        return app;
    }

    public static WebApplication MapOperationsApi(this WebApplication app)
    {
        // The gauge registers its instrument when first built; build it before the first scrape.
        app.Services.GetRequiredService<JobQueueGauge>();
        app.MapAtlasMetrics();
        return app;
    }
}
