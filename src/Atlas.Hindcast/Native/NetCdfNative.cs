using System.Reflection;
using System.Runtime.InteropServices;

namespace Atlas.Hindcast.Native;

/// <summary>
/// Thin P/Invoke declarations for the netCDF-C library (4.x). Signatures are blittable (pointers and
/// size_t as <see cref="nuint"/>) so a slab read is one native call with no marshalling copy.
/// </summary>
/// <remarks>
/// netCDF-C (and the HDF5 it sits on) is not thread-safe in the Debian build, so every caller takes
/// <see cref="Gate"/> around its native calls; decoding of the bytes read happens outside the gate.
/// </remarks>
internal static unsafe class NetCdfNative
{
    private const string Library = "netcdf";

    /// <summary>Sonames tried when the unversioned libnetcdf.so (shipped only by libnetcdf-dev) is absent.</summary>
    private static readonly string[] FallbackNames =
        ["libnetcdf.so.19", "libnetcdf.so.22", "libnetcdf.so.18", "libnetcdf.so.15", "libnetcdf.so.13", "libnetcdf.dylib"];

    /// <summary>Serialises all calls into the library, process-wide.</summary>
    public static readonly Lock Gate = new();

    public const int NC_NOERR = 0;
    public const int NC_GLOBAL = -1;
    public const int NC_MAX_NAME = 256;
    public const int NC_NOWRITE = 0x0000;
    public const int NC_CLOBBER = 0x0000;
    public const int NC_NOCLOBBER = 0x0004;
    public const int NC_64BIT_DATA = 0x0020;
    public const int NC_CLASSIC_MODEL = 0x0100;
    public const int NC_64BIT_OFFSET = 0x0200;
    public const int NC_NETCDF4 = 0x1000;
    public const int NC_CHUNKED = 0;
    public const int NC_COMPACT = 2;

    static NetCdfNative()
    {
        NativeLibrary.SetDllImportResolver(typeof(NetCdfNative).Assembly, Resolve);
    }

    private static IntPtr Resolve(string libraryName, Assembly assembly, DllImportSearchPath? searchPath)
    {
        if (libraryName != Library) return IntPtr.Zero;
        WithoutHdf5FileLocks();
        if (NativeLibrary.TryLoad(libraryName, assembly, searchPath, out var handle)) return Quieten(handle);
        foreach (var name in FallbackNames)
            if (NativeLibrary.TryLoad(name, assembly, searchPath, out handle)) return Quieten(handle);
        throw new DllNotFoundException(
            "netCDF-C was not found: tried 'netcdf' and " + string.Join(", ", FallbackNames) +
            ". Install the Debian package libnetcdf19 (or libnetcdf-dev).");
    }

    /// <summary>
    /// Asks HDF5 not to lock the files it opens (HDF5_USE_FILE_LOCKING=FALSE, its documented switch), unless the
    /// environment already says otherwise. HDF5 1.10 holds flock(LOCK_EX) on a file it writes and opens it without
    /// close-on-exec: a child process started meanwhile by any thread (a tool the server runs, a test's NumPy)
    /// inherits the descriptor and the lock with it, and the finished file cannot be read back until that child
    /// exits (.NET's read takes flock(LOCK_SH): "being used by another process"). The atlas writes only files of its
    /// own, under fresh names, and never has one file open twice for writing, which is what the locks are for. Set in
    /// the process's native environment before HDF5 is loaded, where HDF5 reads it at every open.
    /// </summary>
    private static void WithoutHdf5FileLocks()
    {
        if (!OperatingSystem.IsLinux() && !OperatingSystem.IsMacOS()) return;
        try
        {
            setenv("HDF5_USE_FILE_LOCKING", "FALSE", overwrite: 0);
        }
        catch (Exception e) when (e is DllNotFoundException or EntryPointNotFoundException)
        {
            // A C library without setenv: HDF5 locks as it would anyway.
        }
    }

    [DllImport("libc", EntryPoint = "setenv")]
    private static extern int setenv([MarshalAs(UnmanagedType.LPUTF8Str)] string name, [MarshalAs(UnmanagedType.LPUTF8Str)] string value, int overwrite);

    /// <summary>Sonames of the HDF5 library netCDF-C sits on (Debian builds it as the serial flavour).</summary>
    private static readonly string[] Hdf5Names = ["libhdf5_serial.so.103", "libhdf5.so.103", "libhdf5_serial.so", "libhdf5.so", "libhdf5.dylib"];

