using Atlas.Storage;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.DependencyInjection.Extensions;

namespace Atlas.Ingest.Validation;

/// <summary>Registers station validation outside the API: <c>atlas validate</c> and <c>atlas demo</c>.</summary>
public static class ValidationRegistration
{
    /// <summary>
    /// Adds <see cref="ValidationService"/> with <see cref="StoredStationCells"/> and the distance limit bound from
    /// configuration (section <c>StationValidation</c>, the API's keys as fallback; checked at start); expects an <see cref="Npgsql.NpgsqlDataSource"/> to be registered.
    /// </summary>
    public static IServiceCollection AddStationValidation(this IServiceCollection services)
    {
        services.AddOptions<StationCellOptions>()
            .BindConfiguration(StationCellOptions.FallbackSection)
            .BindConfiguration(StationCellOptions.Section)
            .ValidateDataAnnotations()
            .ValidateOnStart();
        services.AddAtlasStores();
        services.TryAddSingleton<IStationCellFinder, StoredStationCells>();
        services.AddSingleton<ValidationService>();
        return services;
    }
}
