using System.Globalization;

namespace Atlas.Browser.Tests;

/// <summary>One row of a layer CSV as the API serves it.</summary>
public sealed record LayerCell(int Id, double Lon, double Lat, double Value);

/// <summary>Reads layers from the API (the reference the page must agree with) and picks cells to click.</summary>
public static class SeaCells
{
    public static async Task<IReadOnlyList<LayerCell>> LayerAsync(HttpClient http, string parameter, string statistic, string period)
    {
        var text = await http.GetStringAsync($"/api/v1/datasets/{AtlasSite.Slug}/layers/{parameter}/{statistic}/{period}.csv");
        var cells = new List<LayerCell>();
        var header = false;
        // RFC 4180: records end with CRLF, the header comes first and nothing precedes it.
        foreach (var line in text.Split("\r\n"))
        {
            Assert.False(line.StartsWith('#'), "a comment line in the layer CSV");
            if (line.Length == 0) continue;
            if (!header) { Assert.Equal("cell_id,lon,lat,value", line); header = true; continue; }
            var p = line.Split(',');
            cells.Add(new LayerCell(int.Parse(p[0], CultureInfo.InvariantCulture), double.Parse(p[1], CultureInfo.InvariantCulture),
                double.Parse(p[2], CultureInfo.InvariantCulture), double.Parse(p[3], CultureInfo.InvariantCulture)));
        }
        return cells;
    }

    /// <summary>An open-sea cell: the wet cell nearest the middle of the western third of the sea (away from the coast).</summary>
    public static async Task<LayerCell> OffshoreAsync(HttpClient http)
    {
        var cells = await LayerAsync(http, "j", "mean", "annual");
        double west = cells.Min(c => c.Lon), east = cells.Max(c => c.Lon), south = cells.Min(c => c.Lat), north = cells.Max(c => c.Lat);
        double lon = west + (east - west) / 3, lat = (south + north) / 2;
        return cells.MinBy(c => Math.Pow(c.Lon - lon, 2) + Math.Pow(c.Lat - lat, 2))!;
    }

    /// <summary>The grid's step along one coordinate: the smallest gap between the cell centres' distinct values.</summary>
    public static double GridStep(IEnumerable<LayerCell> cells, Func<LayerCell, double> coordinate)
    {
        var values = cells.Select(coordinate).Distinct().Order().ToArray();
        return values.Zip(values.Skip(1), (a, b) => b - a).Where(d => d > 1e-9).Min();
    }
}
