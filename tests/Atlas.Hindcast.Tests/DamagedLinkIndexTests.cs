using Atlas.TestSupport;

namespace Atlas.Hindcast.Tests;

/// <summary>
/// A NetCDF-4 file whose root group's name index is damaged part-way (<see cref="DamagedNetCdf4"/>) is refused before
/// netCDF-C opens it: opened, the HDF5 1.10 under netCDF-C frees pointers it never set and corrupts the heap of the
/// process (netCDF4-python, on the same library, dies of it at once on such a file).
/// </summary>
public sealed class DamagedLinkIndexTests
{
    private readonly string _folder = Directory.CreateTempSubdirectory("atlas-damaged-index-").FullName;

    [Fact]
    public void AFileWhoseLinkIndexIsDamagedIsRefusedNamingTheFileAndTheIndex()
    {
        var path = DamagedNetCdf4.Make(Path.Combine(_folder, "damaged.nc"));
        // Reference: netCDF-C's ncdump cannot read the header either ("NetCDF: HDF error", exit status 1).
        var ncdump = Assert.Throws<InvalidOperationException>(() => ExternalTool.Run("ncdump", "-h", path));
        Assert.Contains("HDF error", ncdump.Message);

        for (var attempt = 0; attempt < 3; attempt++)
        {
            var refusal = Assert.Throws<HindcastFormatException>(() => NetCdfFile.Open(path));
            Assert.Contains(path, refusal.Message);
            Assert.Contains("index of the variables and dimensions in its root group is damaged", refusal.Message);
        }
    }

    [Fact]
    public void TheSameFileUndamagedOpensWithTheVariablesNcdumpLists()
    {
        var path = NetCdf4PythonFixture.Make(Path.Combine(_folder, "whole.nc"), 0, 8, "--format NETCDF4");
        using var file = NetCdfFile.Open(path);
        // Reference: the variable names in ncdump -h's "variables:" section.
        var header = ExternalTool.Run("ncdump", "-h", path);
        var listed = header.Split('\n').SkipWhile(l => l.Trim() != "variables:").Skip(1)
            .Select(l => System.Text.RegularExpressions.Regex.Match(l, @"^\t\w+ (\w+)\(").Groups[1].Value)
            .Where(name => name.Length > 0);
        Assert.Equal(listed.Order(), file.Variables.Select(v => v.Name).Order());
    }
}
