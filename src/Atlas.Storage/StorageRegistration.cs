using Atlas.Storage.Cells;
using Atlas.Storage.Datasets;
using Atlas.Storage.Queries;
using Atlas.Storage.Series;
using Atlas.Storage.Spectra;
using Atlas.Storage.Stations;
using Atlas.Storage.Statistics;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.DependencyInjection.Extensions;

namespace Atlas.Storage;

/// <summary>
/// Registers the stores and queries, each once, over the <see cref="Npgsql.NpgsqlDataSource"/> the host registers: the
/// web host and the command line hosts share this list, and a second call adds nothing.
/// </summary>
public static class StorageRegistration
{
    /// <summary>The stores and queries: each takes the data source and keeps no state of its own.</summary>
    public static IReadOnlyList<Type> Stores { get; } =
    [
        typeof(DatasetStore), typeof(CellStore), typeof(SeriesStore), typeof(StatisticsStore), typeof(StationStore), typeof(StationSpectraStore),
        typeof(AreaQueries), typeof(ScreeningQueries), typeof(DatasetGeometryQueries),
    ];

    public static IServiceCollection AddAtlasStores(this IServiceCollection services)
    {
        foreach (var store in Stores) services.TryAddSingleton(store);
        return services;
    }
}
