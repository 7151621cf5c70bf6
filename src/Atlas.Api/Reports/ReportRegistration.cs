using Microsoft.Extensions.DependencyInjection.Extensions;

namespace Atlas.Api.Reports;

/// <summary>
/// The services a report needs, registered once for both hosts: <c>atlas serve</c> (through <c>AddAtlasApi</c>) and
/// <c>atlas report</c>, which builds the same report without HTTP. Expects the data source and the stores.
/// </summary>
public static class ReportRegistration
{
    public static IServiceCollection AddAtlasPointServices(this IServiceCollection services)
    {
        services.AddOptions<AtlasApiOptions>().BindConfiguration(nameof(AtlasApiOptions)).ValidateDataAnnotations().ValidateOnStart();
        services.AddMemoryCache();
        services.AddAtlasStores();
        services.TryAddSingleton<DatasetCatalog>();
        services.TryAddSingleton<ProvenanceBuilder>();
        services.TryAddSingleton<PointLocator>();
        services.TryAddSingleton<PointCalendars>();
        services.TryAddSingleton<Atlas.Ingest.Spectra.StationSpectraAnswers>();
        services.TryAddSingleton<OutputPoints>();
        services.TryAddSingleton<PointStatisticsService>();
        services.TryAddSingleton<PointAssessments>();
        services.TryAddSingleton<DryCellLand>();
        services.TryAddSingleton<IStationCellFinder, CatalogStationCells>();
        services.TryAddSingleton<ValidationService>();
        services.TryAddSingleton<CellFootprints>();
        services.TryAddSingleton<AreaStatisticsService>();
        services.TryAddSingleton<SiteReportService>();
        services.TryAddSingleton<AreaReportService>();
        return services;
    }
}
