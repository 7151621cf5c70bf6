using Atlas.Ingest.Assessment;
using Atlas.Storage.Datasets;
using Atlas.Storage.Series;
using Atlas.Storage.Stations;

namespace Atlas.Ingest.Validation;

/// <summary>
/// Validates datasets at registered stations: finds the station's nearest wet cell (refusing a station outside the
/// dataset as a point request would), reads the cell's series over the years of the station record, and compares.
/// A registered service: the API and <c>atlas validate</c> resolve it with their own <see cref="IStationCellFinder"/>,
/// both from configuration.
/// </summary>
public sealed class ValidationService(IStationCellFinder cells, SeriesStore series, StationStore stations)
{
    public StationStore Stations => stations;

    /// <summary>The validation at one station, or the reason the dataset does not cover it.</summary>
    public async Task<(StationValidation? Validation, string? NotCovered)> AtStationAsync(DatasetRecord dataset, StoredStation station, CancellationToken cancel)
    {
        var (nearest, notCovered) = await cells.NearestWetAsync(dataset, station.Latitude, station.Longitude, cancel);
        if (nearest is null) return (null, notCovered);
        var timelines = await cells.TimelinesAsync(dataset, cancel);
        int first = station.TimeStartUtc.Year, last = station.TimeEndUtc.Year;
        var model = await AssessmentSeries.ReadAsync(series, timelines, dataset.Id, nearest.Cell, first, last, cancel);
        if (model.Times.Length == 0)
            return (null, $"dataset '{dataset.Slug}' stores no series in {first}..{last}, the years of the station record");
        var observations = await stations.ObservationsAsync(station.Id, cancel);
        return (StationValidator.Validate(station, nearest, observations, model), null);
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
