using Atlas.Assessment;
using Atlas.Hindcast.Stations;
using Atlas.Ingest.Assessment;
using Atlas.Storage.Stations;
using Atlas.TestSupport;

namespace Atlas.Ingest.Tests.Assessment;

public class StationLoadingTests(TestDatabase database) : IClassFixture<TestDatabase>
{
    private StationLoader Loader => new(database.DataSource);
    private StationStore Store => new(database.DataSource);

    private static StationLoadRequest Request(string name, string file, double? lat = 50.5, double? lon = -20.25, StationRole role = StationRole.Validation) =>
        new(name, lat, lon, 31.5, "directional wave buoy", role, file);

    private async Task<long> CountAsync(string sql)
    {
        await using var command = database.DataSource.CreateCommand(sql);
        return Convert.ToInt64(await command.ExecuteScalarAsync());
    }

    [Fact]
    public async Task GoodCsvIsStoredRowByRowWithItsFlaggedRowKept()
    {
        var result = await Loader.LoadAsync(Request("Test Buoy One", StationFixtures.Data("station_good.csv")));
        Assert.False(result.AlreadyRegistered);
        var station = result.Station;
        Assert.Equal("test-buoy-one", station.Slug);
        // Read off station_good.csv by hand: five rows, one flagged qc=4, columns tp, te and dir present.
        Assert.Equal(5, station.ObservationCount);
        Assert.Equal(1, station.FlaggedCount);
        Assert.True(station.HasTp && station.HasTe && station.HasDirection);
        Assert.Equal(new DateTime(2021, 1, 1, 0, 0, 0, DateTimeKind.Utc), station.TimeStartUtc);
        Assert.Equal(new DateTime(2021, 1, 1, 4, 0, 0, DateTimeKind.Utc), station.TimeEndUtc);
        Assert.Equal(31.5, station.DepthMetres!.Value, 5);

        var rows = await Store.ObservationsAsync(station.Id);
        Assert.Equal(5, rows.Count);
        Assert.Equal(DateTimeOffset.Parse("2021-01-01T02:00:00Z").ToUnixTimeSeconds(), rows.TimesUnixSeconds[2]);
        Assert.Equal(1.35f, rows.Hs[1]);
        Assert.True(float.IsNaN(rows.Tp[2]));       // empty tp_s: not measured
        Assert.Equal(0f, rows.Dir[2]);               // 360 is stored as 0
        Assert.Equal((short)4, rows.Qc[3]);          // the flagged row keeps its flag and its fill values
        Assert.Equal(-999f, rows.Hs[3]);
        Assert.True(float.IsNaN(rows.Te[4]));
    }

    [Fact]
    public async Task LoadingTheSameFileAgainUnderTheSameNameChangesNothing()
    {
        // Its own record: the same file may not stand for two stations (see the next test).
        var path = StationFixtures.Write("repeat.csv", File.ReadAllText(StationFixtures.Data("station_good.csv")) + "# repeated\n");
        var first = await Loader.LoadAsync(Request("Repeat Buoy", path, role: StationRole.Calibration));
        var again = await Loader.LoadAsync(Request("Repeat Buoy", path, role: StationRole.Calibration));
        Assert.True(again.AlreadyRegistered);
        Assert.Equal(first.Station.Id, again.Station.Id);
        Assert.Equal(5, await CountAsync($"SELECT count(*) FROM station_observation WHERE station_id = {first.Station.Id}"));
    }

    [Fact]
    public async Task ARegisteredNameWithAnotherRecordOrOtherDetailsIsRefused()
    {
        var original = StationFixtures.Write("conflict-a.csv", "time,hs_m\n2021-01-01T00:00:00Z,1.0\n2021-01-01T01:00:00Z,1.1\n");
        var other = StationFixtures.Write("conflict-b.csv", "time,hs_m\n2021-01-01T00:00:00Z,2.0\n2021-01-01T01:00:00Z,2.1\n");
        await Loader.LoadAsync(Request("Conflict Buoy", original));
        var otherRecord = await Assert.ThrowsAsync<DuplicateStationException>(() => Loader.LoadAsync(Request("Conflict Buoy", other)));
        Assert.Contains("another record", otherRecord.Message);
        var otherRole = await Assert.ThrowsAsync<DuplicateStationException>(() => Loader.LoadAsync(Request("Conflict Buoy", original, role: StationRole.Calibration)));
        Assert.Contains("role validation stored, calibration given", otherRole.Message);
        var otherName = await Assert.ThrowsAsync<DuplicateStationException>(() => Loader.LoadAsync(Request("Another Name", original)));
        Assert.Contains("already registered as station 'Conflict Buoy'", otherName.Message);
        Assert.Null(await Store.FindAsync("Another Name"));
    }

    // Each file breaks one rule the issue names; the expected line numbers are counted by hand in the text.
    [Theory]
    [InlineData("wrong-header.csv", "time,height,tp_s\n2021-01-01T00:00:00Z,1.0,8\n", "line 1, column 2: unknown column 'height'")]
    [InlineData("bad-time.csv", "time,hs_m\n2021-01-01T00:00:00Z,1.0\n01/02/2021 01:00,1.1\n", "line 3, column 1: time '01/02/2021 01:00'")]
    [InlineData("negative-hs.csv", "# comment line\ntime,hs_m\n2021-01-01T00:00:00Z,1.0\n2021-01-01T01:00:00Z,-0.3\n", "line 4, column 2: hs_m -0.3 is negative")]
    [InlineData("duplicate-time.csv", "time,hs_m\n2021-01-01T00:00:00Z,1.0\n2021-01-01T01:00:00Z,1.1\n2021-01-01T01:00:00Z,1.2\n", "line 4: duplicate time 2021-01-01T01:00:00Z, already on line 3")]
    public async Task BadCsvGivesLineNumberedErrorsAndStoresNothing(string name, string text, string expected)
    {
        var before = await CountAsync("SELECT count(*) FROM station_observation");
        var path = StationFixtures.Write(name, text);
        var error = await Assert.ThrowsAsync<CsvInputException>(() => Loader.LoadAsync(Request("Bad " + name, path)));
        Assert.Contains(expected, error.Message);
        Assert.StartsWith(name, error.Message);
        Assert.Null(await Store.FindAsync("Bad " + name));
        Assert.Equal(before, await CountAsync("SELECT count(*) FROM station_observation"));
    }

