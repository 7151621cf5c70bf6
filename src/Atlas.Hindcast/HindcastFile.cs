using System.Buffers;

namespace Atlas.Hindcast;

/// <summary>
/// A hindcast file decoded for ingest: its grid, its UTC time axis and its wave variables as float32 SI values
/// (metres, seconds, degrees the waves come from) with NaN for missing. Reads are hyperslabs, so files larger
/// than memory stream through in blocks. Dispose to close the file.
/// </summary>
public sealed class HindcastFile : IStepReader
{
    /// <summary>Upper bound of the scratch buffer used when a point block does not cover whole grid rows.</summary>
    private const long ScratchValues = 16 << 20;

    private readonly NetCdfFile _file;
    private readonly IReadOnlyDictionary<WaveParameter, ResolvedVariable> _variables;
    private readonly Dictionary<WaveParameter, (CfValueDecoder Decoder, int[] Roles)> _decoding = [];
    private readonly IReadOnlyList<NetCdfDimension> _spatial;
    private readonly NetCdfDimension _time;

    // Roles of a variable's dimensions in a slab read.
    private const int TimeRole = -1, SingletonRole = -2;

    private HindcastFile(NetCdfFile file, VariableMapping? mapping)
    {
        _file = file;
        _variables = CfDecoder.Resolve(file, mapping);
        var hs = _variables[WaveParameter.Hs].Source;
        (_time, var timeVariable) = FindTime(file, hs, mapping);
        TimesUtc = DecodeTimes(file, timeVariable);
        // A backwards step is refused at once; a repeated one once the values of both steps can be compared.
        int repeated = FirstRepeat(TimesUtc);
        if (repeated < 0) CheckIncreasing(file, timeVariable, TimesUtc);

        var layout = CfGridReader.Read(file, hs, _time);
        Grid = layout.Grid;
        _spatial = layout.Dimensions;

        foreach (var (wave, resolved) in _variables)
        {
            CfValueDecoder decoder;
            try
            {
                decoder = resolved.CreateDecoder();
            }
            catch (FormatException e)
            {
                throw new HindcastFormatException(file.Path, resolved.Name, e.Message, e);
            }
            _decoding[wave] = (decoder, Roles(resolved.Source, timeRequired: wave != WaveParameter.Depth));
            TuneChunkCache(resolved.Source);
        }
        if (repeated > 0) CheckIncreasing(file, timeVariable, TimesUtc, RepeatNote(repeated));
    }

    /// <summary>
    /// Opens and decodes the metadata of <paramref name="path"/>. Throws <see cref="HindcastFormatException"/>
    /// (naming file, variable and problem) for unreadable or truncated files, a missing Hs or missing Te and Tp,
    /// units that cannot be converted, unsupported grids and bad time axes.
    /// </summary>
    public static HindcastFile Open(string path, VariableMapping? mapping = null)
    {
        var file = NetCdfFile.Open(path);
        try
        {
            return new HindcastFile(file, mapping);
        }
        catch
        {
            file.Dispose();
            throw;
        }
    }

    public string Path => _file.Path;

    public NetCdfFormat Format => _file.Format;

    public HindcastGrid Grid { get; }

    /// <summary>The time of every step, UTC, strictly increasing.</summary>
    public IReadOnlyList<DateTime> TimesUtc { get; }

    public bool Has(WaveParameter v) => _variables.ContainsKey(v);

    /// <summary>The file variable behind <paramref name="v"/> and how it was found; null when the file lacks it.</summary>
    public ResolvedVariable? Source(WaveParameter v) => _variables.GetValueOrDefault(v);

