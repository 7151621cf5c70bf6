using System.CommandLine;
using Atlas.Ingest.Hosting;
using Atlas.Ingest.Worker;
using Atlas.Storage;
using Microsoft.AspNetCore.Builder;
using Microsoft.AspNetCore.Hosting;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Hosting;

namespace Atlas.Cli.Commands;

/// <summary>
/// <c>atlas worker</c>: run queued jobs until stopped (SIGTERM or Ctrl-C cancel the job in hand, which is rolled back
/// and put back in the queue), or with <c>--until-idle</c> until no job is queued or running. With <c>--metrics-urls</c> it also serves its job metrics for Prometheus at
/// <c>/metrics</c> there (and nothing else).
/// </summary>
public static class WorkerCommand
{
    public const string MetricsServiceName = "atlas-worker";

    public static Command Build()
    {
        var metricsUrls = new Option<string?>("--metrics-urls")
        {
            Description = "Serve the worker's job metrics at /metrics on these URLs (e.g. http://127.0.0.1:9464; ';' between several). Default: not served.",
        };
        var untilIdle = new Option<bool>("--until-idle") { Description = "Stop once no job is queued or running (a job of a worker that died is run first)" };
        var command = new Command("worker", "Claim and run queued ingest and statistics jobs (and parts of passes) until stopped.") { metricsUrls, untilIdle };
        command.Validators.Add(result =>
        {
            if (result.GetValue(metricsUrls) is { } urls && MetricsUrlProblem(urls) is { } problem) result.AddError(problem);
        });
        command.SetAction(async (parse, cancel) =>
        {
            var dataSource = await AtlasDatabase.OpenMigratedAsync(cancel: cancel);
            var urls = parse.GetValue(metricsUrls);
            var run = new WorkerRunOptions(parse.GetValue(untilIdle));
            using IHost host = urls is null ? BuildPlain(dataSource, run) : BuildWithMetrics(dataSource, urls, run);
            // Settings (the Statistics section) are checked before the start, so that a wrong one is named without the
            // host's failure log and its stack trace.
            if (CommandHost.Problems(host) is { } problems)
            {
                Console.Error.WriteLine($"atlas worker: not started: {problems}");
                return 2;
            }
            await host.RunAsync(cancel);
            return 0;
        });
        return command;
    }

    /// <summary>Null when every URL is an absolute http URL with a host and port; otherwise what is wrong.</summary>
    public static string? MetricsUrlProblem(string urls)
    {
        foreach (var url in urls.Split(';', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries))
            if (!Uri.TryCreate(url, UriKind.Absolute, out var uri) || uri.Scheme != "http" || uri.AbsolutePath != "/")
                return $"--metrics-urls: '{url}' is not an http URL of a host and port (such as http://127.0.0.1:9464).";
        return null;
    }

    private static IHost BuildPlain(Npgsql.NpgsqlDataSource dataSource, WorkerRunOptions run)
    {
        var builder = Host.CreateApplicationBuilder(CommandHost.ReadOnce());
        AddWorker(builder.Services, dataSource, run);
        return builder.Build();
    }

    private static IHost BuildWithMetrics(Npgsql.NpgsqlDataSource dataSource, string urls, WorkerRunOptions run)
    {
        var builder = WebApplication.CreateSlimBuilder(new WebApplicationOptions { Args = [$"--{CommandHost.ReloadOnChangeKey}=false"] });
        builder.WebHost.UseUrls(urls);
        AddWorker(builder.Services, dataSource, run);
        builder.Services.AddAtlasMetrics(MetricsServiceName);
        var app = builder.Build();
        app.MapAtlasMetrics();
        return app;
    }

    private static void AddWorker(IServiceCollection services, Npgsql.NpgsqlDataSource dataSource, WorkerRunOptions run)
    {
        services.AddSingleton(dataSource);
        services.AddSingleton(run);
        services.AddAtlasJobs();
        services.AddHostedService<QueueWorker>();
        services.Configure<HostOptions>(o => o.ShutdownTimeout = TimeSpan.FromSeconds(30));
    }
}
