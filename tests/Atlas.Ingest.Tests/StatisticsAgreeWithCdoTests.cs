using System.Diagnostics;
using System.Globalization;
using Atlas.Ingest.Ingestion;
using Atlas.Ingest.Statistics;
using Atlas.Statistics;
using Atlas.Storage.Datasets;
using Atlas.Storage.Statistics;
using Atlas.TestSupport;

namespace Atlas.Ingest.Tests;

/// <summary>
/// The stored monthly, seasonal, annual and per-year means against CDO (Debian package cdo) on the same file:
/// ymonmean and yearmean directly, with power per step from the same formula (rho g^2 / (64 pi) Hm0^2 Te, the
/// deep-water limit; the fixture has no depth). The seasons and the annual period are month-balanced (each calendar
/// month weighs its calendar hours over the record's years): they equal CDO's ymonmean month means weighted so
/// (the numpy.average of them), where yseasmean and timmean pool the steps (and differ where a month has a gap or the
/// record ends early). CDO computes in double with -b F64; the fixture's values are on the atlas storage steps, so
/// both tools average the same numbers and agree to float precision (1e-5 relative).
/// </summary>
public class StatisticsAgreeWithCdoTests(TestDatabase database) : IClassFixture<TestDatabase>
{
    private const int Nx = 4, Ny = 3;
    private const string PowerExpression = "j=1025*9.81*9.81/(64*3.141592653589793)/1000*hs*hs*te";

    [Fact]
    public async Task MonthlySeasonalAnnualAndYearlyMeansEqualCdo()
    {
        var folder = Directory.CreateTempSubdirectory("atlas-cdo-").FullName;
        var file = Path.Combine(folder, "cdo-fixture.nc");
        Run("/usr/bin/python3", $"\"{Script()}\" \"{file}\" {Nx} {Ny} 2");
        await new HindcastIngestor(database.DataSource).RunAsync(new IngestRequest("cdo", [file]));
        await new StatisticsService(database.DataSource).RunAsync("cdo", all: true);
        var dataset = (await new DatasetStore(database.DataSource).FindAsync("cdo"))!;
        var store = new StatisticsStore(database.DataSource);

        var withPower = Path.Combine(folder, "j.nc");
        Run("cdo", $"-s -O -b F64 -expr,'hs=hs;te=te;{PowerExpression}' \"{file}\" \"{withPower}\"");
        var checkedValues = 0;
        var monthMeans = new Dictionary<(string Name, double Lon, double Lat), double[]>();
        foreach (var (operatorName, periodOf) in new (string, Func<DateTime, AtlasPeriod>)[]
                 {
                     ("ymonmean", d => AtlasPeriod.Month(d.Month)),
                     ("yearmean", d => AtlasPeriod.Year(d.Year)),
                 })
        {
            foreach (var name in new[] { "hs", "te", "j" })
            {
                var parameter = WaveParameterNames.Parse(name);
                var output = Run("cdo", $"-s -b F64 -outputtab,date,lon,lat,value -{operatorName} -selname,{name} \"{withPower}\"");
                var lines = output.Split('\n', StringSplitOptions.RemoveEmptyEntries).Where(l => !l.TrimStart().StartsWith('#')).ToArray();
                Assert.NotEmpty(lines);
                var layerCache = new Dictionary<short, IReadOnlyList<LayerValue>>();
                var cells = (await new Atlas.Storage.Cells.CellStore(database.DataSource).AllAsync(dataset.Id)).ToDictionary(c => c.CellId);
                foreach (var line in lines)
                {
                    var parts = line.Split(' ', StringSplitOptions.RemoveEmptyEntries);
                    var date = DateTime.Parse(parts[0], CultureInfo.InvariantCulture);
                    double lon = double.Parse(parts[1], CultureInfo.InvariantCulture), lat = double.Parse(parts[2], CultureInfo.InvariantCulture);
                    var cdoValue = double.Parse(parts[3], CultureInfo.InvariantCulture);
                    var period = periodOf(date);
                    if (operatorName == "ymonmean")
                    {
                        if (!monthMeans.TryGetValue((name, lon, lat), out var means)) monthMeans[(name, lon, lat)] = means = new double[12];
                        means[date.Month - 1] = cdoValue;
                    }
                    if (!layerCache.TryGetValue(period.Code, out var layer))
                        layerCache[period.Code] = layer = await store.LayerAsync(dataset.Id, parameter, period, StatisticKind.Mean, cells.GetValueOrDefault);
                    var cell = layer.Single(v => Math.Abs(v.Longitude - lon) < 1e-4 && Math.Abs(v.Latitude - lat) < 1e-4);
                    Assert.True(Math.Abs(cell.Value - cdoValue) <= 1e-5 * Math.Abs(cdoValue) + 1e-6,
                        $"{operatorName} {name} {period.Name} at ({lon}, {lat}): atlas {cell.Value}, CDO {cdoValue}");
                    checkedValues++;
                }
            }
        }
        // 12 months + 2 years, 3 parameters, 12 cells.
        Assert.Equal((12 + 2) * 3 * Nx * Ny, checkedValues);

        // Seasons and annual: the CDO month means weighted by calendar hours over the record's years (2019, 2020).
        var periods = new[] { AtlasPeriod.Djf, AtlasPeriod.Mam, AtlasPeriod.Jja, AtlasPeriod.Son, AtlasPeriod.Annual };
        var allCells = (await new Atlas.Storage.Cells.CellStore(database.DataSource).AllAsync(dataset.Id)).ToDictionary(c => c.CellId);
        foreach (var period in periods)
            foreach (var name in new[] { "hs", "te", "j" })
            {
                var layer = await store.LayerAsync(dataset.Id, WaveParameterNames.Parse(name), period, StatisticKind.Mean, allCells.GetValueOrDefault);
                foreach (var ((n, lon, lat), means) in monthMeans.Where(m => m.Key.Name == name))
                {
                    double sum = 0, weights = 0;
                    foreach (var month in period.Months)
                    {
                        double hours = (DateTime.DaysInMonth(2019, month) + DateTime.DaysInMonth(2020, month)) * 24.0;
                        sum += hours * means[month - 1];
                        weights += hours;
                    }
                    double expected = sum / weights;
                    var cell = layer.Single(v => Math.Abs(v.Longitude - lon) < 1e-4 && Math.Abs(v.Latitude - lat) < 1e-4);
                    Assert.True(Math.Abs(cell.Value - expected) <= 1e-5 * Math.Abs(expected) + 1e-6,
                        $"month-balanced {name} {period.Name} at ({lon}, {lat}): atlas {cell.Value}, CDO ymonmean weighted {expected}");
                    checkedValues++;
                }
            }
        Assert.Equal((12 + 2 + 5) * 3 * Nx * Ny, checkedValues);
    }

    private static string Script() =>
        Path.Combine(Storage.AtlasHome.FindCheckout(AppContext.BaseDirectory)!, "tests", "data", "statistics", "make_cdo_fixture.py");

    private static string Run(string file, string arguments)
    {
        var start = new ProcessStartInfo("/bin/sh", $"-c \"{file} {arguments.Replace("\"", "\\\"")}\"")
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        using var process = Process.Start(start)!;
        var output = process.StandardOutput.ReadToEndAsync();
        var error = process.StandardError.ReadToEnd();
        process.WaitForExit();
        if (process.ExitCode != 0) throw new InvalidOperationException($"{file} {arguments} failed: {error}");
        return output.Result;
    }
}
