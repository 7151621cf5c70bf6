using System.Runtime.InteropServices;
using System.Text;
using Atlas.Hindcast.Native;

namespace Atlas.Hindcast;

/// <summary>
/// A netCDF file opened read-only through netCDF-C: its dimensions, variables and attributes (root group), and
/// hyperslab reads of any variable into caller-owned memory, so a file larger than memory can be streamed.
/// Works on every format the library reads: classic, 64-bit offset, CDF5, NetCDF-4/HDF5 (chunked, compressed).
/// </summary>
/// <remarks>Variables in sub-groups of a NetCDF-4 file are not listed; CF hindcast files keep theirs in the root.</remarks>
public sealed unsafe class NetCdfFile : IDisposable
{
    private readonly NetCdfHandle _handle;
    private readonly Dictionary<string, NetCdfVariable> _byName;
    private readonly Dictionary<string, NetCdfAttribute> _globalByName;

    /// <summary>The file's size when opened, the most any attribute can hold.</summary>
    private long FileBytes { get; }

    private NetCdfFile(string path, NetCdfHandle handle)
    {
        Path = path;
        FileBytes = new FileInfo(path).Length;
        _handle = handle;
        int ncid = handle.Id;
        lock (NetCdfNative.Gate)
        {
            Check(NetCdfNative.nc_inq_format(ncid, out int format), null, "nc_inq_format");
            Format = (NetCdfFormat)format;
            Check(NetCdfNative.nc_inq(ncid, out _, out int nvars, out int ngatts, out _), null, "nc_inq");
            Dimensions = ReadDimensions(ncid);
            GlobalAttributes = ReadAttributes(ncid, NetCdfNative.NC_GLOBAL, ngatts, null);
            var variables = new List<NetCdfVariable>(nvars);
            for (int varid = 0; varid < nvars; varid++) variables.Add(ReadVariable(ncid, varid));
            Variables = variables;
        }
        _byName = Variables.ToDictionary(v => v.Name, StringComparer.Ordinal);
        _globalByName = GlobalAttributes.ToDictionary(a => a.Name, StringComparer.Ordinal);
    }

    /// <summary>Opens <paramref name="path"/> read-only. Throws <see cref="NetCdfException"/> for a file netCDF-C cannot open.</summary>
    public static NetCdfFile Open(string path)
    {
        ArgumentException.ThrowIfNullOrEmpty(path);
        if (!File.Exists(path)) throw new FileNotFoundException($"{path}: no such file", path);
        // Before the library sees a classic-model file: a damaged header count makes nc_open allocate and copy
        // gigabytes for a file of kilobytes (found by the ingest fuzz test). An HDF5 file passes untouched.
        RequireComplete(path);
        int status = 0, ncid = -1;
        string? damage;
        lock (NetCdfNative.Gate)
        {
            NetCdfNative.Load();
            NetCdfNative.QuietenThisThread();
            // A damaged link index would make the HDF5 under netCDF-C corrupt this process's heap (see the check).
            damage = Hdf5LinkIndexCheck.Problem(path);
            if (damage is null) status = NetCdfNative.nc_open(path, NetCdfNative.NC_NOWRITE, out ncid);
        }
        if (damage is not null) throw new HindcastFormatException(path, null, damage + "; the file was not opened further");
        NetCdfException.Check(status, path, null, "nc_open");
        var handle = new NetCdfHandle(ncid);
        try
        {
            return new NetCdfFile(path, handle);
        }
        catch
        {
            handle.Dispose();
            throw;
        }
    }

    /// <summary>
    /// netCDF-C reads the missing tail of a cut classic file as zeros, so compare the size the header needs with the
    /// size on disk; walking the header also refuses counts and lengths that run past the end of the file. (HDF5
    /// checks this itself and refuses to open a cut NetCDF-4 file; anything but a classic file passes.)
    /// </summary>
    private static void RequireComplete(string path)
    {
        long? required = ClassicFileExtent.RequiredBytes(path);
        long actual = new FileInfo(path).Length;
        if (required > actual)
            throw new HindcastFormatException(path, null,
                $"truncated: the header describes {required} bytes of data but the file has {actual} bytes");
    }

