using System.Globalization;
using System.Text;
using Atlas.Hindcast;
using Atlas.WavePhysics;

namespace Atlas.Demo;

/// <summary>
/// Writes the demo's spectra at its output points, one CF-1.8 NetCDF-4 file per calendar year
/// (<c>skelvane-reach-points-YYYY.nc</c>), as spectral models write them: <c>efth(time, station, frequency, direction)</c>
/// in m2 s rad-1 on 32 geometric frequencies (0.035 x 1.1^i Hz) and 24 direction bins of 15 degrees (waves coming from),
/// station names with <c>cf_role = timeseries_id</c>, positions and depths per station. Each step's spectrum is the
/// JONSWAP form (gamma 3.3) with the cell's Hs and Tp, spread over direction by the cosine-2s model whose exponent gives the
/// cell's directional spread about its mean direction, normalised over the discrete bins: its Hm0 is the field's Hs within
/// the truncation of the frequency range.
/// </summary>
public static class SpectralPointsFileWriter
{
    public const string FileStem = "skelvane-reach-points";

    public static readonly double[] Frequencies = [.. Enumerable.Range(0, 32).Select(i => 0.035 * Math.Pow(1.1, i))];

    public static readonly double[] DirectionsFrom = [.. Enumerable.Range(0, 24).Select(j => 7.5 + 15.0 * j)];

    /// <summary>The file of one calendar year.</summary>
    public static string FileName(int year) => string.Create(CultureInfo.InvariantCulture, $"{FileStem}-{year}.nc");

    /// <summary>Writes the steps of <paramref name="year"/> within the scenario at every output point.</summary>
    public static void Write(string path, DemoScenario scenario, SeaStateModel model, IReadOnlyList<DemoOutputPoint> points, int year)
    {
        var first = new DateTime(year, 1, 1, 0, 0, 0, DateTimeKind.Utc);
        if (first < scenario.Start) first = scenario.Start;
        var end = new DateTime(year + 1, 1, 1, 0, 0, 0, DateTimeKind.Utc);
        if (end > scenario.End) end = scenario.End;
        int steps = (int)((end - first).TotalHours / scenario.StepHours);
        int nf = Frequencies.Length, nd = DirectionsFrom.Length, ns = points.Count;
        var hours = new double[steps];
        var density = new float[(long)steps * ns * nf * nd];
        double bin = 2 * Math.PI / nd;
        Parallel.For(0, steps, t =>
        {
            var at = first.AddHours(t * scenario.StepHours);
            hours[t] = (at - scenario.Start).TotalHours;
            var spreading = new double[nd];
            for (int s = 0; s < ns; s++)
            {
                var state = model.Evaluate(points[s].WetCell, at);
                var sf = JonswapSpectrum.Density(Frequencies, state.Hs, state.Tp, 3.3);
                double exponent = Directionality.SpreadingExponentFromSpread(state.SpreadDegrees), sum = 0;
                for (int j = 0; j < nd; j++)
                {
                    spreading[j] = Directionality.SpreadingDensity((DirectionsFrom[j] - state.FromDegrees) * Math.PI / 180, exponent);
                    sum += spreading[j];
                }
                long row = ((long)t * ns + s) * nf * nd;
                for (int i = 0; i < nf; i++)
                    for (int j = 0; j < nd; j++)
                        density[row + i * nd + j] = (float)(sf[i] * spreading[j] / (sum * bin));
            }
        });

        using var nc = NetCdfWriter.Create(path);
        int nameLength = points.Max(p => Encoding.UTF8.GetByteCount(p.Name));
        nc.DefineDimension("time", steps);
        nc.DefineDimension("station", ns);
        nc.DefineDimension("name_strlen", nameLength);
        nc.DefineDimension("frequency", nf);
        nc.DefineDimension("direction", nd);
        nc.DefineVariable("time", NetCdfType.Double, ["time"]);
        nc.PutAttribute("time", "standard_name", "time");
        nc.PutAttribute("time", "units", string.Create(CultureInfo.InvariantCulture, $"hours since {scenario.Start:yyyy-MM-dd HH:mm:ss}"));
        nc.PutAttribute("time", "calendar", "standard");
        nc.DefineVariable("station_name", NetCdfType.Char, ["station", "name_strlen"]);
        nc.PutAttribute("station_name", "cf_role", "timeseries_id");
        nc.PutAttribute("station_name", "long_name", "output point name");
        foreach (var (name, standard, units) in new[] { ("latitude", "latitude", "degrees_north"), ("longitude", "longitude", "degrees_east"),
                     ("depth", "sea_floor_depth_below_sea_surface", "m") })
        {
            nc.DefineVariable(name, NetCdfType.Double, ["station"]);
            nc.PutAttribute(name, "standard_name", standard);
            nc.PutAttribute(name, "units", units);
        }
        nc.DefineVariable("frequency", NetCdfType.Double, ["frequency"]);
        nc.PutAttribute("frequency", "standard_name", "sea_surface_wave_frequency");
        nc.PutAttribute("frequency", "units", "s-1");
        nc.DefineVariable("direction", NetCdfType.Double, ["direction"]);
        nc.PutAttribute("direction", "standard_name", "sea_surface_wave_from_direction");
        nc.PutAttribute("direction", "units", "degree");
        nc.DefineVariable("efth", NetCdfType.Float, ["time", "station", "frequency", "direction"],
            new NetCdfVariableOptions(DeflateLevel: MonthlyHindcastFileWriter.DeflateLevel, Shuffle: true, ChunkSizes: [Math.Min(steps, 248), ns, nf, nd]));
        nc.PutAttribute("efth", "standard_name", "sea_surface_wave_directional_variance_spectral_density");
        nc.PutAttribute("efth", "units", "m2 s rad-1");
        nc.PutAttribute("efth", "long_name", "directional variance spectral density");
        nc.PutAttribute(null, "Conventions", "CF-1.8");
        nc.PutAttribute(null, "featureType", "timeSeries");
        nc.PutAttribute(null, "title", string.Create(CultureInfo.InvariantCulture, $"{scenario.Name} wave hindcast, spectra at output points, {year} (synthetic)"));
        nc.PutAttribute(null, "institution", "atlas demo (invented coast, invented data)");
        nc.PutAttribute(null, "source", string.Create(CultureInfo.InvariantCulture, $"atlas demo scenario generator, seed {scenario.Seed}"));
        nc.PutAttribute(null, "comment", DemoScenario.SyntheticNotice);
        nc.EndDefinitions();
        nc.Write<double>("time", [0], [steps], hours);
        var names = new byte[ns * nameLength];
        for (int s = 0; s < ns; s++) Encoding.UTF8.GetBytes(points[s].Name).CopyTo(names, s * nameLength);
        nc.WriteText("station_name", [0, 0], [ns, nameLength], names);
        nc.Write<double>("latitude", [0], [ns], points.Select(p => p.Latitude).ToArray());
        nc.Write<double>("longitude", [0], [ns], points.Select(p => p.Longitude).ToArray());
        nc.Write<double>("depth", [0], [ns], points.Select(p => p.DepthMetres).ToArray());
        nc.Write<double>("frequency", [0], [nf], Frequencies);
        nc.Write<double>("direction", [0], [nd], DirectionsFrom);
        nc.Write<float>("efth", [0, 0, 0, 0], [steps, ns, nf, nd], density);
    }
}
