using System.Text;
using Atlas.Hindcast.Native;

namespace Atlas.Hindcast;

/// <summary>Storage options of one variable being defined (NetCDF-4 only; ignored by the classic formats).</summary>
/// <param name="DeflateLevel">zlib level 1..9, 0 for none.</param>
/// <param name="Shuffle">Byte shuffle before deflate (helps float data compress).</param>
/// <param name="ChunkSizes">Chunk shape, one length per dimension; null lets netCDF-C choose.</param>
/// <param name="FillValue">Written as _FillValue in the variable's type; null for the netCDF default.</param>
public sealed record NetCdfVariableOptions(int DeflateLevel = 0, bool Shuffle = false, long[]? ChunkSizes = null, double? FillValue = null);

/// <summary>
/// Writes a netCDF file through netCDF-C: define dimensions, variables and attributes, end the definitions, then
/// put hyperslabs. <see cref="Close"/> (or Dispose) must succeed for the file to be complete.
/// </summary>
public sealed unsafe class NetCdfWriter : IDisposable
{
    private readonly NetCdfHandle _handle;
    private readonly Dictionary<string, (int Id, NetCdfType Type, int Rank)> _variables = new(StringComparer.Ordinal);
    private readonly Dictionary<string, int> _dimensions = new(StringComparer.Ordinal);
    private bool _defining = true;

    private NetCdfWriter(string path, NetCdfFormat format, NetCdfHandle handle)
    {
        Path = path;
        Format = format;
        _handle = handle;
    }

    /// <summary>Creates (or replaces, when <paramref name="overwrite"/>) a file in <paramref name="format"/>.</summary>
    public static NetCdfWriter Create(string path, NetCdfFormat format = NetCdfFormat.NetCdf4, bool overwrite = true)
    {
        ArgumentException.ThrowIfNullOrEmpty(path);
        int mode = (overwrite ? NetCdfNative.NC_CLOBBER : NetCdfNative.NC_NOCLOBBER) | format switch
        {
            NetCdfFormat.Classic => 0,
            NetCdfFormat.Offset64 => NetCdfNative.NC_64BIT_OFFSET,
            NetCdfFormat.Cdf5 => NetCdfNative.NC_64BIT_DATA,
            NetCdfFormat.NetCdf4 => NetCdfNative.NC_NETCDF4,
            NetCdfFormat.NetCdf4Classic => NetCdfNative.NC_NETCDF4 | NetCdfNative.NC_CLASSIC_MODEL,
            _ => throw new ArgumentOutOfRangeException(nameof(format)),
        };
        int status, ncid;
        lock (NetCdfNative.Gate)
        {
            NetCdfNative.QuietenThisThread();
            status = NetCdfNative.nc_create(path, mode, out ncid);
        }
        NetCdfException.Check(status, path, null, "nc_create");
        return new NetCdfWriter(path, format, new NetCdfHandle(ncid));
    }

    public string Path { get; }
    public NetCdfFormat Format { get; }

    private bool IsNetCdf4 => Format is NetCdfFormat.NetCdf4 or NetCdfFormat.NetCdf4Classic;

    /// <summary>Defines a dimension; a null length makes it unlimited.</summary>
    public void DefineDimension(string name, long? length)
    {
        RequireDefining();
        int status, id;
        lock (NetCdfNative.Gate) status = NetCdfNative.nc_def_dim(_handle.Id, name, (nuint)(length ?? 0), out id);
        Check(status, null, $"nc_def_dim({name})");
        _dimensions[name] = id;
    }

