using System.Text.Json;
using Atlas.TestSupport;

namespace Atlas.Hindcast.Tests;

/// <summary>
/// Conventions of real model and reanalysis output (peak frequency, a time-varying depth named as models name it,
/// unit spellings), in files written by netCDF4-python through tests/data/ingest/make_fixture.py (never copied from a
/// product). Reference values: netCDF4-python's own reading of each file (read_back.py, auto mask and scale), and the
/// script's closed form for the depth.
/// </summary>
public sealed class RealFileConventionTests
{
    private const int Nx = 6, Ny = 5;
    private readonly NetCdfFixtures _fixtures = NetCdfFixtures.Shared;

    [Theory]
    [InlineData("s-1")]
    [InlineData("Hz")]
    [InlineData("1/s")]
    public void PeakFrequencyBecomesPeakPeriod(string units)
    {
        var path = Make("fp.nc", 4, $"--peak-frequency {units}");
        using var file = HindcastFile.Open(path);
        var tp = file.Source(WaveParameter.Tp)!;
        Assert.Equal("fp", tp.Name);
        Assert.True(tp.Reciprocal);
        var decoded = ReadAll(file, WaveParameter.Tp, 4);
        // Reference: netCDF4-python reads fp (Hz); Tp = 1 / fp to float32 rounding (1e-6 relative). fp = 0 at step 0 of
        // point (j=1, i=1) has no period: missing.
        var fp = Values(ReadBack(path).GetProperty("variables").GetProperty("fp"));
        for (var k = 0; k < fp.Length; k++)
        {
            if (float.IsNaN(fp[k]) || fp[k] <= 0) Assert.True(float.IsNaN(decoded[k]), $"value {k}: fp {fp[k]} must give a missing Tp");
            else Assert.Equal(1.0 / fp[k], decoded[k], 1e-6 * decoded[k]);
        }
        Assert.True(float.IsNaN(decoded[1 * Nx + 1]));
        Assert.Contains("Tp = 1/fp", tp.DescribeConversion(file.DecoderOf(WaveParameter.Tp)!));
    }

    [Fact]
    public void TimeVaryingDepthNamedDepthIsItsTimeMean()
    {
        // dpt(time, lat, lon), standard_name "depth", in cm and positive = "up": the script writes -(depth + tide) * 100
        // with a tide of -0.5 m at even steps and +0.5 m at odd ones, so the mean of 4 steps is the static depth
        // 5 + 10 i m (closed form of make_fixture.py), to float32 rounding.
        var path = Make("dpt.nc", 4, "--depth-name dpt --depth-standard-name depth --depth-time --depth-units cm --depth-positive up");
        using var file = HindcastFile.Open(path);
        var depth = file.Source(WaveParameter.Depth)!;
        Assert.Equal("dpt", depth.Name);
        Assert.True(depth.PositiveUp);
        var field = file.ReadDepthField();
        Assert.True(field.TimeVarying);
        Assert.Equal(4, field.Steps);
        for (var p = 1; p < Nx * Ny; p++) Assert.Equal(5.0 + 10.0 * (p % Nx), field.Metres[p], 1e-4);
        Assert.True(float.IsNaN(field.Metres[0]));
        // Reference: netCDF4-python's values of dpt, negated, from cm to m and averaged over the steps.
        var raw = Values(ReadBack(path).GetProperty("variables").GetProperty("dpt"));
        for (var p = 1; p < Nx * Ny; p++)
        {
            var mean = Enumerable.Range(0, 4).Average(s => -raw[s * Nx * Ny + p] / 100.0);
            Assert.Equal(mean, field.Metres[p], 1e-4);
        }
    }

    [Theory]
    [InlineData("wdepth")]
    [InlineData("deptho")]
    [InlineData("dpt")]
    public void WaterDepthIsFoundByTheNameModelsGiveIt(string name)
    {
        var path = Make($"byname-{name}.nc", 2, $"--depth-name {name} --depth-standard-name none");
        using var file = HindcastFile.Open(path);
        var depth = file.Source(WaveParameter.Depth)!;
        Assert.Equal(name, depth.Name);
        Assert.Equal(VariableMatch.Name, depth.MatchedBy);
        Assert.Equal(15f, file.ReadDepth()[1]);
    }

