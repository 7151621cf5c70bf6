using System.Runtime.InteropServices;

namespace Atlas.Hindcast.Native;

/// <summary>
/// Before netCDF-C opens a NetCDF-4 file, reads the root group's index of links (the names of its variables and
/// dimensions) through HDF5 the one way that cannot harm the process, and refuses the file when that index is damaged.
/// </summary>
/// <remarks>
/// HDF5 1.10 (the one Debian 12 ships under netCDF-C) lists a group kept in dense storage by first copying its links
/// into a table. When a damaged link stops the copy, it releases the whole table, entries it never filled included:
/// it frees whatever an earlier allocation left in that memory, corrupts the heap, and the process crashes later at
/// an unrelated place (found by the ingest fuzz test; under glibc's checking allocator, <c>MALLOC_CHECK_=3</c>, at
/// once; valgrind reports the uninitialised reads). netCDF-C asks for the links in creation order, which takes that
/// path. Walking the name index in its own (native) order visits the links without the table; a damaged link then
/// fails the walk cleanly. Groups kept in compact storage (8 links or fewer) are listed through a table whatever the
/// order, so they are not walked here (their link messages are read with the group's header, before any table: 400
/// copies of such a file with up to 24 random bytes in its first 2 KB, each opened twice under the checking allocator
/// and once under valgrind, gave neither an abort nor a report); nor are sub-groups, which CF hindcast files do not
/// use. Call inside <see cref="NetCdfNative.Gate"/>.
/// </remarks>
internal static unsafe class Hdf5LinkIndexCheck
{
    private const int StorageDense = 2;      // H5G_STORAGE_TYPE_DENSE
    private const int IndexName = 0;         // H5_INDEX_NAME
    private const int OrderNative = 2;       // H5_ITER_NATIVE
    private const uint ReadOnly = 0;         // H5F_ACC_RDONLY
    private const long DefaultProperties = 0; // H5P_DEFAULT

    private static ReadOnlySpan<byte> Signature => [0x89, (byte)'H', (byte)'D', (byte)'F', 0x0D, 0x0A, 0x1A, 0x0A];

    private static readonly Functions? Hdf5 = Find();

    private sealed class Functions
    {
        public delegate* unmanaged<byte*, uint, long, long> Open;
        public delegate* unmanaged<long, int> Close;
        public delegate* unmanaged<long, byte*, int> GroupInfo;
        public delegate* unmanaged<long, int, int, ulong*, delegate* unmanaged<long, byte*, void*, void*, int>, void*, int> Iterate;
    }

    private static Functions? Find()
    {
        NetCdfNative.Load();
        var library = NetCdfNative.Hdf5;
        if (library == IntPtr.Zero) return null;
        // hid_t is 64 bits from HDF5 1.10 on (soname 103 and later), the only versions looked for.
        if (!NativeLibrary.TryGetExport(library, "H5Fopen", out var open) ||
            !NativeLibrary.TryGetExport(library, "H5Fclose", out var close) ||
            !NativeLibrary.TryGetExport(library, "H5Gget_info", out var info) ||
            !(NativeLibrary.TryGetExport(library, "H5Literate2", out var iterate) || NativeLibrary.TryGetExport(library, "H5Literate", out iterate)))
            return null;
        return new Functions
        {
            Open = (delegate* unmanaged<byte*, uint, long, long>)open,
            Close = (delegate* unmanaged<long, int>)close,
            GroupInfo = (delegate* unmanaged<long, byte*, int>)info,
            Iterate = (delegate* unmanaged<long, int, int, ulong*, delegate* unmanaged<long, byte*, void*, void*, int>, void*, int>)iterate,
        };
    }

    /// <summary>
    /// What is wrong with the root group's link index of an HDF5 file at <paramref name="path"/>, or null when it reads
    /// whole, when the file is not HDF5 (a classic netCDF file), or when HDF5 was not found beside netCDF-C.
    /// </summary>
    public static string? Problem(string path)
    {
        if (Hdf5 is null || !StartsWithSignature(path)) return null;
        var name = System.Text.Encoding.UTF8.GetBytes(path + "\0");
        long file;
        fixed (byte* p = name) file = Hdf5.Open(p, ReadOnly, DefaultProperties);
        // HDF5 refuses a file it cannot open without harm: netCDF-C then says why in its own words.
        if (file < 0) return null;
        try
        {
            // H5G_info_t: storage type (int), link count, maximum creation order, mounted flag: 32 bytes on 64-bit.
            var info = stackalloc byte[64];
            if (Hdf5.GroupInfo(file, info) < 0) return "HDF5 cannot read the root group's header";
            if (*(int*)info != StorageDense) return null;
            ulong position = 0;
            return Hdf5.Iterate(file, IndexName, OrderNative, &position, &Visit, null) < 0
                ? "the index of the variables and dimensions in its root group is damaged (HDF5 cannot read every link in it)"
                : null;
        }
        finally
        {
            Hdf5.Close(file);
        }
    }

    [UnmanagedCallersOnly]
    private static int Visit(long group, byte* linkName, void* info, void* data) => 0;

    private static bool StartsWithSignature(string path)
    {
        Span<byte> start = stackalloc byte[8];
        using var stream = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.ReadWrite, bufferSize: 1);
        return stream.ReadAtLeast(start, start.Length, throwOnEndOfStream: false) == start.Length && start.SequenceEqual(Signature);
    }
}
