using Atlas.Hindcast;
using Atlas.Hindcast.Spectra;
using Atlas.Ingest.Spectra;
using Atlas.Ingest.Ingestion;
using Atlas.Storage.Cells;
using Atlas.Storage.Datasets;
using Atlas.Storage.Series;
using Atlas.Storage.Spectra;
using Atlas.TestSupport;

namespace Atlas.Ingest.Tests;

/// <summary>
/// Spectra at output points through the whole ingest: files written by netCDF4-python as spectral models write them
/// (tests/data/ingest/make_point_spectra.py), checked against every step's parameters computed by the same script with
/// NumPy (trapezoid integration) and SciPy (brentq roots of the dispersion relation at each frequency and station depth).
/// </summary>
public class PointSpectraIngestTests(TestDatabase database) : IClassFixture<TestDatabase>
{
    private static string Folder() => Directory.CreateTempSubdirectory("atlas-spectra-").FullName;

    [Fact]
    public async Task StationsBecomeCellsWithTheirSpectralParameters()
    {
        var folder = Folder();
        // Two files sharing their boundary step (step 7 of the first is step 0 of the second), as monthly files do.
        var first = PointSpectraFixture.Make(Path.Combine(folder, "points-a.nc"), 0, 8);
        var second = PointSpectraFixture.Make(Path.Combine(folder, "points-b.nc"), 21, 8);
        var summary = await new HindcastIngestor(database.DataSource).RunAsync(new IngestRequest("points", [first, second]));
        Assert.Equal(3, summary.WetCells);
        Assert.True(summary.SharedSteps > 0);
        Assert.Contains(summary.SpectralNotes, n => n.Contains("turned to coming from"));
        Assert.Contains(summary.SpectralNotes, n => n.Contains("trapezoidal"));

        var dataset = (await new DatasetStore(database.DataSource).FindAsync("points"))!;
        Assert.Equal("stations", dataset.GridKind);
        Assert.Contains("Cobble Shelf", dataset.GridJson);
        var cells = await new CellStore(database.DataSource).AllAsync(dataset.Id);
        Assert.Equal([80f, 15f, 8f], cells.Select(c => c.DepthMetres ?? float.NaN).Select(d => MathF.Round(d, 3)).ToArray());
        Assert.Equal(-19.71, cells[1].Longitude, 5);

        // Steps 0..7 from the first file, 8..14 from the second (its step 0 is the shared step 7).
        var expectedA = PointSpectraFixture.Expected(first)["steps"]!.AsArray();
        var expectedB = PointSpectraFixture.Expected(second)["steps"]!.AsArray();
        var expected = expectedA.Concat(expectedB.Skip(1)).ToList();
        var chunk = (await new SeriesStore(database.DataSource).ReadCellAsync(dataset.Id, 1)).Single();
        var hs = new float[15];
        var te = new float[15];
        SeriesCodec.Decode(chunk.Payload, WaveParameter.Hs, hs);
        SeriesCodec.Decode(chunk.Payload, WaveParameter.Te, te);
        var steps = (await StationSpectraStoreSteps(dataset.Id, 1));
        for (int t = 0; t < 15; t++)
        {
            var e = expected[t]![1]!;
            Assert.Equal(e["hm0"]!.GetValue<double>(), hs[t], 0.0006);           // series packing: 1 mm steps
            Assert.Equal(e["te"]!.GetValue<double>(), te[t], 0.006);             // 0.01 s steps
            AssertRelative(e["j"]!.GetValue<double>(), steps.PowerSpectral[t], 2e-6);
            AssertRelative(e["j_parametric"]!.GetValue<double>(), steps.PowerParametric[t], 2e-6);
            Assert.Equal(e["directionality"]!.GetValue<double>(), steps.Directionality[t], 1e-6);
            AssertRelative(e["eps0"]!.GetValue<double>(), steps.SpectralWidth[t], 1e-5);
        }
        // At 15 m the spectral power of the longer seas is several percent below the parametric one; at 80 m the two
        // agree within 2.5 % (the group velocity of the long components at intermediate depth exceeds its deep-water value;
        // IEC TS 62600-101 definitions, the script's numbers).
        Assert.InRange(Enumerable.Range(0, 15).Max(t => steps.PowerParametric[t] / steps.PowerSpectral[t] - 1), 0.03, 0.08);
        var deep = await StationSpectraStoreSteps(dataset.Id, 0);
        Assert.All(Enumerable.Range(0, 15), t => Assert.InRange(deep.PowerParametric[t] / deep.PowerSpectral[t] - 1, -0.025, 0.025));

        // The shared step is summed once: 15 steps in January, and the sums are the script's.
        var months = await new StationSpectraStore(database.DataSource).MonthSumsAsync(dataset.Id, 1, default);
        var january = Assert.Single(months);
        Assert.Equal(15, january.Steps);
        double expectedSum = expected.Sum(e => e![1]!["frequency_spectrum"]!.AsArray()[10]!.GetValue<double>());
        AssertRelative(expectedSum, january.FrequencySum[10], 2e-6);
        double expectedPower = expected.Sum(e => e![1]!["direction_powers"]!.AsArray().Sum(p => p!.GetValue<double>()));
        AssertRelative(expectedPower, january.DirectionSum.Sum(), 2e-6);

        // Loading the same files again changes nothing.
        var again = await new HindcastIngestor(database.DataSource).RunAsync(new IngestRequest("points", [first, second]));
        Assert.Equal(0, again.FilesLoaded);
    }