    /// <summary>The netCDF-C version in use (nc_inq_libvers), for provenance records.</summary>
    public static string LibraryVersion
    {
        get
        {
            lock (NetCdfNative.Gate) return NetCdfNative.LibraryVersion;
        }
    }

    public string Path { get; }
    public NetCdfFormat Format { get; }
    public IReadOnlyList<NetCdfDimension> Dimensions { get; }
    public IReadOnlyList<NetCdfVariable> Variables { get; }
    public IReadOnlyList<NetCdfAttribute> GlobalAttributes { get; }

    public NetCdfVariable? FindVariable(string name) => _byName.GetValueOrDefault(name);

    /// <summary>The variable called <paramref name="name"/>; throws a format error naming the file when absent.</summary>
    public NetCdfVariable Variable(string name) =>
        FindVariable(name) ?? throw new HindcastFormatException(Path, name, "no such variable in the file");

    public NetCdfAttribute? GlobalAttribute(string name) => _globalByName.GetValueOrDefault(name);

    /// <summary>
    /// Reads the hyperslab <paramref name="start"/>/<paramref name="count"/> of <paramref name="variable"/> into
    /// <paramref name="destination"/> in row-major order, converting to <typeparamref name="T"/> inside netCDF-C.
    /// T is one of float, double, short, ushort, int, uint, long, sbyte, byte.
    /// </summary>
    public void Read<T>(NetCdfVariable variable, ReadOnlySpan<long> start, ReadOnlySpan<long> count, Span<T> destination)
        where T : unmanaged
    {
        int rank = variable.Rank;
        if (start.Length != rank || count.Length != rank)
            throw new ArgumentException($"variable '{variable.Name}' has {rank} dimensions; start/count have {start.Length}/{count.Length}");
        long total = 1;
        for (int d = 0; d < rank; d++)
        {
            if (start[d] < 0 || count[d] < 0 || start[d] + count[d] > variable.Dimensions[d].Length)
                throw new ArgumentOutOfRangeException(nameof(start),
                    $"{Path}: variable '{variable.Name}': slab [{start[d]}, +{count[d]}) outside dimension '{variable.Dimensions[d].Name}' of length {variable.Dimensions[d].Length}");
            total *= count[d];
        }
        if (destination.Length < total)
            throw new ArgumentException($"destination holds {destination.Length} values; the slab has {total}", nameof(destination));
        if (total == 0) return;

        nuint* s = stackalloc nuint[Math.Max(rank, 1)];
        nuint* c = stackalloc nuint[Math.Max(rank, 1)];
        for (int d = 0; d < rank; d++)
        {
            s[d] = (nuint)start[d];
            c[d] = (nuint)count[d];
        }
        int status;
        fixed (T* p = destination)
        {
            int ncid = _handle.Id;
            lock (NetCdfNative.Gate) status = ReadNative(ncid, variable.Id, s, c, p);
        }
        Check(status, variable.Name, NativeReadName<T>());
    }

    /// <summary>Reads a whole variable (coordinates, small static fields) into a new array.</summary>
    public T[] ReadAll<T>(NetCdfVariable variable) where T : unmanaged
    {
        if (variable.Length > Array.MaxLength)
            throw new HindcastFormatException(Path, variable.Name, $"too large to read whole ({variable.Length} values)");
        var data = new T[variable.Length];
        Read(variable, new long[variable.Rank], variable.Shape, data.AsSpan());
        return data;
    }

