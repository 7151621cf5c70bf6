using Atlas.Hindcast;

namespace Atlas.Api.Downloads;

/// <summary>
/// A layer as a CF-1.8 NetCDF-4 file (through the hindcast writer): the raster on latitude/longitude axes of the
/// pixel centres (north to south), one static field named <c>{parameter}_{statistic}</c>, the provenance and the
/// caution as global attributes. Empty pixels are the field's fill value.
/// </summary>
public static class LayerNetCdfWriter
{
    public static byte[] Write(LayerRaster raster, LayerData data)
    {
        var p = data.Provenance;
        var request = data.Request;
        var options = new HindcastWriterOptions
        {
            Latitudes = Enumerable.Range(0, raster.Height).Select(raster.RowCentre).ToArray(),
            Longitudes = Enumerable.Range(0, raster.Width).Select(raster.ColumnCentre).ToArray(),
            Title = $"{data.Title}: {p.Title}",
            Source = $"{p.Software} {p.SoftwareVersion}, wave-resource atlas statistics of dataset {p.Dataset}",
            History = $"{p.GeneratedAtUtc:O} rendered by {p.Software} {p.SoftwareVersion} from statistics computed {p.StatisticsComputedAtUtc?.ToString("O") ?? "(not recorded)"}",
            Comment = p.Caution,
            References = p.Citation,
            GlobalAttributes = new Dictionary<string, string>
            {
                ["dataset"] = p.Dataset,
                ["source_files"] = p.SourceFilesText(),
                ["method"] = p.MethodNotes,
                ["assumptions"] = p.AssumptionsText(),
                ["licence"] = p.Licence ?? "not stated",
                ["caution"] = p.Caution,
                ["period"] = request.Period.Name,
            },
        };
        var field = new CfField($"{request.Parameter.Symbol()}_{request.Statistic.Name()}", data.Units)
        {
            LongName = data.Title,
            HasTime = false,
            StandardName = StandardName(request.Parameter, request.Statistic),
            Attributes = CellMethods(request.Statistic) is { } methods ? new Dictionary<string, string> { ["cell_methods"] = methods } : null,
        };
        var path = Path.Combine(Path.GetTempPath(), $"atlas-layer-{Guid.NewGuid():N}.nc");
        try
        {
            HindcastWriter.WriteLayer(path, options, field, raster.Values);
            return File.ReadAllBytes(path);
        }
        finally
        {
            File.Delete(path);
        }
    }

    // CF standard names (CF standard name table, from memory) for statistics that keep the quantity's meaning.
    private static string? StandardName(WaveParameter parameter, StatisticKind statistic)
    {
        // Percentiles have no CF cell method, and count and coverage are not the quantity: they carry long_name only.
        if (CellMethods(statistic) is null) return null;
        return parameter switch
        {
            WaveParameter.Hs => "sea_surface_wave_significant_height",
            WaveParameter.Tp => "sea_surface_wave_period_at_variance_spectral_density_maximum",
            WaveParameter.Dir => "sea_surface_wave_from_direction",
            WaveParameter.Spread => "sea_surface_wave_directional_spread",
            WaveParameter.Depth => "sea_floor_depth_below_sea_surface",
            _ => null,
        };
    }

    private static string? CellMethods(StatisticKind statistic) => statistic switch
    {
        StatisticKind.Mean => "time: mean",
        StatisticKind.Sd => "time: standard_deviation",
        StatisticKind.Min => "time: minimum",
        StatisticKind.Max => "time: maximum",
        StatisticKind.P50 => "time: median",
        _ => null,
    };
}