    /// <summary>
    /// Turns off HDF5's automatic printing of its error stack. netCDF-C probes optional attributes (quantisation
    /// settings, for one) that are usually absent; HDF5 would print a page of diagnostics to stderr for each probe,
    /// although netCDF-C handles the miss and reports real errors through its own status codes.
    /// </summary>
    private static IntPtr Quieten(IntPtr netcdf)
    {
        foreach (var name in Hdf5Names)
        {
            if (!NativeLibrary.TryLoad(name, out var hdf5)) continue;
            Hdf5 = hdf5;
            if (NativeLibrary.TryGetExport(hdf5, "H5Eset_auto2", out var setAuto)) _setAuto = setAuto;
            break;
        }
        QuietenThisThread();
        return netcdf;
    }

    private static IntPtr _setAuto;

    /// <summary>The HDF5 library netCDF-C was loaded with, or zero when it was not found (a build without NetCDF-4).</summary>
    public static IntPtr Hdf5 { get; private set; }

    /// <summary>Makes sure the library is loaded (and <see cref="Hdf5"/> looked up) before a call that needs HDF5 itself.</summary>
    public static void Load() => nc_inq_libvers();

    [ThreadStatic]
    private static bool _quiet;

    /// <summary>
    /// HDF5 built thread-safe keeps its error-printing setting per thread, so each thread that opens or creates a
    /// file turns it off once. Call inside <see cref="Gate"/>.
    /// </summary>
    public static void QuietenThisThread()
    {
        if (_quiet || _setAuto == IntPtr.Zero) return;
        ((delegate* unmanaged<long, IntPtr, IntPtr, int>)_setAuto)(0, IntPtr.Zero, IntPtr.Zero);
        _quiet = true;
    }

    /// <summary>Text of a netCDF status code, from nc_strerror.</summary>
    public static string ErrorText(int status) =>
        Marshal.PtrToStringUTF8(nc_strerror(status)) ?? $"netCDF status {status}";

    /// <summary>The library's version string, e.g. "4.9.0 of Aug  7 2022".</summary>
    public static string LibraryVersion => Marshal.PtrToStringUTF8(nc_inq_libvers()) ?? "unknown";

    [DllImport(Library, ExactSpelling = true)] private static extern IntPtr nc_strerror(int ncerr);
    [DllImport(Library, ExactSpelling = true)] private static extern IntPtr nc_inq_libvers();

    // Files
    [DllImport(Library, ExactSpelling = true)]
    public static extern int nc_open([MarshalAs(UnmanagedType.LPUTF8Str)] string path, int mode, out int ncid);
    [DllImport(Library, ExactSpelling = true)]
    public static extern int nc_create([MarshalAs(UnmanagedType.LPUTF8Str)] string path, int cmode, out int ncid);
    [DllImport(Library, ExactSpelling = true)] public static extern int nc_close(int ncid);
    [DllImport(Library, ExactSpelling = true)] public static extern int nc_enddef(int ncid);

    // Inquiry
    [DllImport(Library, ExactSpelling = true)]
    public static extern int nc_inq(int ncid, out int ndims, out int nvars, out int ngatts, out int unlimdimid);
    [DllImport(Library, ExactSpelling = true)] public static extern int nc_inq_format(int ncid, out int format);
    [DllImport(Library, ExactSpelling = true)] public static extern int nc_inq_unlimdims(int ncid, out int count, int* dimids);
    [DllImport(Library, ExactSpelling = true)] public static extern int nc_inq_dimids(int ncid, out int count, int* dimids, int includeParents);
    [DllImport(Library, ExactSpelling = true)] public static extern int nc_inq_dim(int ncid, int dimid, byte* name, out nuint length);
    [DllImport(Library, ExactSpelling = true)]
    public static extern int nc_inq_var(int ncid, int varid, byte* name, out int xtype, out int ndims, int* dimids, out int natts);
    [DllImport(Library, ExactSpelling = true)]
    public static extern int nc_inq_var_deflate(int ncid, int varid, out int shuffle, out int deflate, out int level);
    [DllImport(Library, ExactSpelling = true)] public static extern int nc_inq_var_chunking(int ncid, int varid, out int storage, nuint* chunksizes);
    [DllImport(Library, ExactSpelling = true)]
    public static extern int nc_set_var_chunk_cache(int ncid, int varid, nuint size, nuint nelems, float preemption);
    [DllImport(Library, ExactSpelling = true)] public static extern int nc_inq_attname(int ncid, int varid, int attnum, byte* name);
    [DllImport(Library, ExactSpelling = true)]
    public static extern int nc_inq_att(int ncid, int varid, [MarshalAs(UnmanagedType.LPUTF8Str)] string name, out int xtype, out nuint length);

