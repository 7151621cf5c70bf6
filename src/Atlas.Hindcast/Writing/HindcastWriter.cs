using System.Buffers;
using System.Globalization;

namespace Atlas.Hindcast;

/// <summary>Unit of a written CF time axis.</summary>
public enum CfTimeUnit { Seconds, Minutes, Hours, Days }

/// <summary>A time axis to write: values count <see cref="Unit"/>s since <see cref="OriginUtc"/>.</summary>
/// <param name="Length">Fixed number of steps, or null for an unlimited (growing) time dimension.</param>
public sealed record CfTimeAxis(DateTime OriginUtc, CfTimeUnit Unit = CfTimeUnit.Hours, int? Length = null)
{
    /// <summary>The CF units string, e.g. "hours since 2001-01-01 00:00:00".</summary>
    public string Units => $"{Unit.ToString().ToLowerInvariant()} since {OriginUtc.ToString("yyyy-MM-dd HH:mm:ss", CultureInfo.InvariantCulture)}";

    internal double Encode(DateTime utc) => Unit switch
    {
        CfTimeUnit.Seconds => (utc - OriginUtc).TotalSeconds,
        CfTimeUnit.Minutes => (utc - OriginUtc).TotalMinutes,
        CfTimeUnit.Hours => (utc - OriginUtc).TotalHours,
        _ => (utc - OriginUtc).TotalDays,
    };
}

/// <summary>The file-wide description of a CF file on a regular latitude/longitude grid.</summary>
public sealed record HindcastWriterOptions
{
    /// <summary>Latitude of each row, strictly monotonic (either direction).</summary>
    public required IReadOnlyList<double> Latitudes { get; init; }

    /// <summary>Longitude of each column, strictly increasing, degrees east.</summary>
    public required IReadOnlyList<double> Longitudes { get; init; }

    /// <summary>The time axis, or null for a file of static 2-D fields (a single layer).</summary>
    public CfTimeAxis? Time { get; init; }

    public required string Title { get; init; }
    public string? Institution { get; init; }
    public string? Source { get; init; }
    public string? History { get; init; }
    public string? Comment { get; init; }
    public string? References { get; init; }

    /// <summary>Further global text attributes (provenance, cautions), written as given.</summary>
    public IReadOnlyDictionary<string, string>? GlobalAttributes { get; init; }

    public NetCdfFormat Format { get; init; } = NetCdfFormat.NetCdf4;
}

/// <summary>A float field to write, with its CF attributes and storage options.</summary>
public sealed record CfField(string Name, string Units)
{
    public string? StandardName { get; init; }
    public string? LongName { get; init; }

    /// <summary>True for a (time, latitude, longitude) field, false for a static (latitude, longitude) field.</summary>
    public bool HasTime { get; init; } = true;

    /// <summary>Written as _FillValue; NaN values are stored as this. Defaults to the netCDF default float fill.</summary>
    public float FillValue { get; init; } = 9.96921e36f;

    public int DeflateLevel { get; init; } = 4;
    public bool Shuffle { get; init; } = true;

    /// <summary>Chunk shape; null gives one chunk per time step (1, ny, nx) for time fields, netCDF-C's choice otherwise.</summary>
    public long[]? ChunkSizes { get; init; }

    /// <summary>Further text attributes, e.g. cell_methods or comment.</summary>
    public IReadOnlyDictionary<string, string>? Attributes { get; init; }
}

/// <summary>
/// Writes CF-1.8 files on a regular latitude/longitude grid through netCDF-C: a time axis (fixed or unlimited),
/// latitude/longitude coordinates, a WGS 84 latitude_longitude grid mapping, float fields with standard_name,
/// long_name, units and _FillValue, optional deflate and chunking, and the caller's global attributes. With no
/// time axis it writes static 2-D layers. NaN is written as each field's fill value.
/// </summary>
public sealed class HindcastWriter : IDisposable
{
    private const string TimeName = "time", LatName = "latitude", LonName = "longitude", CrsName = "crs";
    private readonly NetCdfWriter _writer;
    private readonly HindcastWriterOptions _options;
    private readonly Dictionary<string, CfField> _fields = new(StringComparer.Ordinal);
    private bool _coordinatesWritten;

    private HindcastWriter(NetCdfWriter writer, HindcastWriterOptions options)
    {
        _writer = writer;
        _options = options;
    }

