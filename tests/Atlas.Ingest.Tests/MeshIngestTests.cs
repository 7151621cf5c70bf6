using System.Diagnostics;
using Atlas.Ingest.Ingestion;
using Atlas.Storage.Cells;
using Atlas.Storage.Datasets;
using Atlas.Storage.Series;
using Atlas.TestSupport;

namespace Atlas.Ingest.Tests;

/// <summary>
/// A UGRID mesh through the whole ingest into PostGIS: the fixture is compiled by ncgen (netCDF-C's own tool) from
/// tests/data/netcdf/ugrid_mesh.cdl, whose node values are written out in the CDL.
/// </summary>
public class MeshIngestTests(TestDatabase database) : IClassFixture<TestDatabase>
{
    [Fact]
    public async Task MeshNodesBecomeCellsWithTheirTrianglesAndValues()
    {
        var checkout = Storage.AtlasHome.FindCheckout(AppContext.BaseDirectory)!;
        var file = Path.Combine(Directory.CreateTempSubdirectory("atlas-mesh-").FullName, "mesh.nc");
        using (var ncgen = Process.Start(new ProcessStartInfo("ncgen", $"-k nc4 -o \"{file}\" \"{Path.Combine(checkout, "tests", "data", "netcdf", "ugrid_mesh.cdl")}\"")
               { RedirectStandardError = true, UseShellExecute = false })!)
        {
            ncgen.WaitForExit();
            Assert.Equal(0, ncgen.ExitCode);
        }
        var summary = await new HindcastIngestor(database.DataSource).RunAsync(new IngestRequest("mesh", [file]));
        // Node 6 has depth 0 and no values: it is dry; the other five are wet.
        Assert.Equal(5, summary.WetCells);
        var dataset = (await new DatasetStore(database.DataSource).FindAsync("mesh"))!;
        Assert.Equal("mesh", dataset.GridKind);
        var cells = new CellStore(database.DataSource);
        var all = await cells.AllAsync(dataset.Id);
        Assert.Equal(6, all.Count);
        Assert.False(all[5].Wet);
        Assert.Equal(-4.9, all[4].Longitude, 9);
        Assert.Equal(48.1, all[4].Latitude, 9);
        // Two triangles and one quad split in two (the CDL's comment names them).
        var triangles = await cells.TrianglesAsync(dataset.Id);
        Assert.Equal(4, triangles.Count);
        Assert.Contains((0, 1, 3), triangles);
        var chunk = (await new SeriesStore(database.DataSource).ReadCellAsync(dataset.Id, 4)).Single();
        var hs = new float[3];
        SeriesCodec.Decode(chunk.Payload, WaveParameter.Hs, hs);
        Assert.Equal([1.4f, 2.4f, 3.4f], hs.Select(v => MathF.Round(v, 3)).ToArray());
    }
}
