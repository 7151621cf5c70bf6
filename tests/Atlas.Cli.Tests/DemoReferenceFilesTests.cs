using Atlas.Cli.Demo;
using Atlas.Demo;
using Atlas.Storage.Stations;

namespace Atlas.Cli.Tests;

public class DemoReferenceFilesTests
{
    [Fact]
    public void ManifestStationsAndDeviceAreTheScenarios()
    {
        var scenario = DemoScenario.Describe(new DemoScenarioOptions { Months = 1, Columns = 30, Rows = 24 });
        var folder = Directory.CreateTempSubdirectory("atlas-demo-manifest-").FullName;
        DemoManifestWriter.WriteManifest(Path.Combine(folder, DemoScenario.ManifestFileName), scenario);
        var (stations, device) = DemoReferenceFiles.Read(folder, DemoScenario.ManifestFileName);
        Assert.Equal(scenario.Buoys.Count, stations.Count);
        foreach (var (buoy, entry) in scenario.Buoys.Zip(stations))
        {
            Assert.Equal(buoy.Name, entry.Name);
            Assert.Equal(Path.Combine(folder, buoy.FileName), entry.FilePath);
            Assert.Equal(buoy.Role == BuoyRole.Calibration ? StationRole.Calibration : StationRole.Validation, entry.Role);
            Assert.Equal(buoy.Instrument, entry.Instrument);  // commas kept (the station list replaces them)
            Assert.Equal(buoy.Latitude, entry.Latitude, 12);
            Assert.Equal(buoy.Longitude, entry.Longitude, 12);
            Assert.Equal(buoy.DepthMetres, entry.DepthMetres, 12);
        }
        Assert.Equal(scenario.Device.Name, device.Name);
        Assert.Equal(scenario.Device.RatedKilowatts, device.RatedPowerKw);
        Assert.Equal(Path.Combine(folder, scenario.Device.FileName), device.FilePath);
    }
}