    // Attributes: read
    [DllImport(Library, ExactSpelling = true)]
    public static extern int nc_get_att_text(int ncid, int varid, [MarshalAs(UnmanagedType.LPUTF8Str)] string name, byte* value);
    [DllImport(Library, ExactSpelling = true)]
    public static extern int nc_get_att_double(int ncid, int varid, [MarshalAs(UnmanagedType.LPUTF8Str)] string name, double* value);
    [DllImport(Library, ExactSpelling = true)]
    public static extern int nc_get_att_longlong(int ncid, int varid, [MarshalAs(UnmanagedType.LPUTF8Str)] string name, long* value);
    [DllImport(Library, ExactSpelling = true)]
    public static extern int nc_get_att_string(int ncid, int varid, [MarshalAs(UnmanagedType.LPUTF8Str)] string name, IntPtr* value);
    [DllImport(Library, ExactSpelling = true)] public static extern int nc_free_string(nuint length, IntPtr* value);

    // Attributes: write
    [DllImport(Library, ExactSpelling = true)]
    public static extern int nc_put_att_text(int ncid, int varid, [MarshalAs(UnmanagedType.LPUTF8Str)] string name, nuint length, byte* value);
    [DllImport(Library, ExactSpelling = true)]
    public static extern int nc_put_att_double(int ncid, int varid, [MarshalAs(UnmanagedType.LPUTF8Str)] string name, int xtype, nuint length, double* value);

    // Definitions
    [DllImport(Library, ExactSpelling = true)]
    public static extern int nc_def_dim(int ncid, [MarshalAs(UnmanagedType.LPUTF8Str)] string name, nuint length, out int dimid);
    [DllImport(Library, ExactSpelling = true)]
    public static extern int nc_def_var(int ncid, [MarshalAs(UnmanagedType.LPUTF8Str)] string name, int xtype, int ndims, int* dimids, out int varid);
    [DllImport(Library, ExactSpelling = true)]
    public static extern int nc_def_var_deflate(int ncid, int varid, int shuffle, int deflate, int level);
    [DllImport(Library, ExactSpelling = true)] public static extern int nc_def_var_chunking(int ncid, int varid, int storage, nuint* chunksizes);

    // Hyperslab reads in the caller's memory type; netCDF-C converts from the file type.
    [DllImport(Library, ExactSpelling = true)] public static extern int nc_get_vara_float(int ncid, int varid, nuint* start, nuint* count, float* data);
    [DllImport(Library, ExactSpelling = true)] public static extern int nc_get_vara_double(int ncid, int varid, nuint* start, nuint* count, double* data);
    [DllImport(Library, ExactSpelling = true)] public static extern int nc_get_vara_short(int ncid, int varid, nuint* start, nuint* count, short* data);
    [DllImport(Library, ExactSpelling = true)] public static extern int nc_get_vara_ushort(int ncid, int varid, nuint* start, nuint* count, ushort* data);
    [DllImport(Library, ExactSpelling = true)] public static extern int nc_get_vara_int(int ncid, int varid, nuint* start, nuint* count, int* data);
    [DllImport(Library, ExactSpelling = true)] public static extern int nc_get_vara_uint(int ncid, int varid, nuint* start, nuint* count, uint* data);
    [DllImport(Library, ExactSpelling = true)] public static extern int nc_get_vara_longlong(int ncid, int varid, nuint* start, nuint* count, long* data);
    [DllImport(Library, ExactSpelling = true)] public static extern int nc_get_vara_schar(int ncid, int varid, nuint* start, nuint* count, sbyte* data);
    [DllImport(Library, ExactSpelling = true)] public static extern int nc_get_vara_uchar(int ncid, int varid, nuint* start, nuint* count, byte* data);
    [DllImport(Library, ExactSpelling = true)] public static extern int nc_get_vara_text(int ncid, int varid, nuint* start, nuint* count, byte* data);
    [DllImport(Library, ExactSpelling = true)] public static extern int nc_get_vara_string(int ncid, int varid, nuint* start, nuint* count, IntPtr* data);

    // Hyperslab writes.
    [DllImport(Library, ExactSpelling = true)] public static extern int nc_put_vara_float(int ncid, int varid, nuint* start, nuint* count, float* data);
    [DllImport(Library, ExactSpelling = true)] public static extern int nc_put_vara_double(int ncid, int varid, nuint* start, nuint* count, double* data);
    [DllImport(Library, ExactSpelling = true)] public static extern int nc_put_vara_short(int ncid, int varid, nuint* start, nuint* count, short* data);
    [DllImport(Library, ExactSpelling = true)] public static extern int nc_put_vara_int(int ncid, int varid, nuint* start, nuint* count, int* data);
    [DllImport(Library, ExactSpelling = true)] public static extern int nc_put_vara_schar(int ncid, int varid, nuint* start, nuint* count, sbyte* data);
    [DllImport(Library, ExactSpelling = true)] public static extern int nc_put_vara_uchar(int ncid, int varid, nuint* start, nuint* count, byte* data);
    [DllImport(Library, ExactSpelling = true)] public static extern int nc_put_vara_text(int ncid, int varid, nuint* start, nuint* count, byte* data);
}
