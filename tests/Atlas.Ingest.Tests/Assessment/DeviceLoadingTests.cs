using Atlas.Assessment;
using Atlas.Ingest.Assessment;
using Atlas.Storage.Devices;
using Atlas.TestSupport;

namespace Atlas.Ingest.Tests.Assessment;

public class DeviceLoadingTests(TestDatabase database) : IClassFixture<TestDatabase>
{
    private DeviceLoader Loader => new(database.DataSource);

    [Fact]
    public async Task StoredMatrixReadsBackCellForCell()
    {
        var result = await Loader.LoadAsync("Test Absorber", StationFixtures.Data("power_matrix_te.csv"), 500);
        var stored = (await new DeviceStore(database.DataSource).FindAsync("test-absorber"))!;
        // power_matrix_te.csv: Hs 1, 2, 3 m by Te 6, 8, 10, 12 s (tests/data/assessment/README.md).
        Assert.Equal(DeviceAxisKind.Te, stored.AxisKind);
        Assert.Equal([1.0, 2.0, 3.0], stored.HsCentresMetres);
        Assert.Equal([6.0, 8.0, 10.0, 12.0], stored.PeriodCentresSeconds);
        Assert.Equal(500, stored.RatedPowerKw);
        var lines = File.ReadAllLines(StationFixtures.Data("power_matrix_te.csv")).Where(l => l.Length > 0 && l[0] != '#').Skip(1).ToArray();
        for (var i = 0; i < 3; i++)
        {
            var cells = lines[i].Split(',').Skip(1).Select(x => double.Parse(x, System.Globalization.CultureInfo.InvariantCulture)).ToArray();
            for (var j = 0; j < 4; j++) Assert.Equal(cells[j], stored.PowerKw[i, j]);
        }
        Assert.False(result.AlreadyRegistered);
        Assert.True((await Loader.LoadAsync("Test Absorber", StationFixtures.Data("power_matrix_te.csv"), 500)).AlreadyRegistered);
    }

    [Theory]
    [InlineData("power_matrix_bad.csv", new[] { 2, 4, 5, 5 })]   // line numbers from tests/data/assessment/README.md
    [InlineData("power_matrix_empty.csv", new[] { 2 })]
    public async Task BadMatricesAreRejectedCellByCellAndNothingIsStored(string file, int[] lines)
    {
        var error = await Assert.ThrowsAsync<CsvInputException>(() => Loader.LoadAsync("Bad " + file, StationFixtures.Data(file)));
        Assert.Equal(lines, error.Errors.Select(e => e.LineNumber).ToArray());
        Assert.Null(await new DeviceStore(database.DataSource).FindAsync("Bad " + file));
    }

    [Fact]
    public async Task ARatedPowerBelowTheLargestMatrixValueIsRefused()
    {
        await Assert.ThrowsAsync<ArgumentOutOfRangeException>(() => Loader.LoadAsync("Underrated", StationFixtures.Data("power_matrix_te.csv"), 1));
        Assert.Null(await new DeviceStore(database.DataSource).FindAsync("Underrated"));
    }
}
