using Atlas.Ingest.Statistics;
using Atlas.Ingest.Worker;
using Atlas.Statistics;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.DependencyInjection.Extensions;
using Microsoft.Extensions.Options;
using Npgsql;

namespace Atlas.Ingest.Hosting;

/// <summary>Registers the jobs and their options for the hosts: the worker, the command line and the API.</summary>
public static class IngestRegistration
{
    /// <summary>
    /// Adds the statistics options (<see cref="AddStatisticsOptions"/>) and the <see cref="JobRunner"/> that runs ingest
    /// and statistics jobs with them (through <see cref="Ingestion.HindcastIngestor"/> and <see cref="StatisticsService"/>).
    /// Expects an <see cref="NpgsqlDataSource"/> to be registered.
    /// </summary>
    public static IServiceCollection AddAtlasJobs(this IServiceCollection services)
    {
        services.AddStatisticsOptions();
        services.TryAddSingleton(sp => new JobRunner(sp.GetRequiredService<NpgsqlDataSource>(), sp.GetRequiredService<StatisticsOptions>()));
        services.TryAddSingleton(sp => new StatisticsPasses(sp.GetRequiredService<NpgsqlDataSource>(), sp.GetRequiredService<StatisticsOptions>()));
        services.TryAddSingleton(sp => new Ingestion.IngestInParts(sp.GetRequiredService<NpgsqlDataSource>(), sp.GetRequiredService<StatisticsOptions>()));
        return services;
    }

    /// <summary>
    /// Adds <see cref="StatisticsOptions"/> built from the configuration section <c>Statistics</c>
    /// (<see cref="StatisticsSettings"/>), checked at start: a wrong setting stops the host naming it.
    /// </summary>
    public static IServiceCollection AddStatisticsOptions(this IServiceCollection services)
    {
        services.AddOptions<StatisticsSettings>().BindConfiguration(StatisticsSettings.Section).ValidateOnStart();
        services.TryAddEnumerable(ServiceDescriptor.Singleton<IValidateOptions<StatisticsSettings>, StatisticsSettingsValidation>());
        services.TryAddSingleton(sp => sp.GetRequiredService<IOptions<StatisticsSettings>>().Value.ToOptions());
        return services;
    }
}
