using System.Diagnostics;

namespace Atlas.Hindcast.Tests;

/// <summary>
/// A file written through netCDF-C can be read back at once even when a child process started meanwhile (by another
/// thread: a server that runs a tool, tests that run NumPy) inherited the library's descriptor of it. HDF5 1.10 locks a
/// file it writes with flock(LOCK_EX) and opens it without close-on-exec, so the child held the lock after the file was
/// closed here, and .NET's reading (which takes flock(LOCK_SH)) failed with "being used by another process".
/// </summary>
public sealed class WrittenFileLockTests
{
    [Fact]
    public void AFileWrittenWhileAChildProcessStartsReadsBackAtOnce()
    {
        var path = Path.Combine(Directory.CreateTempSubdirectory("atlas-lock-").FullName, "series.nc");
        Process child;
        using (var nc = NetCdfWriter.Create(path))
        {
            nc.DefineDimension("time", 3);
            nc.DefineVariable("j", NetCdfType.Float, ["time"]);
            nc.Write<float>("j", [0], [3], [1f, 2f, 3f]);
            // A child started while the file is open: it inherits every descriptor not marked close-on-exec.
            child = Process.Start(new ProcessStartInfo("sleep", "30") { UseShellExecute = false })!;
        }
        try
        {
            var bytes = File.ReadAllBytes(path);
            Assert.True(bytes.Length > 0);
            // Reference: the file as netCDF-C's own ncdump reads it.
            Assert.Contains("j = 1, 2, 3 ;", TestSupport.ExternalTool.Run("ncdump", path));
        }
        finally
        {
            child.Kill();
            child.WaitForExit();
        }
    }
}