    public string Path => _writer.Path;
    public int Nx => _options.Longitudes.Count;
    public int Ny => _options.Latitudes.Count;

    /// <summary>Creates the file and defines its coordinates and global attributes.</summary>
    public static HindcastWriter Create(string path, HindcastWriterOptions options)
    {
        RequireMonotonic(options.Latitudes, "latitudes", mustIncrease: false);
        RequireMonotonic(options.Longitudes, "longitudes", mustIncrease: true);
        if (options.Latitudes.Any(l => l is < -90 or > 90)) throw new ArgumentOutOfRangeException(nameof(options), "latitudes must lie in -90..90");
        if (options.Time is { } t && t.OriginUtc < new DateTime(1582, 10, 15))
            throw new ArgumentOutOfRangeException(nameof(options), "the time origin must be after 1582-10-15 (standard calendar)");

        var writer = NetCdfWriter.Create(path, options.Format);
        try
        {
            var hw = new HindcastWriter(writer, options);
            hw.DefineCoordinates();
            return hw;
        }
        catch
        {
            writer.Dispose();
            throw;
        }
    }

    /// <summary>Writes a single static layer file: coordinates, one (latitude, longitude) field and the global attributes.</summary>
    public static void WriteLayer(string path, HindcastWriterOptions options, CfField field, ReadOnlySpan<float> values)
    {
        using var writer = Create(path, options with { Time = null });
        writer.DefineField(field with { HasTime = false });
        writer.WriteField(field.Name, values);
        writer.Close();
    }

    /// <summary>Defines a field; all fields must be defined before the first write.</summary>
    public void DefineField(CfField field)
    {
        if (field.HasTime && _options.Time is null)
            throw new InvalidOperationException($"field '{field.Name}' has a time dimension but the file was created without a time axis");
        string[] dims = field.HasTime ? [TimeName, LatName, LonName] : [LatName, LonName];
        long[]? chunks = field.ChunkSizes ?? (field.HasTime ? [1, Ny, Nx] : null);
        _writer.DefineVariable(field.Name, NetCdfType.Float, dims,
            new NetCdfVariableOptions(field.DeflateLevel, field.Shuffle, chunks, field.FillValue));
        if (field.StandardName is not null) _writer.PutAttribute(field.Name, "standard_name", field.StandardName);
        if (field.LongName is not null) _writer.PutAttribute(field.Name, "long_name", field.LongName);
        _writer.PutAttribute(field.Name, "units", field.Units);
        _writer.PutAttribute(field.Name, "grid_mapping", CrsName);
        foreach (var (name, value) in field.Attributes ?? new Dictionary<string, string>())
            _writer.PutAttribute(field.Name, name, value);
        _fields[field.Name] = field;
    }

    /// <summary>Writes the times of steps [<paramref name="start"/>, +n).</summary>
    public void WriteTimes(int start, ReadOnlySpan<DateTime> timesUtc)
    {
        var axis = _options.Time ?? throw new InvalidOperationException("the file was created without a time axis");
        EnsureCoordinates();
        var values = new double[timesUtc.Length];
        for (int k = 0; k < values.Length; k++)
        {
            if (timesUtc[k].Kind == DateTimeKind.Local) throw new ArgumentException("times must be UTC", nameof(timesUtc));
            values[k] = axis.Encode(timesUtc[k]);
        }
        _writer.Write<double>(TimeName, [start], [values.Length], values);
    }

    /// <summary>Writes steps [<paramref name="timeStart"/>, +<paramref name="timeCount"/>) of a time field from [time][lat][lon] values.</summary>
    public void WriteSteps(string name, int timeStart, int timeCount, ReadOnlySpan<float> values)
    {
        var field = Field(name);
        if (!field.HasTime) throw new InvalidOperationException($"field '{name}' is static: use WriteField");
        WriteFilled(field, [timeStart, 0, 0], [timeCount, Ny, Nx], values);
    }

    /// <summary>Writes a whole static (latitude, longitude) field.</summary>
    public void WriteField(string name, ReadOnlySpan<float> values)
    {
        var field = Field(name);
        if (field.HasTime) throw new InvalidOperationException($"field '{name}' has a time dimension: use WriteSteps");
        WriteFilled(field, [0, 0], [Ny, Nx], values);
    }

    /// <summary>Completes the file; throws when netCDF-C cannot flush it.</summary>
    public void Close()
    {
        EnsureCoordinates();
        _writer.Close();
    }