    [Fact]
    public void ADepthLookalikeWithoutUnitsIsNotTakenButNamed()
    {
        var path = Make("lookalike.nc", 2, "--depth-name dpt --depth-standard-name none --depth-units \"\"");
        using var file = HindcastFile.Open(path);
        Assert.False(file.Has(WaveParameter.Depth));
        using var raw = NetCdfFile.Open(path);
        var lookalike = CfDecoder.WaterDepthLookalike(raw);
        Assert.Equal("dpt", lookalike!.Name);
        Assert.Contains("no units", lookalike.Reason);
        Assert.True(lookalike.OnTheWaveGrid);
    }

    [Theory]
    [InlineData("Degree true")]
    [InlineData("degrees_true")]
    [InlineData("degree_true")]
    [InlineData("deg")]
    [InlineData("°")]
    [InlineData("degrees")]
    [InlineData("degree")]
    [InlineData("radian")]
    [InlineData("radians")]
    [InlineData("rad")]
    public void DirectionUnitSpellingsOfRealFilesAreRead(string units)
    {
        var path = Make("dir-units.nc", 2, $"--dir-units \"{units}\" --spread-units \"{units}\"");
        using var file = HindcastFile.Open(path);
        var factor = units.StartsWith("rad") ? 180 / Math.PI : 1;
        // Reference: netCDF4-python's values in the file's units, times 180/pi for radians (SI Brochure); 1e-5 degree
        // covers float32 rounding of a radian value.
        var variables = ReadBack(path).GetProperty("variables");
        foreach (var (wave, name) in new[] { (WaveParameter.Dir, "dir"), (WaveParameter.Spread, "spr") })
        {
            var expected = Values(variables.GetProperty(name));
            var decoded = ReadAll(file, wave, 2);
            for (var k = 0; k < expected.Length; k++)
            {
                if (float.IsNaN(expected[k])) { Assert.True(float.IsNaN(decoded[k])); continue; }
                var e = expected[k] * factor;
                var d = Math.Abs(decoded[k] - e);
                Assert.True(Math.Min(d, 360 - d) < 1e-4, $"{name} '{units}' value {k}: {decoded[k]} against {e}");
            }
        }
    }

    [Fact]
    public void WaveHeightInCentimetresIsReadInMetres()
    {
        var path = Make("hs-cm.nc", 2, "--hs-units cm");
        using var file = HindcastFile.Open(path);
        // Reference: netCDF4-python's values in cm, / 100 (SI Brochure).
        var expected = Values(ReadBack(path).GetProperty("variables").GetProperty("hs"));
        var decoded = ReadAll(file, WaveParameter.Hs, 2);
        for (var k = 0; k < expected.Length; k++)
            if (!float.IsNaN(expected[k])) Assert.Equal(expected[k] / 100.0, decoded[k], 1e-6);
    }

    private string Make(string name, int steps, string options)
    {
        var path = _fixtures.Scratch(name);
        var script = Path.Combine(AppContext.BaseDirectory, "ingest", "make_fixture.py");
        ExternalTool.Run("/bin/sh", ["-c", $"{ExternalTool.Python} \"{script}\" \"{path}\" 0 {steps} {options}"]);
        return path;
    }

    private static JsonElement ReadBack(string path)
    {
        using var document = JsonDocument.Parse(ExternalTool.Run(ExternalTool.Python, [NetCdfFixtures.Source("read_back.py"), path]));
        return document.RootElement.GetProperty(path).Clone();
    }

    private static float[] Values(JsonElement variable) => NetCdfFixtures.Values(variable);

    private static float[] ReadAll(HindcastFile file, WaveParameter wave, int steps)
    {
        var values = new float[steps * Nx * Ny];
        file.ReadSteps(wave, 0, steps, 0, Nx * Ny, values);
        return values;
    }
}
