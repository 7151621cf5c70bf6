namespace Atlas.TestSupport;

/// <summary>
/// A NetCDF-4 file whose root group's name index is damaged: the last three records of the index's v2 B-tree leaf
/// (signature "BTLF", type 5, records of a 4-byte name hash and a 7-byte fractal-heap id; HDF5 file format
/// specification, version 2 B-trees) overwritten with 0xFF. The links before them still read, so HDF5 fails in the
/// middle of listing the group, the case in which HDF5 1.10 releases link entries it never filled.
/// </summary>
public static class DamagedNetCdf4
{
    private const byte NameIndexLeaf = 5;
    private const int RecordBytes = 4 + 7, Damaged = 3;

    /// <summary>Writes a fixture with netCDF4-python to <paramref name="path"/> and damages its name index in place.</summary>
    public static string Make(string path)
    {
        NetCdf4PythonFixture.Make(path, 0, 8, "--format NETCDF4");
        var bytes = File.ReadAllBytes(path);
        var leaf = bytes.AsSpan().IndexOf("BTLF"u8);
        while (leaf >= 0 && bytes[leaf + 5] != NameIndexLeaf)
        {
            var next = bytes.AsSpan(leaf + 4).IndexOf("BTLF"u8);
            leaf = next < 0 ? -1 : leaf + 4 + next;
        }
        if (leaf < 0) throw new InvalidOperationException($"{path}: no leaf of a link name index (the root group is not in dense storage)");
        // Signature, version and type take 6 bytes; the fixture's root group holds 9 links (its 9 variables, the dimensions among them as coordinate variables).
        const int links = 9;
        bytes.AsSpan(leaf + 6 + RecordBytes * (links - Damaged), RecordBytes * Damaged).Fill(0xFF);
        File.WriteAllBytes(path, bytes);
        return path;
    }
}