    [Theory]
    [InlineData("negative", "efth", "negative density")]
    [InlineData("frequencies_decreasing", "frequency", "does not increase")]
    [InlineData("half_circle", "direction", "do not cover the circle")]
    [InlineData("units_unknown", "efth", "furlong")]
    [InlineData("no_coordinates", "efth", "no coordinates")]
    public async Task BadSpectraAreRefusedNamingTheVariableAndNothingIsStored(string variant, string variable, string problem)
    {
        var file = PointSpectraFixture.Make(Path.Combine(Folder(), $"{variant}.nc"), 0, 4, variant);
        var slug = "bad-" + variant.Replace('_', '-');
        var error = await Assert.ThrowsAsync<HindcastFormatException>(() => new HindcastIngestor(database.DataSource).RunAsync(new IngestRequest(slug, [file])));
        Assert.Contains($"'{variable}'", error.Message);
        Assert.Contains(problem, error.Message);
        Assert.Null(await new DatasetStore(database.DataSource).FindAsync(slug));
    }

    // S(f) alone, and spectra per degree: the parameters the integration gives are the script's (NumPy trapezoid, SciPy
    // brentq) within float32 rounding; depths come from a mapping file where the file has none.
    [Theory]
    [InlineData("frequency_only")]
    [InlineData("per_degree")]
    public async Task FrequencySpectraAndSpectraPerDegreeGiveTheSameParameters(string variant)
    {
        var folder = Folder();
        var file = PointSpectraFixture.Make(Path.Combine(folder, $"{variant}.nc"), 0, 6, variant);
        var mapping = variant == "frequency_only"
            ? VariableMapping.Parse("{ \"station_depths_m\": { \"Harrow Deep\": 80, \"Cobble Shelf\": 15, \"Wick Inner\": 8 } }", "depths.json")
            : null;
        var slug = "points-" + variant.Replace('_', '-');
        var summary = await new HindcastIngestor(database.DataSource).RunAsync(new IngestRequest(slug, [file], Mapping: mapping));
        if (variant == "frequency_only") Assert.Contains(summary.SpectralNotes, n => n.Contains("depths of 3 station(s) from the mapping"));
        else Assert.Contains(summary.SpectralNotes, n => n.Contains("per degree to per radian"));
        var dataset = (await new DatasetStore(database.DataSource).FindAsync(slug))!;
        var expected = PointSpectraFixture.Expected(file)["steps"]!.AsArray();
        var steps = await StationSpectraStoreSteps(dataset.Id, 1);
        var chunk = (await new SeriesStore(database.DataSource).ReadCellAsync(dataset.Id, 1)).Single();
        var hs = new float[6];
        SeriesCodec.Decode(chunk.Payload, WaveParameter.Hs, hs);
        for (int t = 0; t < 6; t++)
        {
            var e = expected[t]![1]!;
            Assert.Equal(e["hm0"]!.GetValue<double>(), hs[t], 0.0006);
            AssertRelative(e["j"]!.GetValue<double>(), steps.PowerSpectral[t], 1e-5);
            if (variant == "frequency_only") Assert.True(float.IsNaN(steps.Directionality[t]));
            else Assert.Equal(e["directionality"]!.GetValue<double>(), steps.Directionality[t], 1e-5);
        }
    }