    /// <summary>Defines a variable over named dimensions (none for a scalar).</summary>
    public void DefineVariable(string name, NetCdfType type, IReadOnlyList<string> dimensions, NetCdfVariableOptions? options = null)
    {
        RequireDefining();
        var ids = dimensions.Select(d => _dimensions.TryGetValue(d, out int id) ? id
            : throw new ArgumentException($"variable '{name}': dimension '{d}' is not defined")).ToArray();
        int status, varid;
        fixed (int* p = ids)
            lock (NetCdfNative.Gate) status = NetCdfNative.nc_def_var(_handle.Id, name, (int)type, ids.Length, p, out varid);
        Check(status, name, "nc_def_var");
        _variables[name] = (varid, type, ids.Length);
        if (options is null) return;

        if (IsNetCdf4 && options.ChunkSizes is { } chunks)
        {
            if (chunks.Length != ids.Length) throw new ArgumentException($"variable '{name}': {chunks.Length} chunk sizes for {ids.Length} dimensions");
            var sizes = chunks.Select(c => (nuint)c).ToArray();
            fixed (nuint* p = sizes)
                lock (NetCdfNative.Gate) status = NetCdfNative.nc_def_var_chunking(_handle.Id, varid, NetCdfNative.NC_CHUNKED, p);
            Check(status, name, "nc_def_var_chunking");
        }
        if (IsNetCdf4 && (options.DeflateLevel > 0 || options.Shuffle))
        {
            lock (NetCdfNative.Gate)
                status = NetCdfNative.nc_def_var_deflate(_handle.Id, varid, options.Shuffle ? 1 : 0, options.DeflateLevel > 0 ? 1 : 0, options.DeflateLevel);
            Check(status, name, "nc_def_var_deflate");
        }
        if (options.FillValue is { } fill) PutAttribute(name, "_FillValue", type, fill);
    }

    /// <summary>Writes a text attribute on a variable, or a global attribute when <paramref name="variable"/> is null.</summary>
    public void PutAttribute(string? variable, string name, string text)
    {
        int varid = VariableId(variable);
        var bytes = Encoding.UTF8.GetBytes(text);
        int status;
        fixed (byte* p = bytes)
            lock (NetCdfNative.Gate) status = NetCdfNative.nc_put_att_text(_handle.Id, varid, name, (nuint)bytes.Length, p);
        Check(status, variable, $"nc_put_att_text({name})");
    }

    /// <summary>Writes a numeric attribute of <paramref name="type"/> (netCDF-C converts the doubles, failing on overflow).</summary>
    public void PutAttribute(string? variable, string name, NetCdfType type, params double[] values)
    {
        if (!type.IsNumeric()) throw new ArgumentException($"attribute '{name}': {type} is not a numeric type", nameof(type));
        int varid = VariableId(variable);
        int status;
        fixed (double* p = values)
            lock (NetCdfNative.Gate) status = NetCdfNative.nc_put_att_double(_handle.Id, varid, name, (int)type, (nuint)values.Length, p);
        Check(status, variable, $"nc_put_att_double({name})");
    }

    /// <summary>Leaves define mode; required before the first <see cref="Write{T}"/>.</summary>
    public void EndDefinitions()
    {
        if (!_defining) return;
        int status;
        lock (NetCdfNative.Gate) status = NetCdfNative.nc_enddef(_handle.Id);
        Check(status, null, "nc_enddef");
        _defining = false;
    }

    /// <summary>Writes the hyperslab <paramref name="start"/>/<paramref name="count"/> from row-major <paramref name="data"/>.</summary>
    public void Write<T>(string variable, ReadOnlySpan<long> start, ReadOnlySpan<long> count, ReadOnlySpan<T> data) where T : unmanaged
    {
        EndDefinitions();
        var (varid, _, rank) = _variables.TryGetValue(variable, out var v) ? v : throw new ArgumentException($"variable '{variable}' is not defined");
        if (start.Length != rank || count.Length != rank)
            throw new ArgumentException($"variable '{variable}' has {rank} dimensions; start/count have {start.Length}/{count.Length}");
        long total = 1;
        nuint* s = stackalloc nuint[Math.Max(rank, 1)];
        nuint* c = stackalloc nuint[Math.Max(rank, 1)];
        for (int d = 0; d < rank; d++)
        {
            s[d] = (nuint)start[d];
            c[d] = (nuint)count[d];
            total *= count[d];
        }
        if (data.Length < total) throw new ArgumentException($"variable '{variable}': {data.Length} values for a slab of {total}");
        if (total == 0) return;
        int status;
        fixed (T* p = data)
        {
            int ncid = _handle.Id;
            lock (NetCdfNative.Gate)
            {
                status = typeof(T) == typeof(float) ? NetCdfNative.nc_put_vara_float(ncid, varid, s, c, (float*)p)
                    : typeof(T) == typeof(double) ? NetCdfNative.nc_put_vara_double(ncid, varid, s, c, (double*)p)
                    : typeof(T) == typeof(short) ? NetCdfNative.nc_put_vara_short(ncid, varid, s, c, (short*)p)
                    : typeof(T) == typeof(int) ? NetCdfNative.nc_put_vara_int(ncid, varid, s, c, (int*)p)
                    : typeof(T) == typeof(sbyte) ? NetCdfNative.nc_put_vara_schar(ncid, varid, s, c, (sbyte*)p)
                    : typeof(T) == typeof(byte) ? NetCdfNative.nc_put_vara_uchar(ncid, varid, s, c, (byte*)p)
                    : throw new NotSupportedException($"netCDF writes from {typeof(T).Name} are not supported");
            }
        }
        Check(status, variable, "nc_put_vara_" + typeof(T).Name.ToLowerInvariant());
    }

