using Atlas.Hindcast;

namespace Atlas.Api.Downloads;

/// <summary>
/// A point's series as a CF-1.8 discrete sampling geometry file (featureType timeSeries, one station): time in seconds since
/// 1970-01-01 UTC, the station's name (cf_role timeseries_id), latitude, longitude and depth, and one float variable per
/// column with its units, standard name where CF has one, and NaN as the fill value; provenance and the caution as global
/// attributes.
/// </summary>
public static class SeriesNetCdfWriter
{
    public static byte[] Write(PointSeries s, IReadOnlyList<SeriesColumn> columns, PointCell cell, string stationName, Provenance source)
    {
        var path = Path.Combine(Path.GetTempPath(), $"atlas-series-{Guid.NewGuid():N}.nc");
        try
        {
            using (var nc = NetCdfWriter.Create(path))
            {
                nc.DefineDimension("time", s.Times.Length);
                nc.DefineDimension("name_strlen", Math.Max(1, Encoding.UTF8.GetByteCount(stationName)));
                nc.DefineVariable("time", NetCdfType.Double, ["time"]);
                nc.PutAttribute("time", "standard_name", "time");
                nc.PutAttribute("time", "units", "seconds since 1970-01-01 00:00:00");
                nc.PutAttribute("time", "calendar", "standard");
                nc.PutAttribute("time", "axis", "T");
                nc.DefineVariable("station_name", NetCdfType.Char, ["name_strlen"]);
                nc.PutAttribute("station_name", "cf_role", "timeseries_id");
                nc.PutAttribute("station_name", "long_name", "cell or output point");
                foreach (var (name, standard, units) in new[] { ("lat", "latitude", "degrees_north"), ("lon", "longitude", "degrees_east") })
                {
                    nc.DefineVariable(name, NetCdfType.Double, []);
                    nc.PutAttribute(name, "standard_name", standard);
                    nc.PutAttribute(name, "units", units);
                }
                if (cell.DepthM is not null)
                {
                    nc.DefineVariable("depth", NetCdfType.Float, []);
                    nc.PutAttribute("depth", "standard_name", "sea_floor_depth_below_sea_surface");
                    nc.PutAttribute("depth", "units", "m");
                    nc.PutAttribute("depth", "positive", "down");
                }
                foreach (var c in columns)
                {
                    nc.DefineVariable(c.Name, NetCdfType.Float, ["time"], new NetCdfVariableOptions(DeflateLevel: 4, Shuffle: true, FillValue: double.NaN));
                    nc.PutAttribute(c.Name, "units", c.Units);
                    nc.PutAttribute(c.Name, "long_name", c.LongName);
                    if (c.StandardName is not null) nc.PutAttribute(c.Name, "standard_name", c.StandardName);
                    nc.PutAttribute(c.Name, "coordinates", "time lat lon station_name");
                }
                nc.PutAttribute(null, "Conventions", "CF-1.8");
                nc.PutAttribute(null, "featureType", "timeSeries");
                nc.PutAttribute(null, "title", $"Series of {stationName} from dataset {source.Dataset}: {source.Title}");
                nc.PutAttribute(null, "source", $"{source.Software} {source.SoftwareVersion}");
                nc.PutAttribute(null, "source_files", source.SourceFilesText());
                nc.PutAttribute(null, "method", source.MethodNotes);
                nc.PutAttribute(null, "assumptions", source.AssumptionsText());
                nc.PutAttribute(null, "licence", source.Licence ?? "not stated");
                nc.PutAttribute(null, "caution", source.Caution);
                if (source.Citation is { } citation) nc.PutAttribute(null, "references", citation);
                nc.EndDefinitions();
                var count = new long[] { s.Times.Length };
                nc.Write<double>("time", [0], count, s.Times.Select(t => (double)t).ToArray());
                nc.WriteText("station_name", stationName);
                nc.Write<double>("lat", [], [], [cell.Lat]);
                nc.Write<double>("lon", [], [], [cell.Lon]);
                if (cell.DepthM is { } depth) nc.Write<float>("depth", [], [], [(float)depth]);
                foreach (var c in columns) nc.Write<float>(c.Name, [0], count, c.Values.AsSpan(0, s.Times.Length));
            }
            return File.ReadAllBytes(path);
        }
        finally
        {
            File.Delete(path);
        }
    }
}
