using System.CommandLine;
using Atlas.Ingest.Worker;
using Atlas.Storage;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Hosting;

namespace Atlas.Cli.Commands;

/// <summary><c>atlas worker</c>: run queued jobs until stopped (SIGTERM or Ctrl-C finish cleanly).</summary>
public static class WorkerCommand
{
    public static Command Build()
    {
        var command = new Command("worker", "Claim and run queued ingest and statistics jobs until stopped.");
        command.SetAction(async (_, cancel) =>
        {
            var dataSource = await AtlasDatabase.OpenMigratedAsync(cancel: cancel);
            var builder = Host.CreateApplicationBuilder();
            builder.Services.AddSingleton(dataSource);
            builder.Services.AddHostedService<QueueWorker>();
            builder.Services.Configure<HostOptions>(o => o.ShutdownTimeout = TimeSpan.FromSeconds(30));
            using var host = builder.Build();
            await host.RunAsync(cancel);
            return 0;
        });
        return command;
    }
}
