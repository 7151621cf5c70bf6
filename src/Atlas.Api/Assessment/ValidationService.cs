using Atlas.Api.Infrastructure;
using Atlas.Api.Points;
using Atlas.Storage.Cells;
using Atlas.Storage.Datasets;
using Atlas.Storage.Queries;
using Atlas.Storage.Series;
using Atlas.Storage.Stations;
using Microsoft.Extensions.Caching.Memory;
using Microsoft.Extensions.Options;
using Npgsql;

namespace Atlas.Api.Assessment;

/// <summary>
/// Validates datasets at registered stations: finds the station's nearest wet cell (refusing a station outside the
/// dataset as a point request would), reads the cell's series over the years of the station record, and compares.
/// </summary>
public sealed class ValidationService(PointLocator locator, DatasetCatalog catalog, SeriesStore series, StationStore stations)
{
    /// <summary>Builds the service on a data source, outside the web host (the command line).</summary>
    public static ValidationService Create(NpgsqlDataSource dataSource, IMemoryCache cache)
    {
        var options = Options.Create(new AtlasApiOptions());
        var cells = new CellStore(dataSource);
        var catalog = new DatasetCatalog(new DatasetStore(dataSource), new DatasetGeometryQueries(dataSource), cells, cache, options);
        var locator = new PointLocator(catalog, cells, options);
        return new ValidationService(locator, catalog, new SeriesStore(dataSource), new StationStore(dataSource));
    }

    public StationStore Stations => stations;

    /// <summary>The validation at one station, or the reason the dataset does not cover it.</summary>
    public async Task<(StationValidation? Validation, string? NotCovered)> AtStationAsync(DatasetRecord dataset, StoredStation station, CancellationToken cancel)
    {
        var (point, problem) = await locator.LocateAsync(dataset.Slug, station.Latitude, station.Longitude, cancel);
        if (point is null) return (null, problem!.ProblemDetails.Detail ?? problem.ProblemDetails.Title ?? "the station lies outside the dataset");
        var timelines = await catalog.TimelinesAsync(dataset, cancel);
        int first = station.TimeStartUtc.Year, last = station.TimeEndUtc.Year;
        var model = await AssessmentSeries.ReadAsync(series, timelines, dataset.Id, point.Nearest.Cell, first, last, cancel);
        if (model.Times.Length == 0)
            return (null, $"dataset '{dataset.Slug}' stores no series in {first}..{last}, the years of the station record");
        var observations = await stations.ObservationsAsync(station.Id, cancel);
        return (StationValidator.Validate(station, point.Nearest, observations, model), null);
    }

    /// <summary>The skill at each of <paramref name="list"/>, and the stations the dataset does not cover.</summary>
    public async Task<(IReadOnlyList<StationSkill> Covered, IReadOnlyList<StationNotCovered> NotCovered)> AtStationsAsync(
        DatasetRecord dataset, IReadOnlyList<StoredStation> list, CancellationToken cancel)
    {
        var covered = new List<StationSkill>();
        var missing = new List<StationNotCovered>();
        foreach (var station in list)
        {
            var (validation, reason) = await AtStationAsync(dataset, station, cancel);
            if (validation is null) missing.Add(new StationNotCovered(station.Name, reason!));
            else covered.Add(ValidationReporting.Skill(validation));
        }
        return (covered, missing);
    }
}
