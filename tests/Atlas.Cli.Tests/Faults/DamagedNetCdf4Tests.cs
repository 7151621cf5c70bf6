using Atlas.TestSupport;

namespace Atlas.Cli.Tests.Faults;

/// <summary>
/// Two copies of a NetCDF-4 file with a damaged link index (<see cref="DamagedNetCdf4"/>) given to one ingest, under
/// glibc's checking allocator (<c>MALLOC_CHECK_=3</c> with libc_malloc_debug preloaded, which aborts at the first
/// free of a pointer the heap never handed out): the command refuses the files and exits as a refusal does, instead
/// of dying of heap corruption. Opened by netCDF-C, the second copy's failure frees what the first left behind.
/// </summary>
public sealed class DamagedNetCdf4Tests(TestDatabase database) : IClassFixture<TestDatabase>
{
    /// <summary>glibc's checking allocator (glibc 2.34 and later), for Debian's two architectures.</summary>
    private static readonly string? CheckingAllocator =
        new[] { "/lib/x86_64-linux-gnu/libc_malloc_debug.so.0", "/lib/aarch64-linux-gnu/libc_malloc_debug.so.0" }.FirstOrDefault(File.Exists);

    [Fact]
    public void DamagedLinkIndexesAreRefusedWithoutCorruptingTheHeap()
    {
        var folder = Directory.CreateTempSubdirectory("atlas-damaged-nc4-").FullName;
        var first = DamagedNetCdf4.Make(Path.Combine(folder, "first.nc"));
        var second = Path.Combine(folder, "second.nc");
        File.Copy(first, second);
        var environment = new Dictionary<string, string> { ["ATLAS_DB"] = database.ConnectionString };
        if (CheckingAllocator is not null)
        {
            environment["LD_PRELOAD"] = CheckingAllocator;
            environment["MALLOC_CHECK_"] = "3";
        }

        var (code, output) = AtlasProcess.Run($"ingest \"{first}\" \"{second}\" --dataset damaged-index --no-stats", environment);

        Assert.True(code == 2, $"exit status {code} (134 is an abort, 139 a segmentation fault):\n{output}");
        Assert.Contains("index of the variables and dimensions in its root group is damaged", output);
        Assert.Contains("Nothing was changed", output);
    }
}