    /// <summary>Writes UTF-8 text into a 1-D char variable (a label such as a station name), padded with NULs.</summary>
    public void WriteText(string variable, string text)
    {
        EndDefinitions();
        var (varid, type, rank) = _variables.TryGetValue(variable, out var v) ? v : throw new ArgumentException($"variable '{variable}' is not defined");
        if (type != NetCdfType.Char || rank != 1) throw new ArgumentException($"variable '{variable}' is not a 1-D char variable");
        var bytes = Encoding.UTF8.GetBytes(text);
        nuint start = 0, count = (nuint)bytes.Length;
        if (bytes.Length == 0) return;
        int status;
        fixed (byte* p = bytes)
            lock (NetCdfNative.Gate) status = NetCdfNative.nc_put_vara_text(_handle.Id, varid, &start, &count, p);
        Check(status, variable, "nc_put_vara_text");
    }

    /// <summary>Writes the hyperslab <paramref name="start"/>/<paramref name="count"/> of a char variable from bytes (labels, NUL padded).</summary>
    public void WriteText(string variable, ReadOnlySpan<long> start, ReadOnlySpan<long> count, ReadOnlySpan<byte> bytes)
    {
        EndDefinitions();
        var (varid, type, rank) = _variables.TryGetValue(variable, out var v) ? v : throw new ArgumentException($"variable '{variable}' is not defined");
        if (type != NetCdfType.Char) throw new ArgumentException($"variable '{variable}' is not a char variable");
        if (start.Length != rank || count.Length != rank)
            throw new ArgumentException($"variable '{variable}' has {rank} dimensions; start/count have {start.Length}/{count.Length}");
        long total = 1;
        nuint* s = stackalloc nuint[Math.Max(rank, 1)];
        nuint* c = stackalloc nuint[Math.Max(rank, 1)];
        for (int d = 0; d < rank; d++) { s[d] = (nuint)start[d]; c[d] = (nuint)count[d]; total *= count[d]; }
        if (bytes.Length < total) throw new ArgumentException($"variable '{variable}': {bytes.Length} bytes for a slab of {total}");
        if (total == 0) return;
        int status;
        fixed (byte* p = bytes)
            lock (NetCdfNative.Gate) status = NetCdfNative.nc_put_vara_text(_handle.Id, varid, s, c, p);
        Check(status, variable, "nc_put_vara_text");
    }

    /// <summary>Closes the file, throwing when netCDF-C reports that the data could not be flushed.</summary>
    public void Close()
    {
        if (_handle.IsClosed) return;
        _handle.Dispose();
        Check(_handle.CloseStatus, null, "nc_close");
    }

    public void Dispose()
    {
        if (!_handle.IsClosed) _handle.Dispose();
    }

    private int VariableId(string? variable) => variable is null ? NetCdfNative.NC_GLOBAL
        : _variables.TryGetValue(variable, out var v) ? v.Id : throw new ArgumentException($"variable '{variable}' is not defined");

    private void RequireDefining()
    {
        if (!_defining) throw new InvalidOperationException($"{Path}: definitions are closed once data have been written");
    }

    private void Check(int status, string? variable, string operation) => NetCdfException.Check(status, Path, variable, operation);
}