    /// <summary>
    /// Reads steps [<paramref name="timeStart"/>, +<paramref name="timeCount"/>) of points
    /// [<paramref name="pointStart"/>, +<paramref name="pointCount"/>) into <paramref name="destination"/> laid out
    /// [time][point], decoded (SI units, directions "from" in [0, 360), NaN for missing). On a 2-D grid the point range
    /// becomes one hyperslab of whole rows (or of part of one row), so blocks of whole rows read with no copy.
    /// </summary>
    public void ReadSteps(WaveParameter v, int timeStart, int timeCount, int pointStart, int pointCount, Span<float> destination)
    {
        if (v == WaveParameter.Depth) throw new ArgumentException("depth is static: use ReadDepth", nameof(v));
        if (!_decoding.TryGetValue(v, out var decoding))
            throw new InvalidOperationException($"{Path}: the file has no {v} (check Has before reading)");
        int steps = TimesUtc.Count, points = Grid.PointCount;
        if (timeStart < 0 || timeCount < 0 || timeStart + (long)timeCount > steps)
            throw new ArgumentOutOfRangeException(nameof(timeStart), $"steps [{timeStart}, +{timeCount}) outside 0..{steps}");
        if (pointStart < 0 || pointCount < 0 || pointStart + (long)pointCount > points)
            throw new ArgumentOutOfRangeException(nameof(pointStart), $"points [{pointStart}, +{pointCount}) outside 0..{points}");
        if (destination.Length < (long)timeCount * pointCount)
            throw new ArgumentException($"destination holds {destination.Length} values; {(long)timeCount * pointCount} are needed", nameof(destination));
        if (timeCount == 0 || pointCount == 0) return;

        var source = _variables[v].Source;
        int stepsPerCall = StepsPerCall(source, decoding.Roles, timeCount);
        if (Grid is not StructuredGrid grid)
        {
            ReadDirect(source, decoding, timeStart, timeCount, stepsPerCall, [pointStart], [pointCount], destination);
            return;
        }

        int nx = grid.Nx;
        int firstRow = pointStart / nx, firstColumn = pointStart % nx;
        int rows = (pointStart + pointCount - 1) / nx - firstRow + 1;
        if (rows == 1)
        {
            ReadDirect(source, decoding, timeStart, timeCount, stepsPerCall, [firstRow, firstColumn], [1, pointCount], destination);
            return;
        }
        if (firstColumn == 0 && pointCount == rows * nx)
        {
            ReadDirect(source, decoding, timeStart, timeCount, stepsPerCall, [firstRow, 0], [rows, nx], destination);
            return;
        }

        // The block starts or ends inside a row: read whole rows a few steps at a time and copy the wanted span.
        int rowValues = rows * nx;
        int stepsPerRead = (int)Math.Clamp(ScratchValues / rowValues, 1, stepsPerCall);
        var scratch = ArrayPool<float>.Shared.Rent(stepsPerRead * rowValues);
        try
        {
            for (int t = 0; t < timeCount; t += stepsPerRead)
            {
                int n = Math.Min(stepsPerRead, timeCount - t);
                ReadSlab(source, decoding, timeStart + t, n, [firstRow, 0], [rows, nx], scratch.AsSpan(0, n * rowValues));
                for (int k = 0; k < n; k++)
                    scratch.AsSpan(k * rowValues + firstColumn, pointCount).CopyTo(destination.Slice((t + k) * pointCount, pointCount));
            }
        }
        finally
        {
            ArrayPool<float>.Shared.Return(scratch);
        }
    }

