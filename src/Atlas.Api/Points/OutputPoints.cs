using Atlas.Hindcast.Geodesy;
using Atlas.Ingest.Spectra;

namespace Atlas.Api.Points;

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

    /// <summary>The datasets of output points that name <paramref name="gridDataset"/> as theirs.</summary>
    public async Task<IReadOnlyList<DatasetRecord>> CompanionsAsync(DatasetRecord gridDataset, CancellationToken cancel)
    {
        if (gridDataset.GridKind == StationSpectraAnswers.StationsKind) return [];
        var all = await datasets.ListAsync(cancel);
        return StationSpectraAnswers.CompanionsOf(all, gridDataset.Slug).ToList();
    }
}
