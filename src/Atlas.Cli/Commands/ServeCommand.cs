using System.CommandLine;
using Atlas.Api;
using Microsoft.Extensions.Options;

namespace Atlas.Cli.Commands;

/// <summary><c>atlas serve</c>: the API and the map page, where ASPNETCORE_URLS says (default http://127.0.0.1:5080).</summary>
public static class ServeCommand
{
    public const string DefaultUrl = "http://127.0.0.1:5080";

    public static Command Build()
    {
        var command = new Command("serve", "Serve the REST API and the map page.");
        command.SetAction(async (_, cancel) =>
        {
            try
            {
                await RunAsync(null, cancel);
                return 0;
            }
            catch (Exception e) when (e is OptionsValidationException or InvalidOperationException && !cancel.IsCancellationRequested)
            {
                // Settings are checked at start-up; say which one is wrong, without a stack trace.
                Console.Error.WriteLine($"atlas serve: not started: {e.Message}");
                return 2;
            }
        });
        return command;
    }

    public static string Url => Environment.GetEnvironmentVariable("ASPNETCORE_URLS") is { Length: > 0 } urls ? urls.Split(';')[0] : DefaultUrl;

    public static async Task RunAsync(Action<string>? onStarted, CancellationToken cancel)
    {
        var args = Environment.GetEnvironmentVariable("ASPNETCORE_URLS") is { Length: > 0 } ? Array.Empty<string>() : ["--urls", DefaultUrl];
        await Atlas.Storage.AtlasDatabase.ResolveConnectionStringAsync(cancel);
        var app = ApiHost.Build(args);
        await app.StartAsync(cancel);
        Console.WriteLine($"atlas: serving {Url}/ (API at {Url}/api/v1, documentation at {Url}/swagger); Ctrl-C stops");
        onStarted?.Invoke(Url);
        await app.WaitForShutdownAsync(cancel);
    }
}