    /// <summary>
    /// Reads a variable of text labels (station names, for example): a char variable (n, length) gives n strings cut at
    /// their first NUL and trimmed, a string variable (n) its n strings; a 1-D char variable gives one string.
    /// </summary>
    public string[] ReadStrings(NetCdfVariable variable)
    {
        int rank = variable.Rank;
        if (variable.Type == NetCdfType.Char)
        {
            if (rank is < 1 or > 2) throw new HindcastFormatException(Path, variable.Name, $"a char variable of labels must have one or two dimensions, not {rank}");
            long count = rank == 2 ? variable.Dimensions[0].Length : 1, width = variable.Dimensions[rank - 1].Length;
            var bytes = new byte[Math.Max(count * width, 1)];
            nuint* s = stackalloc nuint[2];
            nuint* c = stackalloc nuint[2];
            for (int d = 0; d < rank; d++) { s[d] = 0; c[d] = (nuint)variable.Dimensions[d].Length; }
            int status;
            fixed (byte* p = bytes)
                lock (NetCdfNative.Gate) status = NetCdfNative.nc_get_vara_text(_handle.Id, variable.Id, s, c, p);
            Check(status, variable.Name, "nc_get_vara_text");
            var labels = new string[count];
            for (long k = 0; k < count; k++)
            {
                var text = Encoding.UTF8.GetString(bytes, (int)(k * width), (int)width);
                labels[k] = (text.IndexOf('\0') is >= 0 and var nul ? text[..nul] : text).Trim();
            }
            return labels;
        }
        if (variable.Type == NetCdfType.String)
        {
            if (rank != 1) throw new HindcastFormatException(Path, variable.Name, $"a string variable of labels must have one dimension, not {rank}");
            long count = variable.Dimensions[0].Length;
            var pointers = new IntPtr[Math.Max(count, 1)];
            nuint start = 0, length = (nuint)count;
            int status;
            fixed (IntPtr* p = pointers)
            {
                lock (NetCdfNative.Gate) status = NetCdfNative.nc_get_vara_string(_handle.Id, variable.Id, &start, &length, p);
                Check(status, variable.Name, "nc_get_vara_string");
                var labels = pointers.Take((int)count).Select(ptr => (Marshal.PtrToStringUTF8(ptr) ?? "").Trim()).ToArray();
                lock (NetCdfNative.Gate) NetCdfNative.nc_free_string(length, p);
                return labels;
            }
        }
        throw new HindcastFormatException(Path, variable.Name, $"has type {variable.Type}; labels must be char or string");
    }

    /// <summary>
    /// Sets the HDF5 chunk cache of one variable (NetCDF-4 only; a no-op for the classic formats). A zero size makes
    /// HDF5 read the selected bytes of uncompressed chunks straight from the file rather than whole chunks.
    /// </summary>
    public void SetChunkCache(NetCdfVariable variable, long bytes, int slots)
    {
        if (Format is not (NetCdfFormat.NetCdf4 or NetCdfFormat.NetCdf4Classic)) return;
        int status;
        int ncid = _handle.Id;
        lock (NetCdfNative.Gate) status = NetCdfNative.nc_set_var_chunk_cache(ncid, variable.Id, (nuint)bytes, (nuint)slots, 0.75f);
        Check(status, variable.Name, "nc_set_var_chunk_cache");
    }

    public void Dispose() => _handle.Dispose();

    private static int ReadNative<T>(int ncid, int varid, nuint* s, nuint* c, T* p) where T : unmanaged
    {
        if (typeof(T) == typeof(float)) return NetCdfNative.nc_get_vara_float(ncid, varid, s, c, (float*)p);
        if (typeof(T) == typeof(double)) return NetCdfNative.nc_get_vara_double(ncid, varid, s, c, (double*)p);
        if (typeof(T) == typeof(short)) return NetCdfNative.nc_get_vara_short(ncid, varid, s, c, (short*)p);
        if (typeof(T) == typeof(ushort)) return NetCdfNative.nc_get_vara_ushort(ncid, varid, s, c, (ushort*)p);
        if (typeof(T) == typeof(int)) return NetCdfNative.nc_get_vara_int(ncid, varid, s, c, (int*)p);
        if (typeof(T) == typeof(uint)) return NetCdfNative.nc_get_vara_uint(ncid, varid, s, c, (uint*)p);
        if (typeof(T) == typeof(long)) return NetCdfNative.nc_get_vara_longlong(ncid, varid, s, c, (long*)p);
        if (typeof(T) == typeof(sbyte)) return NetCdfNative.nc_get_vara_schar(ncid, varid, s, c, (sbyte*)p);
        if (typeof(T) == typeof(byte)) return NetCdfNative.nc_get_vara_uchar(ncid, varid, s, c, (byte*)p);
        throw new NotSupportedException($"netCDF reads into {typeof(T).Name} are not supported");
    }

