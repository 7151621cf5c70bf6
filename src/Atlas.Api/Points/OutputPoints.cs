using Atlas.Hindcast.Geodesy;
using Atlas.Ingest.Spectra;

namespace Atlas.Api.Points;

/// <summary>An output point of a spectral hindcast, as the page draws it.</summary>
public sealed record OutputPointItem(string Dataset, string Name, int CellId, double Lat, double Lon, double? DepthM);

/// <summary>
/// The output points of a spectral hindcast beside its gridded dataset: the datasets of output points that name the gridded
/// one, and the nearest of their points to a position (geodesic distance on WGS 84).
/// </summary>
public sealed class OutputPoints(DatasetStore datasets, DatasetCatalog catalog)
{
    /// <summary>The nearest output point to the position among the datasets of points that name <paramref name="gridDataset"/>; null when none does.</summary>
    public async Task<(DatasetRecord Dataset, CellRecord Cell, double DistanceKm)?> NearestAsync(DatasetRecord gridDataset, double latitude, double longitude,
        CancellationToken cancel)
    {
        (DatasetRecord, CellRecord, double)? best = null;
        foreach (var companion in await CompanionsAsync(gridDataset, cancel))
        {
            var cells = await catalog.CellsAsync(companion, cancel);
            foreach (var cell in cells.All.Where(c => c.Wet))
            {
                double km = GeodesicDistance.Metres(latitude, longitude, cell.Latitude, cell.Longitude) / 1000;
                if (best is null || km < best.Value.Item3) best = (companion, cell, km);
            }
        }
        return best;
    }

    /// <summary>
    /// The output points to draw with a dataset: its own (a dataset of points) or those of the datasets of points that name
    /// it (a gridded dataset).
    /// </summary>
    public async Task<IReadOnlyList<OutputPointItem>> ListAsync(DatasetRecord dataset, CancellationToken cancel)
    {
        IReadOnlyList<DatasetRecord> sources = dataset.GridKind == StationSpectraAnswers.StationsKind ? [dataset] : await CompanionsAsync(dataset, cancel);
        var items = new List<OutputPointItem>();
        foreach (var source in sources)
            foreach (var cell in (await catalog.CellsAsync(source, cancel)).All.Where(c => c.Wet))
                items.Add(new OutputPointItem(source.Slug, StationSpectraAnswers.StationName(source, cell.CellId), cell.CellId,
                    cell.Latitude, cell.Longitude, cell.DepthMetres));
        return items;
    }

    /// <summary>The datasets of output points that name <paramref name="gridDataset"/> as theirs.</summary>
    public async Task<IReadOnlyList<DatasetRecord>> CompanionsAsync(DatasetRecord gridDataset, CancellationToken cancel)
    {
        if (gridDataset.GridKind == StationSpectraAnswers.StationsKind) return [];
        var all = await datasets.ListAsync(cancel);
        return StationSpectraAnswers.CompanionsOf(all, gridDataset.Slug).ToList();
    }
}