    /// <summary>
    /// A number of points per <see cref="ReadSteps"/> block that reads every step within
    /// <paramref name="valueBudget"/> floats: whole grid rows, and whole bands of chunk rows when the Hs data are
    /// chunked in space (so each compressed chunk is inflated once per pass rather than once per block). Never less
    /// than one row (one node on a mesh); all points when they fit.
    /// </summary>
    public int PointBlockSize(long valueBudget)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(valueBudget, 1);
        var hs = _variables[WaveParameter.Hs].Source;
        var roles = _decoding[WaveParameter.Hs].Roles;
        long steps = TimesUtc.Count;
        int rowLength = Grid is StructuredGrid g ? g.Nx : 1;
        int rowCount = Grid.PointCount / rowLength;
        long rows = Math.Clamp(valueBudget / (steps * rowLength), 1, rowCount);
        // The slower spatial dimension is role 0: rows of a 2-D grid, nodes of a mesh.
        int rowDim = Array.IndexOf(roles, 0);
        if (rows < rowCount && hs.ChunkSizes is { } chunks && rowDim >= 0 && rows >= chunks[rowDim])
            rows -= rows % chunks[rowDim];
        return (int)(rows * rowLength);
    }

    /// <summary>
    /// Water depth of every point in metres, positive down; the time mean over the file's steps when the depth has a
    /// time dimension (<see cref="ReadDepthField"/>). NaN where the file gives no value or the sea floor is at or above
    /// the surface (land), and everywhere when the file has no depth variable.
    /// </summary>
    public float[] ReadDepth()
    {
        var depth = ReadDepthField().Metres;
        for (int p = 0; p < depth.Length; p++)
            if (!(depth[p] > 0)) depth[p] = float.NaN;
        return depth;
    }

    /// <summary>
    /// The decoded depth of every point, signs kept (negative where the sea floor is above the surface): a static depth
    /// as it is, a time-varying one as the mean of its valid steps at each point (read in blocks of steps, so a long
    /// file never sits in memory whole). All NaN with no steps when the file has no depth variable.
    /// </summary>
    public DepthField ReadDepthField()
    {
        int points = Grid.PointCount;
        var mean = new float[points];
        var valid = new int[points];
        if (!_decoding.TryGetValue(WaveParameter.Depth, out var decoding))
        {
            Array.Fill(mean, float.NaN);
            return new DepthField(mean, valid, 0, false);
        }
        var source = _variables[WaveParameter.Depth].Source;
        long[] start = _spatial.Select(_ => 0L).ToArray(), count = _spatial.Select(d => d.Length).ToArray();
        if (Array.IndexOf(decoding.Roles, TimeRole) < 0)
        {
            ReadSlab(source, decoding, 0, 1, start, count, mean);
            for (int p = 0; p < points; p++) valid[p] = float.IsNaN(mean[p]) ? 0 : 1;
            return new DepthField(mean, valid, 1, false);
        }

        int steps = TimesUtc.Count;
        var sum = new double[points];
        ForEachStepBlock(steps, (t, slab) => ReadSlab(source, decoding, t, slab.Length / points, start, count, slab), slab =>
        {
            for (int k = 0; k < slab.Length; k++)
            {
                float v = slab[k];
                if (float.IsNaN(v)) continue;
                sum[k % points] += v;
                valid[k % points]++;
            }
        });
        for (int p = 0; p < points; p++) mean[p] = valid[p] > 0 ? (float)(sum[p] / valid[p]) : float.NaN;
        return new DepthField(mean, valid, steps, true);
    }

    /// <summary>The decoder of a variable the file has, e.g. to describe its conversion; null when it lacks it.</summary>
    public CfValueDecoder? DecoderOf(WaveParameter v) => _decoding.TryGetValue(v, out var d) ? d.Decoder : null;

    /// <summary>
    /// The wet flag of every point by the <see cref="LandMask"/> rule, probing Hs over the first
    /// <paramref name="probeSteps"/> steps (fewer when the file is shorter).
    /// </summary>
    public bool[] ReadWetMask(int probeSteps = 24)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(probeSteps, 1);
        int points = Grid.PointCount;
        int steps = Math.Min(probeSteps, TimesUtc.Count);
        var seen = new bool[points];
        ForEachStepBlock(steps, (t, slab) => ReadSteps(WaveParameter.Hs, t, slab.Length / points, 0, points, slab), slab => LandMask.MarkHsSeen(slab, seen));
        return LandMask.Derive(Has(WaveParameter.Depth) ? ReadDepth() : [], seen);
    }

    public void Dispose() => _file.Dispose();

    /// <summary>
    /// Reads steps [0, <paramref name="steps"/>) of every point in blocks of whole steps that fit the scratch budget
    /// (<paramref name="read"/> fills a [time][point] slab starting at a step) and hands each block to
    /// <paramref name="consume"/>, so a long file never sits in memory whole.
    /// </summary>
    private void ForEachStepBlock(int steps, Action<int, Span<float>> read, Action<Span<float>> consume)
    {
        int points = Grid.PointCount;
        int stepsPerRead = (int)Math.Clamp(ScratchValues / Math.Max(points, 1), 1, Math.Max(steps, 1));
        var buffer = ArrayPool<float>.Shared.Rent(stepsPerRead * points);
        try
        {
            for (int t = 0; t < steps; t += stepsPerRead)
            {
                var slab = buffer.AsSpan(0, Math.Min(stepsPerRead, steps - t) * points);
                read(t, slab);
                consume(slab);
            }
        }
        finally
        {
            ArrayPool<float>.Shared.Return(buffer);
        }
    }

    /// <summary>
    /// Reads a slab whose memory layout is the destination's ([time][point]) in calls of at most
    /// <paramref name="stepsPerCall"/> steps, each into its own part of the destination.
    /// </summary>
    private void ReadDirect(NetCdfVariable variable, (CfValueDecoder Decoder, int[] Roles) decoding, int timeStart, int timeCount,
        int stepsPerCall, ReadOnlySpan<long> spatialStart, ReadOnlySpan<long> spatialCount, Span<float> destination)
    {
        long perStep = 1;
        foreach (long c in spatialCount) perStep *= c;
        for (int t = 0; t < timeCount; t += stepsPerCall)
        {
            int n = Math.Min(stepsPerCall, timeCount - t);
            ReadSlab(variable, decoding, timeStart + t, n, spatialStart, spatialCount, destination.Slice((int)(t * perStep), (int)(n * perStep)));
        }
    }

    /// <summary>
    /// Steps per native read. HDF5's cost per chunk grows with the number of chunks one read selects (measured on the
    /// 1.05 GB benchmark file: one read across 8760 time chunks took about twice the CPU of 35 reads of 256), so
    /// reads of chunked data are cut into runs of at most 256 chunks along time. Other layouts read in one call.
    /// </summary>
    private static int StepsPerCall(NetCdfVariable variable, int[] roles, int timeCount)
    {
        int timeDim = Array.IndexOf(roles, TimeRole);
        if (variable.ChunkSizes is not { } chunks || timeDim < 0) return Math.Max(timeCount, 1);
        return (int)Math.Clamp(chunks[timeDim] * 256, 1, Math.Max(timeCount, 1));
    }

    /// <summary>Reads one hyperslab (time range x spatial box) decoded into <paramref name="destination"/>.</summary>
    private void ReadSlab(NetCdfVariable variable, (CfValueDecoder Decoder, int[] Roles) decoding, int timeStart, int timeCount,
        ReadOnlySpan<long> spatialStart, ReadOnlySpan<long> spatialCount, Span<float> destination)
    {
        var roles = decoding.Roles;
        Span<long> start = stackalloc long[roles.Length];
        Span<long> count = stackalloc long[roles.Length];
        long total = 1;
        for (int d = 0; d < roles.Length; d++)
        {
            (start[d], count[d]) = roles[d] switch
            {
                TimeRole => (timeStart, timeCount),
                SingletonRole => (0L, 1L),
                var s => (spatialStart[s], spatialCount[s]),
            };
            total *= count[d];
        }
        var target = destination[..(int)total];
        var decoder = decoding.Decoder;
        switch (variable.Type)
        {
            case NetCdfType.Float:
                _file.Read(variable, start, count, target);
                decoder.DecodeInPlace(target);
                break;
            case NetCdfType.Double: ReadAndDecode<double>(variable, decoder, start, count, target); break;
            case NetCdfType.Short: ReadAndDecode<short>(variable, decoder, start, count, target); break;
            case NetCdfType.UShort: ReadAndDecode<ushort>(variable, decoder, start, count, target); break;
            case NetCdfType.Int: ReadAndDecode<int>(variable, decoder, start, count, target); break;
            case NetCdfType.UInt: ReadAndDecode<uint>(variable, decoder, start, count, target); break;
            case NetCdfType.Byte: ReadAndDecode<sbyte>(variable, decoder, start, count, target); break;
            case NetCdfType.UByte: ReadAndDecode<byte>(variable, decoder, start, count, target); break;
            default: ReadAndDecode<double>(variable, decoder, start, count, target); break; // 64-bit integers
        }
    }

    private void ReadAndDecode<T>(NetCdfVariable variable, CfValueDecoder decoder, ReadOnlySpan<long> start, ReadOnlySpan<long> count,
        Span<float> destination) where T : unmanaged, System.Numerics.INumberBase<T>
    {
        var raw = ArrayPool<T>.Shared.Rent(destination.Length);
        try
        {
            var span = raw.AsSpan(0, destination.Length);
            _file.Read(variable, start, count, span);
            decoder.Decode<T>(span, destination);
        }
        finally
        {
            ArrayPool<T>.Shared.Return(raw);
        }
    }

    /// <summary>
    /// Maps each dimension of <paramref name="variable"/> to time, a spatial axis or a length-1 extra dimension,
    /// requiring time first and the spatial dimensions in the grid's order.
    /// </summary>
    private int[] Roles(NetCdfVariable variable, bool timeRequired)
    {
        var roles = new int[variable.Rank];
        int nextSpatial = 0;
        bool sawTime = false;
        for (int d = 0; d < variable.Rank; d++)
        {
            var dim = variable.Dimensions[d];
            if (dim == _time)
            {
                if (nextSpatial > 0)
                    throw Problem(variable, $"has time after its horizontal dimensions ({Dims(variable)}); time must come first");
                roles[d] = TimeRole;
                sawTime = true;
            }
            else if (nextSpatial < _spatial.Count && dim == _spatial[nextSpatial]) roles[d] = nextSpatial++;
            else if (dim.Length == 1) roles[d] = SingletonRole;
            else throw Problem(variable, $"has dimensions ({Dims(variable)}); expected ({(timeRequired ? _time.Name + ", " : "")}{string.Join(", ", _spatial.Select(s => s.Name))}) like the Hs variable");
        }
        if (nextSpatial != _spatial.Count)
            throw Problem(variable, $"has dimensions ({Dims(variable)}); it must span ({string.Join(", ", _spatial.Select(s => s.Name))}) like the Hs variable");
        if (timeRequired && !sawTime) throw Problem(variable, $"has no '{_time.Name}' dimension; wave fields must be time series");
        return roles;
    }

    /// <summary>
    /// For uncompressed chunked NetCDF-4 data, turning HDF5's chunk cache off makes it read just the selected bytes
    /// of each chunk instead of whole chunks, so point blocks that cut across time-step chunks read each byte once.
    /// </summary>
    private void TuneChunkCache(NetCdfVariable variable)
    {
        if (variable.Storage == NetCdfStorage.Chunked && variable.DeflateLevel == 0 && !variable.Shuffle)
            _file.SetChunkCache(variable, 0, 0);
    }

    internal static (NetCdfDimension Time, NetCdfVariable Variable) FindTime(NetCdfFile file, NetCdfVariable hs, VariableMapping? mapping)
    {
        if (mapping?.TimeVariable is { } name)
        {
            var mapped = file.FindVariable(name)
                ?? throw new HindcastFormatException(file.Path, name, $"the mapping '{mapping.Source}' names it as time, but the file has no such variable");
            if (mapped.Rank != 1 || !hs.Dimensions.Contains(mapped.Dimensions[0]))
                throw new HindcastFormatException(file.Path, name, $"is not a 1-D time coordinate along a dimension of '{hs.Name}'");
            return (mapped.Dimensions[0], mapped);
        }
        foreach (var dim in hs.Dimensions)
        {
            if (file.FindVariable(dim.Name) is not { Rank: 1 } coordinate || coordinate.Dimensions[0] != dim) continue;
            bool isTime = (coordinate.TextAttribute("units") ?? "").Contains(" since ", StringComparison.OrdinalIgnoreCase)
                          || coordinate.TextAttribute("standard_name") == "time" || coordinate.TextAttribute("axis") == "T";
            if (isTime) return (dim, coordinate);
        }
        throw new HindcastFormatException(file.Path, hs.Name,
            $"has no time dimension: none of ({Dims(hs)}) has a coordinate variable with units '<unit> since <date>'");
    }

    internal static IReadOnlyList<DateTime> DecodeTimes(NetCdfFile file, NetCdfVariable time)
    {
        if (time.Dimensions[0].Length == 0) throw new HindcastFormatException(file.Path, time.Name, "has no time steps");
        try
        {
            var parsed = CfTime.Parse(time.TextAttribute("units"), time.TextAttribute("calendar"));
            var values = file.ReadAll<double>(time);
            if (time.NumberAttribute("_FillValue") is { } fill)
            {
                double stored = time.Type == NetCdfType.Float ? (float)fill : fill;
                int missing = Array.IndexOf(values, stored);
                if (missing >= 0) throw new FormatException($"time[{missing}] is the fill value; every step needs a time");
            }
            return parsed.ToUtc(values);
        }
        catch (FormatException e)
        {
            throw new HindcastFormatException(file.Path, time.Name, e.Message, e);
        }
    }

    /// <summary>The index of the first step whose time equals the one before; -1 when none (or a backwards step comes first).</summary>
    private static int FirstRepeat(IReadOnlyList<DateTime> times)
    {
        for (int i = 1; i < times.Count; i++)
        {
            if (times[i] > times[i - 1]) continue;
            return times[i] == times[i - 1] ? i : -1;
        }
        return -1;
    }

    /// <summary>Refuses a time axis that does not increase strictly, naming the step index and both times.</summary>
    internal static void CheckIncreasing(NetCdfFile file, NetCdfVariable time, IReadOnlyList<DateTime> times, string note = "")
    {
        try
        {
            CfTime.RequireStrictlyIncreasing(times);
        }
        catch (FormatException e)
        {
            throw new HindcastFormatException(file.Path, time.Name, e.Message + note, e);
        }
    }

    /// <summary>
    /// How the two steps of a repeated time differ, per wave variable: the largest difference over the points (directions
    /// the shorter way round), or a value against a missing one; says so when they are identical.
    /// </summary>
    private string RepeatNote(int step)
    {
        int points = Grid.PointCount;
        var both = new float[2 * points];
        var parts = new List<string>();
        foreach (var (wave, resolved) in _variables)
        {
            if (wave == WaveParameter.Depth) continue;
            ReadSteps(wave, step - 1, 2, 0, points, both);
            double largest = 0;
            int at = -1;
            for (int p = 0; p < points; p++)
            {
                float a = both[p], b = both[points + p];
                if (float.IsNaN(a) && float.IsNaN(b)) continue;
                double d = float.IsNaN(a) || float.IsNaN(b) ? double.PositiveInfinity : Math.Abs(a - b);
                if (wave is WaveParameter.Dir && d > 180) d = 360 - d;
                if (d > largest) (largest, at) = (d, p);
            }
            if (at < 0) continue;
            string units = CfStandardNames.QuantityOf(wave) switch { PhysicalQuantity.Length => "m", PhysicalQuantity.Time => "s", _ => "degree" };
            parts.Add(double.IsPositiveInfinity(largest)
                ? $"variable '{resolved.Name}' has a value in one and none in the other (point {at})"
                : $"variable '{resolved.Name}' by up to {largest:G4} {units} (point {at})");
        }
        return parts.Count == 0
            ? "; the two steps hold identical values: give each step once"
            : "; the two steps differ: " + string.Join(", ", parts);
    }

    private HindcastFormatException Problem(NetCdfVariable variable, string problem) => new(Path, variable.Name, problem);

    private static string Dims(NetCdfVariable v) => string.Join(", ", v.Dimensions.Select(d => d.Name));
}