    private static string NativeReadName<T>() => typeof(T) == typeof(float) ? "nc_get_vara_float"
        : typeof(T) == typeof(double) ? "nc_get_vara_double"
        : typeof(T) == typeof(short) ? "nc_get_vara_short"
        : typeof(T) == typeof(byte) ? "nc_get_vara_uchar"
        : typeof(T) == typeof(sbyte) ? "nc_get_vara_schar"
        : "nc_get_vara_" + typeof(T).Name.ToLowerInvariant();

    private void Check(int status, string? variable, string operation) =>
        NetCdfException.Check(status, Path, variable, operation);

    private IReadOnlyList<NetCdfDimension> ReadDimensions(int ncid)
    {
        Check(NetCdfNative.nc_inq_dimids(ncid, out int ndims, null, 0), null, "nc_inq_dimids");
        var ids = new int[ndims];
        fixed (int* p = ids) Check(NetCdfNative.nc_inq_dimids(ncid, out ndims, p, 0), null, "nc_inq_dimids");
        Check(NetCdfNative.nc_inq_unlimdims(ncid, out int nunlim, null), null, "nc_inq_unlimdims");
        var unlimited = new int[Math.Max(nunlim, 1)];
        fixed (int* p = unlimited) Check(NetCdfNative.nc_inq_unlimdims(ncid, out nunlim, p), null, "nc_inq_unlimdims");
        var unlimitedIds = unlimited.Take(nunlim).ToHashSet();

        var result = new List<NetCdfDimension>(ndims);
        byte* name = stackalloc byte[NetCdfNative.NC_MAX_NAME + 1];
        foreach (int id in ids)
        {
            Check(NetCdfNative.nc_inq_dim(ncid, id, name, out nuint length), null, "nc_inq_dim");
            result.Add(new NetCdfDimension(id, Utf8(name), (long)length, unlimitedIds.Contains(id)));
        }
        return result;
    }

    private NetCdfVariable ReadVariable(int ncid, int varid)
    {
        byte* nameBuffer = stackalloc byte[NetCdfNative.NC_MAX_NAME + 1];
        Check(NetCdfNative.nc_inq_var(ncid, varid, nameBuffer, out int xtype, out int ndims, null, out int natts), null, "nc_inq_var");
        string name = Utf8(nameBuffer);
        var dimids = new int[ndims];
        fixed (int* p = dimids) Check(NetCdfNative.nc_inq_var(ncid, varid, null, out _, out _, p, out _), name, "nc_inq_var");
        var dimensions = dimids.Select(id => Dimensions.First(d => d.Id == id)).ToArray();

        var storage = NetCdfStorage.Contiguous;
        long[]? chunks = null;
        int deflateLevel = 0;
        bool shuffle = false;
        if (Format is NetCdfFormat.NetCdf4 or NetCdfFormat.NetCdf4Classic)
        {
            var sizes = new nuint[Math.Max(ndims, 1)];
            int kind;
            fixed (nuint* p = sizes) Check(NetCdfNative.nc_inq_var_chunking(ncid, varid, out kind, p), name, "nc_inq_var_chunking");
            storage = kind switch
            {
                NetCdfNative.NC_CHUNKED => NetCdfStorage.Chunked,
                NetCdfNative.NC_COMPACT => NetCdfStorage.Compact,
                _ => NetCdfStorage.Contiguous,
            };
            if (storage == NetCdfStorage.Chunked) chunks = sizes.Take(ndims).Select(v => (long)v).ToArray();
            Check(NetCdfNative.nc_inq_var_deflate(ncid, varid, out int shuf, out int deflate, out int level), name, "nc_inq_var_deflate");
            deflateLevel = deflate != 0 ? level : 0;
            shuffle = shuf != 0;
        }
        var attributes = ReadAttributes(ncid, varid, natts, name);
        return new NetCdfVariable(varid, name, (NetCdfType)xtype, dimensions, attributes, storage, chunks, deflateLevel, shuffle);
    }