    public void Dispose() => _writer.Dispose();

    private void DefineCoordinates()
    {
        _writer.PutAttribute(null, "Conventions", "CF-1.8");
        _writer.PutAttribute(null, "title", _options.Title);
        foreach (var (name, value) in new[]
                 {
                     ("institution", _options.Institution), ("source", _options.Source), ("history", _options.History),
                     ("comment", _options.Comment), ("references", _options.References),
                 })
            if (value is not null) _writer.PutAttribute(null, name, value);
        foreach (var (name, value) in _options.GlobalAttributes ?? new Dictionary<string, string>())
            _writer.PutAttribute(null, name, value);

        if (_options.Time is { } time)
        {
            _writer.DefineDimension(TimeName, time.Length);
            _writer.DefineVariable(TimeName, NetCdfType.Double, [TimeName]);
            _writer.PutAttribute(TimeName, "standard_name", "time");
            _writer.PutAttribute(TimeName, "long_name", "time");
            _writer.PutAttribute(TimeName, "units", time.Units);
            _writer.PutAttribute(TimeName, "calendar", "standard");
            _writer.PutAttribute(TimeName, "axis", "T");
        }
        _writer.DefineDimension(LatName, Ny);
        _writer.DefineDimension(LonName, Nx);
        DefineAxis(LatName, "latitude", "degrees_north", "Y");
        DefineAxis(LonName, "longitude", "degrees_east", "X");

        _writer.DefineVariable(CrsName, NetCdfType.Int, []);
        _writer.PutAttribute(CrsName, "grid_mapping_name", "latitude_longitude");
        _writer.PutAttribute(CrsName, "longitude_of_prime_meridian", NetCdfType.Double, 0.0);
        _writer.PutAttribute(CrsName, "semi_major_axis", NetCdfType.Double, 6378137.0);
        _writer.PutAttribute(CrsName, "inverse_flattening", NetCdfType.Double, 298.257223563);
    }

    private void DefineAxis(string name, string standardName, string units, string axis)
    {
        _writer.DefineVariable(name, NetCdfType.Double, [name]);
        _writer.PutAttribute(name, "standard_name", standardName);
        _writer.PutAttribute(name, "long_name", standardName);
        _writer.PutAttribute(name, "units", units);
        _writer.PutAttribute(name, "axis", axis);
    }

    private void EnsureCoordinates()
    {
        if (_coordinatesWritten) return;
        _writer.EndDefinitions();
        _writer.Write<double>(LatName, [0], [Ny], _options.Latitudes.ToArray());
        _writer.Write<double>(LonName, [0], [Nx], _options.Longitudes.ToArray());
        _coordinatesWritten = true;
    }

    private void WriteFilled(CfField field, long[] start, long[] count, ReadOnlySpan<float> values)
    {
        EnsureCoordinates();
        long total = count.Aggregate(1L, (a, b) => a * b);
        if (values.Length != total) throw new ArgumentException($"field '{field.Name}': {values.Length} values given, the slab holds {total}");
        var buffer = ArrayPool<float>.Shared.Rent((int)total);
        try
        {
            var span = buffer.AsSpan(0, (int)total);
            values.CopyTo(span);
            for (int k = 0; k < span.Length; k++)
                if (float.IsNaN(span[k])) span[k] = field.FillValue;
            _writer.Write<float>(field.Name, start, count, span);
        }
        finally
        {
            ArrayPool<float>.Shared.Return(buffer);
        }
    }

    private CfField Field(string name) =>
        _fields.TryGetValue(name, out var f) ? f : throw new ArgumentException($"field '{name}' is not defined", nameof(name));

    private static void RequireMonotonic(IReadOnlyList<double> axis, string what, bool mustIncrease)
    {
        if (axis.Count == 0) throw new ArgumentException($"{what} must not be empty");
        if (axis.Count < 2) return;
        int sign = Math.Sign(axis[1] - axis[0]);
        if (sign == 0 || (mustIncrease && sign < 0)) throw new ArgumentException($"{what} must be strictly {(mustIncrease ? "increasing" : "monotonic")}");
        for (int k = 1; k < axis.Count; k++)
            if (Math.Sign(axis[k] - axis[k - 1]) != sign || !double.IsFinite(axis[k]))
                throw new ArgumentException($"{what} must be strictly {(mustIncrease ? "increasing" : "monotonic")} (index {k})");
    }
}
