using Atlas.Ingest.Hosting;
using Atlas.Ingest.Validation;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Options;
using Npgsql;

namespace Atlas.Cli.Commands;

/// <summary>
/// The services of a command that runs without the web host (ingest, stats, demo, validate), registered as the
/// worker registers them: configuration from appsettings.json and environment variables, each component's options
/// bound from its own section and checked before the command does anything.
/// </summary>
public static class CommandHost
{
    /// <summary>The host, built but not started (nothing runs in the background, and its start-up lines would mix with the output).</summary>
    /// <param name="more">Services a command adds to the common ones (<c>atlas report</c> adds the point and report services of the API).</param>
    public static IHost Build(NpgsqlDataSource dataSource, Action<IServiceCollection>? more = null)
    {
        var builder = Host.CreateApplicationBuilder(ReadOnce());
        builder.Services.AddSingleton(dataSource);
        builder.Services.AddAtlasJobs();
        builder.Services.AddStationValidation();
        more?.Invoke(builder.Services);
        return builder.Build();
    }

    /// <summary>
    /// Host settings that read the configuration once: no watcher on appsettings.json, which would watch every folder
    /// under the current one (a repository, say) for the whole run. Commands and the worker read their settings at start.
    /// </summary>
    public static HostApplicationBuilderSettings ReadOnce()
    {
        var settings = new HostApplicationBuilderSettings { Configuration = new ConfigurationManager() };
        settings.Configuration.AddInMemoryCollection([new(ReloadOnChangeKey, "false")]);
        return settings;
    }

    /// <summary>The host setting that turns the configuration file watcher on or off.</summary>
    public const string ReloadOnChangeKey = "hostBuilder:reloadConfigOnChange";

    /// <summary>
    /// Runs the checks a start would run on every option validated at start; null when all pass, otherwise what is
    /// wrong, each setting named.
    /// </summary>
    public static string? Problems(IHost host)
    {
        try
        {
            host.Services.GetRequiredService<IStartupValidator>().Validate();
            return null;
        }
        catch (OptionsValidationException e)
        {
            return string.Join("; ", e.Failures);
        }
        catch (AggregateException e) when (e.InnerExceptions.All(i => i is OptionsValidationException))
        {
            return string.Join("; ", e.InnerExceptions.SelectMany(i => ((OptionsValidationException)i).Failures));
        }
        catch (InvalidOperationException e)
        {
            // A value the binder cannot convert (a word where a number belongs, an unknown spectrum) names its key.
            return e.Message;
        }
    }

    /// <summary>Builds the host and checks its options; on a problem, says so as <paramref name="command"/> and gives null.</summary>
    public static IHost? BuildChecked(NpgsqlDataSource dataSource, string command, Action<IServiceCollection>? more = null)
    {
        var host = Build(dataSource, more);
        if (Problems(host) is not { } problems) return host;
        host.Dispose();
        Console.Error.WriteLine($"atlas {command}: not started: {problems}");
        return null;
    }
}
