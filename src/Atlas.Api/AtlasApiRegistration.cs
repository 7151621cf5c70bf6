using Atlas.Ingest.Hosting;
using Microsoft.AspNetCore.Cors.Infrastructure;
using Microsoft.AspNetCore.RateLimiting;
using Microsoft.AspNetCore.ResponseCompression;
using Microsoft.AspNetCore.Server.Kestrel.Core;
using Microsoft.Extensions.FileProviders;
using Microsoft.OpenApi;

namespace Atlas.Api;

/// <summary>The one place where the API's services and middleware are registered.</summary>
public static partial class AtlasApiRegistration
{
    public static WebApplicationBuilder AddAtlasApi(this WebApplicationBuilder builder)
    {
        // Defaults beneath every other source (appsettings, environment, command line), which may still lower them: a
        // line per request at Information buries the start-up and warning lines in a terminal, and requests are
        // counted at /metrics anyway.
        builder.Configuration.Sources.Insert(0, new Microsoft.Extensions.Configuration.Memory.MemoryConfigurationSource
        {
            InitialData = new Dictionary<string, string?> { ["Logging:LogLevel:Microsoft.AspNetCore"] = "Warning" },
        });
        var services = builder.Services;
        services.AddStatisticsOptions();

        services.AddAtlasDataSources();
        builder.AddAtlasOperations();
        services.AddAtlasPointServices();
        services.AddSingleton<LayerRenderer>();
        services.AddSingleton<PointResponseCache>();
        services.AddSingleton<ApiKeyVerifier>();
        services.AddHostedService<SchemaStartup>();
        services.AddHostedService<DatasetWarmup>();

        services.ConfigureHttpJsonOptions(json =>
        {
            json.SerializerOptions.PropertyNamingPolicy = JsonNamingPolicy.SnakeCaseLower;
            json.SerializerOptions.NumberHandling = System.Text.Json.Serialization.JsonNumberHandling.AllowNamedFloatingPointLiterals;
            json.SerializerOptions.Converters.Add(new System.Text.Json.Serialization.JsonStringEnumConverter(JsonNamingPolicy.SnakeCaseLower));
            json.SerializerOptions.Converters.Add(new NetTopologySuite.IO.Converters.GeoJsonConverterFactory());
        });
        services.AddProblemDetails(problem => problem.CustomizeProblemDetails = context =>
        {
            context.ProblemDetails.Instance ??= context.HttpContext.Request.Path;
            context.ProblemDetails.Extensions["trace_id"] = context.HttpContext.TraceIdentifier;
        });
        services.AddExceptionHandler<ProblemExceptionHandler>();
        // Options are read when first needed (not here), so that settings added after this call, as tests do, apply.
        services.AddRateLimiter(_ => { });
        services.AddOptions<RateLimiterOptions>().Configure<IOptions<AtlasApiOptions>>((limiter, options) => RateLimits.Configure(limiter, options.Value));
        services.AddResponseCompression(compression =>
        {
            compression.EnableForHttps = true;
            compression.Providers.Add<BrotliCompressionProvider>();
            compression.Providers.Add<GzipCompressionProvider>();
            compression.MimeTypes = ResponseCompressionDefaults.MimeTypes.Concat(
                // GeoTIFF tiles, NetCDF-4 variables and PNG are compressed already; GeoTIFF must also stay byte-addressable for range reads.
                ["text/csv", "application/geo+json", "application/problem+json"]);
        });
        services.Configure<GzipCompressionProviderOptions>(gzip => gzip.Level = CompressionLevel.Fastest);
        services.Configure<BrotliCompressionProviderOptions>(brotli => brotli.Level = CompressionLevel.Fastest);
        services.AddCors();
        services.AddOptions<CorsOptions>().Configure<IOptions<AtlasApiOptions>>((cors, options) => cors.AddDefaultPolicy(policy =>
            policy.WithOrigins(options.Value.CorsOrigins).WithMethods("GET", "POST").WithHeaders("Content-Type", ApiKeyVerifier.HeaderName)));
        services.AddOptions<KestrelServerOptions>().Configure<IOptions<AtlasApiOptions>>((kestrel, options) =>
            kestrel.Limits.MaxRequestBodySize = options.Value.MaxRequestBodyBytes);

        services.AddEndpointsApiExplorer();
        services.AddSwaggerGen(swagger =>
        {
            swagger.SwaggerDoc("v1", new OpenApiInfo
            {
                Title = "Wave-resource atlas API",
                Version = "v1",
                Description = ApiDocumentation.Overview,
            });
            swagger.AddSecurityDefinition("ApiKey", new OpenApiSecurityScheme
            {
                Type = SecuritySchemeType.ApiKey,
                In = ParameterLocation.Header,
                Name = ApiKeyVerifier.HeaderName,
                Description = "Needed by write endpoints only. The server stores SHA-256 digests of its keys.",
            });
        });
        return builder;
    }

    /// <summary>Middleware order: errors first, then compression, CORS (only when origins are configured), limits, files.</summary>
    public static WebApplication UseAtlasPipeline(this WebApplication app)
    {
        var options = app.Services.GetRequiredService<IOptions<AtlasApiOptions>>().Value;
        app.UseAtlasOperations();
        app.UseExceptionHandler();
        app.UseStatusCodePages();
        app.UseResponseCompression();
        if (options.CorsOrigins.Length > 0) app.UseCors();
        app.UseRateLimiter();
        app.UseSwagger();
        app.UseSwaggerUI(ui =>
        {
            ui.RoutePrefix = "swagger";
            ui.SwaggerEndpoint("/swagger/v1/swagger.json", "Wave-resource atlas API v1");
        });

        var webRoot = WebRootLocator.Locate(options, app.Environment.ContentRootPath);
        var logger = app.Services.GetRequiredService<ILoggerFactory>().CreateLogger("Atlas.Api.WebRoot");
        if (Directory.Exists(webRoot))
        {
            ServingWebRoot(logger, webRoot);
            var files = new PhysicalFileProvider(webRoot);
            app.UseDefaultFiles(new DefaultFilesOptions { FileProvider = files });
            app.UseStaticFiles(new StaticFileOptions { FileProvider = files });
        }
        else
        {
            NoWebRoot(logger, webRoot);
        }
        return app;
    }

    [LoggerMessage(EventId = 5, Level = LogLevel.Information, Message = "Serving the map page from {Folder}")]
    private static partial void ServingWebRoot(ILogger logger, string folder);

    [LoggerMessage(EventId = 6, Level = LogLevel.Warning, Message = "No map page folder found (looked for {Folder}); only the API is served")]
    private static partial void NoWebRoot(ILogger logger, string folder);
}
