using Atlas.Storage;
using Atlas.TestSupport;

namespace Atlas.Ingest.Tests.Assessment;

/// <summary>
/// Station and device files for the loading tests: the hand-made files of tests/data/assessment, CSV variants written
/// here, and CF-NetCDF point time series written by netCDF4-python (tests/data/assessment/make_station_netcdf.py, a writer the project did
/// not write).
/// </summary>
public static class StationFixtures
{
    public static string Checkout { get; } = AtlasHome.FindCheckout(AppContext.BaseDirectory)!;

    public static string Folder { get; } = Directory.CreateTempSubdirectory("atlas-station-tests-").FullName;

    /// <summary>A file of tests/data/assessment.</summary>
    public static string Data(string name) => Path.Combine(Checkout, "tests", "data", "assessment", name);

    /// <summary>Writes <paramref name="text"/> to a new file named <paramref name="name"/> and returns its path.</summary>
    public static string Write(string name, string text)
    {
        var path = Path.Combine(Folder, name);
        File.WriteAllText(path, text);
        return path;
    }

    /// <summary>A NetCDF station file of one of the cases of make_station_netcdf.py.</summary>
    public static string NetCdf(string testCase) =>
        StationNetCdfFiles.Write(Path.Combine(Folder, $"station-{testCase}-{Guid.NewGuid():N}.nc"), testCase);
}