    [Fact]
    public async Task EveryBadRowOfTheHandMadeFileIsReportedAtOnce()
    {
        var error = await Assert.ThrowsAsync<CsvInputException>(() => Loader.LoadAsync(Request("Bad Rows", StationFixtures.Data("station_bad_rows.csv"))));
        // tests/data/assessment/README.md lists one problem per line: 4, 5, 7, 8, 9, 10, 11 (twice), 12.
        Assert.Equal([4, 5, 7, 8, 9, 10, 11, 11, 12], error.Errors.Select(e => e.LineNumber).ToArray());
        Assert.Null(await Store.FindAsync("Bad Rows"));
    }

    [Fact]
    public async Task CsvWithoutAPositionNeedsOneGiven()
    {
        var path = StationFixtures.Write("no-position.csv", "time,hs_m\n2021-01-01T00:00:00Z,1.0\n");
        var error = await Assert.ThrowsAsync<ArgumentException>(() => Loader.LoadAsync(Request("No Position", path, lat: null)));
        Assert.Contains("latitude is required", error.Message);
    }

    [Fact]
    public async Task NetCdfTimeSeriesWrittenByNetCdf4PythonIsDecodedWithFlagsAndPosition()
    {
        var path = StationFixtures.NetCdf("good");
        var result = await Loader.LoadAsync(Request("NetCDF Buoy", path, lat: null, lon: null));
        var s = result.Station;
        Assert.Equal("netcdf", s.SourceFormat);
        Assert.Equal(51.25, s.Latitude, 9);
        Assert.Equal(-25.5, s.Longitude, 9);      // written as 334.5 degrees east
        Assert.Equal(48, s.ObservationCount);
        Assert.Equal(2, s.FlaggedCount);          // flag 3 'bad_data' on rows 5 and 17
        Assert.Equal(1, result.Content.MissingHsCount); // the fill value on row 30
        var rows = await Store.ObservationsAsync(s.Id);
        var start = DateTimeOffset.Parse("2022-06-01T00:00:00Z").ToUnixTimeSeconds();
        for (var k = 0; k < 48; k++)
        {
            // Closed forms of make_station_netcdf.py: Hs packed in cm (0.1 cm steps), periods float32, 'to' direction in radians.
            Assert.Equal(start + 3600L * k, rows.TimesUnixSeconds[k]);
            if (k == 30) Assert.True(float.IsNaN(rows.Hs[k]));
            else Assert.Equal(1.0 + 0.01 * k, rows.Hs[k], 5);
            Assert.Equal(8.0 + 0.05 * k, rows.Tp[k], 4);
            Assert.Equal(0.9 * (8.0 + 0.05 * k), rows.Te[k], 4);
            Assert.Equal((80.0 + 2.0 * k + 180.0) % 360.0, rows.Dir[k], 3);
            Assert.Equal(k is 5 or 17 ? (short)1 : (short)0, rows.Qc[k]);
        }
    }

    [Fact]
    public async Task NetCdfStationByStationAndTimeInTheClassicFormatIsRead()
    {
        var result = await Loader.LoadAsync(Request("Classic Buoy", StationFixtures.NetCdf("classic"), lat: 51.2501, lon: -25.4999));
        Assert.Equal(48, result.Station.ObservationCount);
        Assert.Equal(51.2501, result.Station.Latitude, 9);  // the position given wins when it agrees with the file's
    }

    [Theory]
    [InlineData("negative_hs", "variable 'VHM0' [12] (2022-06-01T12:00:00Z): Hs -0.25 m is negative")]
    [InlineData("duplicate_time", "variable 'time' [20] = 2022-06-01T19:00:00Z duplicates [19]")]
    [InlineData("two_stations", "it holds several stations")]
    [InlineData("not_timeseries", "featureType is 'point'")]
    [InlineData("no_hs", "no variable has standard_name 'sea_surface_wave_significant_height'")]
    public async Task BadNetCdfNamesTheVariableAndIndexAndStoresNothing(string testCase, string expected)
    {
        var path = StationFixtures.NetCdf(testCase);
        var error = await Assert.ThrowsAsync<StationFileException>(() => Loader.LoadAsync(Request("Bad NetCDF " + testCase, path, lat: null, lon: null)));
        Assert.Contains(expected, error.Message);
        Assert.StartsWith(Path.GetFileName(path), error.Message);
        Assert.Null(await Store.FindAsync("Bad NetCDF " + testCase));
    }

    [Fact]
    public async Task APositionFarFromTheOneTheFileStatesIsRefused()
    {
        var error = await Assert.ThrowsAsync<ArgumentException>(() => Loader.LoadAsync(Request("Far Buoy", StationFixtures.NetCdf("good"), lat: 51.5, lon: -25.5)));
        Assert.Contains("places the station at latitude 51.25 but 51.5 was given", error.Message);
        Assert.Null(await Store.FindAsync("Far Buoy"));
    }
}