    // The same densities stored with directions before frequencies (not contiguous in the file; netCDF4-python wrote
    // them), and copies rewritten by netCDF-C's nccopy compressed in chunks of one station over all steps (chunks longer
    // than a block) and in chunks of three steps (blocks of whole chunks): every per-step value and month sum is the
    // same to the bit as from the file as written, whichever way the reader takes the blocks.
    [Fact]
    public void LayoutCompressionAndChunkingOfTheFileChangeNoValue()
    {
        var folder = Folder();
        const int steps = 40;
        var written = PointSpectraFixture.Make(Path.Combine(folder, "written.nc"), 0, steps);
        var files = new Dictionary<string, string>
        {
            ["direction before frequency"] = PointSpectraFixture.Make(Path.Combine(folder, "direction-first.nc"), 0, steps, "direction_before_frequency"),
            ["one station per chunk"] = NcCopy(written, Path.Combine(folder, "station-chunks.nc"), "time/40,station/1,frequency/32,direction/24"),
            ["three steps per chunk"] = NcCopy(written, Path.Combine(folder, "step-chunks.nc"), "time/3,station/3,frequency/32,direction/24"),
        };
        using var original = PointSpectraFile.Open(written);
        var reference = IntegratedSpectra.Integrate(original);
        foreach (var (layout, path) in files)
        {
            using var file = PointSpectraFile.Open(path);
            var other = IntegratedSpectra.Integrate(file);
            for (int s = 0; s < 3; s++)
            {
                foreach (var parameter in new[] { WaveParameter.Hs, WaveParameter.Te, WaveParameter.Tp, WaveParameter.Dir, WaveParameter.Spread })
                    Assert.True(reference.Series(parameter, s).SequenceEqual(other.Series(parameter, s)), $"{layout}: {parameter.Symbol()} of station {s} differs");
                foreach (var product in SpectralProducts.All)
                    Assert.True(reference.Product(product, s).SequenceEqual(other.Product(product, s)), $"{layout}: {product} of station {s} differs");
                var (frequency, direction, count) = reference.MonthSum(0, s);
                var (otherFrequency, otherDirection, otherCount) = other.MonthSum(0, s);
                Assert.Equal(count, otherCount);
                Assert.True(frequency.Span.SequenceEqual(otherFrequency.Span) && direction.Span.SequenceEqual(otherDirection.Span), $"{layout}: month sums of station {s} differ");
            }
        }
    }

    // Files are opened side by side, but a refusal is the one reading them in the given order meets first: here the
    // second file (a negative density), not the third (unknown units), and nothing is stored.
    [Fact]
    public async Task TheFirstBadFileInTheGivenOrderIsTheOneReported()
    {
        var folder = Folder();
        var good = PointSpectraFixture.Make(Path.Combine(folder, "good.nc"), 0, 4);
        var negative = PointSpectraFixture.Make(Path.Combine(folder, "negative.nc"), 12, 4, "negative");
        var unknown = PointSpectraFixture.Make(Path.Combine(folder, "unknown.nc"), 24, 4, "units_unknown");
        var error = await Assert.ThrowsAsync<HindcastFormatException>(() =>
            new HindcastIngestor(database.DataSource).RunAsync(new IngestRequest("first-bad", [good, negative, unknown])));
        Assert.Contains("negative density", error.Message);
        Assert.Contains("negative.nc", error.Message);
        Assert.Null(await new DatasetStore(database.DataSource).FindAsync("first-bad"));
    }

    /// <summary>netCDF-C's nccopy: a deflated copy (level 1, shuffled) of <paramref name="source"/> in the given chunks.</summary>
    private static string NcCopy(string source, string target, string chunks)
    {
        var start = new System.Diagnostics.ProcessStartInfo("nccopy", ["-d1", "-s", "-c", chunks, source, target])
        {
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        start.Environment["HDF5_USE_FILE_LOCKING"] = "FALSE";
        using var process = System.Diagnostics.Process.Start(start)!;
        var error = process.StandardError.ReadToEnd();
        process.WaitForExit();
        if (process.ExitCode != 0) throw new InvalidOperationException($"nccopy failed: {error}");
        return target;
    }

    private async Task<StationStepRecord> StationSpectraStoreSteps(int datasetId, int cell) =>
        (await new StationSpectraStore(database.DataSource).StepsOfStationAsync(datasetId, cell, default))[2021];

    private static void AssertRelative(double expected, double actual, double tolerance) =>
        Assert.True(Math.Abs(actual - expected) <= tolerance * Math.Abs(expected), $"expected {expected}, got {actual} (relative tolerance {tolerance})");
}