    private List<NetCdfAttribute> ReadAttributes(int ncid, int varid, int count, string? variable)
    {
        var result = new List<NetCdfAttribute>(count);
        byte* nameBuffer = stackalloc byte[NetCdfNative.NC_MAX_NAME + 1];
        for (int i = 0; i < count; i++)
        {
            Check(NetCdfNative.nc_inq_attname(ncid, varid, i, nameBuffer), variable, "nc_inq_attname");
            string name = Utf8(nameBuffer);
            Check(NetCdfNative.nc_inq_att(ncid, varid, name, out int xtype, out nuint length), variable, "nc_inq_att");
            // Attribute values are stored uncompressed in every format, so a damaged header that claims more values than
            // the file has bytes would otherwise make the library fill gigabytes from a file of kilobytes.
            if (length > (nuint)Math.Min(FileBytes, int.MaxValue - 1))
                throw new HindcastFormatException(Path, variable,
                    $"attribute '{name}' claims {length} values, more than the file's {FileBytes} bytes can hold (a damaged header)");
            result.Add(ReadAttribute(ncid, varid, name, (NetCdfType)xtype, (int)length, variable));
        }
        return result;
    }

    private NetCdfAttribute ReadAttribute(int ncid, int varid, string name, NetCdfType type, int length, string? variable)
    {
        switch (type)
        {
            case NetCdfType.Char:
            {
                var bytes = new byte[length + 1];
                fixed (byte* p = bytes) Check(NetCdfNative.nc_get_att_text(ncid, varid, name, p), variable, $"nc_get_att_text({name})");
                // Text attributes are C strings to every writer: what follows a NUL is padding or damage, never text
                // (and PostgreSQL refuses NUL in the metadata it is copied into).
                var text = Encoding.UTF8.GetString(bytes, 0, length);
                return new NetCdfAttribute(name, type, text.IndexOf('\0') is >= 0 and var nul ? text[..nul] : text, []);
            }
            case NetCdfType.String:
            {
                var pointers = new IntPtr[Math.Max(length, 1)];
                fixed (IntPtr* p = pointers)
                {
                    Check(NetCdfNative.nc_get_att_string(ncid, varid, name, p), variable, $"nc_get_att_string({name})");
                    var strings = pointers.Take(length).Select(ptr => Marshal.PtrToStringUTF8(ptr) ?? "").ToArray();
                    NetCdfNative.nc_free_string((nuint)length, p);
                    return new NetCdfAttribute(name, type, string.Join(",", strings), []);
                }
            }
            case NetCdfType.Int64 or NetCdfType.UInt64:
            {
                var values = new long[Math.Max(length, 1)];
                fixed (long* p = values) Check(NetCdfNative.nc_get_att_longlong(ncid, varid, name, p), variable, $"nc_get_att_longlong({name})");
                return new NetCdfAttribute(name, type, null,
                    values.Take(length).Select(v => type == NetCdfType.UInt64 ? (double)(ulong)v : v).ToArray());
            }
            case NetCdfType.Byte or NetCdfType.UByte or NetCdfType.Short or NetCdfType.UShort or NetCdfType.Int
                or NetCdfType.UInt or NetCdfType.Float or NetCdfType.Double:
            {
                var values = new double[Math.Max(length, 1)];
                fixed (double* p = values) Check(NetCdfNative.nc_get_att_double(ncid, varid, name, p), variable, $"nc_get_att_double({name})");
                return new NetCdfAttribute(name, type, null, values.Take(length).ToArray());
            }
            default:
                // User-defined (compound, enum, opaque, vlen) attributes play no part in CF decoding.
                return new NetCdfAttribute(name, type, null, []);
        }
    }

    private static string Utf8(byte* zeroTerminated) => Marshal.PtrToStringUTF8((IntPtr)zeroTerminated) ?? "";
}
