using Microsoft.AspNetCore.Builder;
using Microsoft.AspNetCore.Http;
using Microsoft.AspNetCore.Routing;
using Microsoft.Extensions.DependencyInjection;
using OpenTelemetry.Metrics;
using OpenTelemetry.Resources;

namespace Atlas.Ingest.Hosting;

/// <summary>
/// OpenTelemetry metrics with a Prometheus scrape endpoint at <c>/metrics</c>: the ASP.NET Core request metrics
/// (<c>http.server.request.duration</c> and friends) and every meter whose name starts with <c>Atlas.</c> (job
/// counters where jobs run in the process, the API's job queue gauge). Shared by the two hosts that serve metrics:
/// the API and the worker (<c>atlas worker --metrics-urls</c>), which does not carry the web project.
/// </summary>
public static class AtlasMetrics
{
    public const string ScrapePath = "/metrics";
    public const string MeterPrefix = "Atlas.*";

    public static IServiceCollection AddAtlasMetrics(this IServiceCollection services, string serviceName)
    {
        services.AddOpenTelemetry()
            .ConfigureResource(resource => resource.AddService(serviceName, serviceVersion: typeof(AtlasMetrics).Assembly.GetName().Version?.ToString()))
            .WithMetrics(metrics => metrics
                .AddAspNetCoreInstrumentation()
                .AddMeter("Microsoft.AspNetCore.Server.Kestrel")
                .AddMeter(MeterPrefix)
                .AddPrometheusExporter());
        return services;
    }

    /// <summary>Maps the scrape endpoint; it is left out of the rate limits so a scraper is never throttled.</summary>
    public static IEndpointRouteBuilder MapAtlasMetrics(this IEndpointRouteBuilder routes)
    {
        routes.MapPrometheusScrapingEndpoint(ScrapePath).DisableRateLimiting().ExcludeFromDescription();
        return routes;
    }
}
