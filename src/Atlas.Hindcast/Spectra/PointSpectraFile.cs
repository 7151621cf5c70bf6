using System.Buffers;
using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;

namespace Atlas.Hindcast.Spectra;

/// <summary>
/// A file of spectra at output points, as spectral wave models write them (CF-NetCDF, featureType timeSeries):
/// a directional variance density S(f, theta) over time x station x frequency x direction
/// (<c>sea_surface_wave_directional_variance_spectral_density</c>) or a frequency density S(f) over time x station x
/// frequency (<c>sea_surface_wave_variance_spectral_density</c>), dimensions in any order. Reads blocks of steps decoded
/// to the atlas units (m^2 s rad^-1 or m^2 s), directions turned to "coming from" and sorted. Dispose to close.
/// </summary>
/// <remarks>
/// Found by standard name (or the mapping): the density; the frequency coordinate (<c>sea_surface_wave_frequency</c>,
/// or a coordinate named frequency, freq or f), in Hz or s-1; the direction coordinate (standard name
/// <c>sea_surface_wave_from_direction</c> or <c>sea_surface_wave_to_direction</c>, which says which way it points: a
/// direction without one is refused unless the mapping says); the time coordinate; the station dimension, the one left;
/// latitude and longitude by standard name or name, per station or per time and station (fixed stations only); names from
/// the variable with <c>cf_role = timeseries_id</c>; depth by the standard names of the gridded reader, per station or its
/// time mean, or from the mapping's <c>station_depths_m</c>. Every conversion and assumption is listed in
/// <see cref="Notes"/>.
/// </remarks>
public sealed class PointSpectraFile : IDisposable
{
    public const string DirectionalStandardName = "sea_surface_wave_directional_variance_spectral_density";
    public const string FrequencyStandardName = "sea_surface_wave_variance_spectral_density";
    public const string FrequencyCoordinateStandardName = "sea_surface_wave_frequency";

    private static readonly string[] FrequencyNames = ["frequency", "freq", "frequencies", "f"];
    private static readonly string[] DirectionNames = ["direction", "dir", "directions", "theta"];
    private static readonly string[] LatitudeNames = ["latitude", "lat"];
    private static readonly string[] LongitudeNames = ["longitude", "lon"];

    private readonly NetCdfFile _file;
    private readonly NetCdfVariable _density;
    private readonly CfValueDecoder _decoder;
    private readonly double _factor;
    private readonly int _timeAxis, _stationAxis, _frequencyAxis, _directionAxis;
    private readonly int[] _directionOrder; // sorted position -> file index
    private readonly int[] _sortedToFile;   // _directionOrder, or [0] for S(f)
    private readonly (int To, int From, int Length)[] _runs;  // the sorted order as runs of consecutive file indices
    private readonly int[] _vectorMoves, _scalarMoves;         // the runs as (target, source) moves within a row
    private readonly int[] _spectrumMoves, _spectrumScalarMoves;  // a whole spectrum as one run, for files that allow it
    private readonly StoredFloatMask _storedMask;              // masked while copying (None when decoded on reading)
    private readonly bool _decodeOnRead;                       // the encoding needs more than masking
    private float[] _raw = [];              // the last block as read by ReadSteps, reused from block to block

    private PointSpectraFile(NetCdfFile file, VariableMapping? mapping)
    {
        _file = file;
        _density = FindSpectrum(file, mapping)
            ?? throw new HindcastFormatException(file.Path, null,
                $"has no spectral density: no variable has standard_name {DirectionalStandardName} or {FrequencyStandardName}");
        Directional = _density.TextAttribute("standard_name") == DirectionalStandardName
            || (mapping?.Spectrum is not null && _density.TextAttribute("standard_name") != FrequencyStandardName && _density.Rank == 4);
        var notes = new List<string>();

        try
        {
            (_factor, var conversion) = SpectralDensityUnits.ToSi(_density.TextAttribute("units"), Directional);
            _decoder = CfValueDecoder.Create(_density, PhysicalQuantity.Length, unitsOverride: "m");
            notes.Add($"spectrum '{_density.Name}' ({(Directional ? "directional" : "frequency")} variance density): " +
                (conversion == "none" ? $"units {_density.TextAttribute("units")}, used as they are" : $"units {conversion}"));
        }
        catch (FormatException e)
        {
            throw new HindcastFormatException(file.Path, _density.Name, e.Message, e);
        }

        var (timeDimension, timeVariable) = HindcastFile.FindTime(file, _density, mapping);
        TimesUtc = HindcastFile.DecodeTimes(file, timeVariable);
        HindcastFile.CheckIncreasing(file, timeVariable, TimesUtc);
        _timeAxis = IndexOf(_density, timeDimension);

        var frequency = FindCoordinate(file, _density, mapping?.Frequency, [FrequencyCoordinateStandardName], FrequencyNames, "frequency");
        _frequencyAxis = IndexOf(_density, frequency.Dimensions[0]);
        FrequenciesHz = ReadFrequencies(file, frequency, notes);

        _directionAxis = -1;
        DirectionsFrom = [];
        _directionOrder = [];
        if (Directional)
        {
            var direction = FindCoordinate(file, _density, mapping?.SpectrumDirection,
                [CfStandardNames.FromDirection, CfStandardNames.ToDirection], DirectionNames, "direction");
            _directionAxis = IndexOf(_density, direction.Dimensions[0]);
            (DirectionsFrom, _directionOrder) = ReadDirections(file, direction, mapping, notes);
        }

        var remaining = Enumerable.Range(0, _density.Rank).Where(a => a != _timeAxis && a != _frequencyAxis && a != _directionAxis).ToArray();
        if (remaining.Length > 1)
            throw new HindcastFormatException(file.Path, _density.Name,
                $"has dimensions ({string.Join(", ", _density.Dimensions.Select(d => d.Name))}); after time, frequency{(Directional ? " and direction" : "")} " +
                $"one station dimension may remain, but {string.Join(" and ", remaining.Select(a => _density.Dimensions[a].Name))} do");
        _stationAxis = remaining.Length == 1 ? remaining[0] : -1;
        var stationDimension = _stationAxis >= 0 ? _density.Dimensions[_stationAxis] : null;
        Stations = ReadStations(file, stationDimension, timeDimension, mapping, notes);
        _sortedToFile = _directionOrder.Length > 0 ? _directionOrder : [0];
        _runs = Runs(_sortedToFile);
        var scalarMoves = new List<int>();
        _vectorMoves = VectorMoves(_runs, scalarMoves);
        _scalarMoves = [.. scalarMoves];
        var spectrumScalarMoves = new List<int>();
        _spectrumMoves = VectorMoves([(0, 0, ValuesPerSpectrum)], spectrumScalarMoves);
        _spectrumScalarMoves = [.. spectrumScalarMoves];
        _decodeOnRead = _decoder.MaskOnly is null;
        _storedMask = _decoder.MaskOnly ?? StoredFloatMask.None;
        Grid = new StationGrid(Stations);
        Notes = notes;
    }

    /// <summary>True when the file holds a spectral density the reader can take (by standard name, or named by the mapping).</summary>
    public static bool HoldsSpectra(NetCdfFile file, VariableMapping? mapping) => FindSpectrum(file, mapping) is not null;

    /// <summary>Opens and decodes the metadata; throws <see cref="HindcastFormatException"/> naming the variable and the problem.</summary>
    public static PointSpectraFile Open(string path, VariableMapping? mapping = null)
    {
        var file = NetCdfFile.Open(path);
        try
        {
            return new PointSpectraFile(file, mapping);
        }
        catch
        {
            file.Dispose();
            throw;
        }
    }

    public string Path => _file.Path;

    /// <summary>Name of the density variable.</summary>
    public string SpectrumVariable => _density.Name;

    /// <summary>True for S(f, theta), false for S(f).</summary>
    public bool Directional { get; }

    /// <summary>The time of every step, UTC, strictly increasing.</summary>
    public IReadOnlyList<DateTime> TimesUtc { get; }

    /// <summary>Frequencies, Hz, strictly increasing.</summary>
    public double[] FrequenciesHz { get; }

    /// <summary>Bin-centre directions the waves come from, degrees in [0, 360), increasing; empty for S(f).</summary>
    public double[] DirectionsFrom { get; }

    public IReadOnlyList<SpectralStation> Stations { get; }

    public StationGrid Grid { get; }

    /// <summary>What was converted and assumed in reading the file, in words.</summary>
    public IReadOnlyList<string> Notes { get; }

    /// <summary>Steps per chunk of the spectrum variable along time (1 when it is not chunked): reads of whole chunks
    /// decode each chunk once.</summary>
    public int TimeChunkSteps => _density.ChunkSizes is { } chunks && chunks[_timeAxis] > 0 ? (int)Math.Min(chunks[_timeAxis], int.MaxValue) : 1;

    /// <summary>
    /// The steps per block in which to read the whole file, and HDF5's chunk cache set for reading so: whole chunks
    /// along time, as many as make about <paramref name="targetValues"/> values (at least one chunk, when a chunk holds
    /// at most <paramref name="maxValues"/>), so that each chunk is read and inflated once and HDF5 copies it straight
    /// into the caller's buffer without a cache between. Where blocks cannot be whole chunks (chunks far longer than a
    /// block), the library's chunk cache stays for compressed data, and uncompressed data are read without it.
    /// </summary>
    public int PlanBlocks(long targetValues, long maxValues)
    {
        long perStep = Math.Max(1L, (long)Stations.Count * ValuesPerSpectrum);
        long target = Math.Max(1, targetValues / perStep), most = Math.Max(1, maxValues / perStep);
        int steps = Math.Max(TimesUtc.Count, 1), chunk = Math.Max(1, TimeChunkSteps);
        bool aligned = chunk <= most;
        long block = aligned ? Math.Max(chunk, target / chunk * chunk) : target;
        bool compressed = _density.DeflateLevel > 0 || _density.Shuffle;
        if (_density.Storage == NetCdfStorage.Chunked && (aligned || !compressed)) _file.SetChunkCache(_density, 0, 0);
        return (int)Math.Min(block, steps);
    }

    /// <summary>Values per step and station: frequencies x directions (x 1 for S(f)).</summary>
    public int ValuesPerSpectrum => FrequenciesHz.Length * Math.Max(DirectionsFrom.Length, 1);

    /// <summary>
    /// Reads steps [<paramref name="timeStart"/>, +<paramref name="timeCount"/>) of every station into
    /// <paramref name="destination"/> laid out [time][station][frequency][direction, sorted], in m^2 s rad^-1 (m^2 s for
    /// S(f)), NaN where the file has a fill value. A negative density is refused, naming the station, time and frequency.
    /// </summary>
    public void ReadSteps(int timeStart, int timeCount, Span<float> destination)
    {
        int stations = Stations.Count, perSpectrum = ValuesPerSpectrum;
        long needed = (long)timeCount * stations * perSpectrum;
        if (destination.Length < needed) throw new ArgumentException($"destination holds {destination.Length} values; {needed} are needed", nameof(destination));
        if (_raw.Length < needed)
        {
            if (_raw.Length > 0) ArrayPool<float>.Shared.Return(_raw);
            _raw = ArrayPool<float>.Shared.Rent((int)needed);
        }
        var stored = _raw.AsSpan(0, (int)needed);
        ReadStoredSteps(timeStart, timeCount, stored);
        for (int t = 0; t < timeCount; t++)
            for (int s = 0; s < stations; s++)
                if (!TryDecodeSpectrum(stored, timeCount, t, s, destination.Slice((t * stations + s) * perSpectrum, perSpectrum)))
                    throw NegativeDensity(stored, timeStart, timeCount, t, s);
    }

    /// <summary>
    /// Reads steps [<paramref name="timeStart"/>, +<paramref name="timeCount"/>) of every station as the file stores them
    /// (its own order of dimensions and directions, <see cref="ValuesPerSpectrum"/> values per step and station), for
    /// <see cref="TryDecodeSpectrum"/>. Float data whose decoding only masks missing values are left for that step to
    /// mask while it copies; any other encoding (packing, integers) is decoded here, its missing values to NaN.
    /// </summary>
    public void ReadStoredSteps(int timeStart, int timeCount, Span<float> stored)
    {
        long needed = (long)timeCount * Stations.Count * ValuesPerSpectrum;
        if (stored.Length < needed) throw new ArgumentException($"the buffer holds {stored.Length} values; {needed} are needed", nameof(stored));
        if (timeStart < 0 || timeCount < 0 || timeStart + timeCount > TimesUtc.Count)
            throw new ArgumentOutOfRangeException(nameof(timeStart), $"steps [{timeStart}, +{timeCount}) outside 0..{TimesUtc.Count}");
        if (timeCount == 0) return;
        var start = new long[_density.Rank];
        var count = _density.Shape;
        start[_timeAxis] = timeStart;
        count[_timeAxis] = timeCount;
        var slab = stored[..(int)needed];
        _file.Read(_density, start, count, slab);
        if (_decodeOnRead) _decoder.DecodeInPlace(slab);
    }

    /// <summary>
    /// Decodes the spectrum of station <paramref name="station"/> at step <paramref name="step"/> of a block of
    /// <paramref name="timeCount"/> steps read by <see cref="ReadStoredSteps"/> into <paramref name="destination"/>
    /// (<see cref="ValuesPerSpectrum"/> values, [frequency][direction, sorted], in m^2 s rad^-1 or m^2 s, NaN where
    /// missing). Returns false when a density is negative (<see cref="NegativeDensity"/> names it); the destination
    /// is then not all written. Safe to call from several threads at once on one block.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public bool TryDecodeSpectrum(ReadOnlySpan<float> stored, int timeCount, int step, int station, Span<float> destination)
    {
        int nf = FrequenciesHz.Length, nd = Math.Max(DirectionsFrom.Length, 1);
        if (destination.Length < nf * nd) throw new ArgumentException($"destination holds {destination.Length} values; {nf * nd} are needed", nameof(destination));
        var (st, ss, sf, sd) = Strides(timeCount);
        long at = step * st + station * ss;
        if (at < 0 || at + (nf - 1) * sf + (nd - 1) * sd >= stored.Length)
            throw new ArgumentOutOfRangeException(nameof(step), $"step {step} of station {station} lies outside a stored block of {timeCount} steps");
        var mask = _storedMask;
        float factor = (float)_factor;
        if ((sd == 1 || nd == 1) && Vector.IsHardwareAccelerated && !mask.HasMoreFills)
        {
            ref float source = ref Unsafe.Add(ref MemoryMarshal.GetReference(stored), (nint)at);
            ref float target = ref MemoryMarshal.GetReference(destination);
            // A spectrum whose frequency rows follow each other in file order, directions in sorted order, is one run.
            return _runs.Length == 1 && sf == nd
                ? !CopyRows(ref source, 0, 1, ref target, nf * nd, _spectrumMoves, _spectrumScalarMoves, factor, mask)
                : !CopyRows(ref source, sf, nf, ref target, nd, _vectorMoves, _scalarMoves, factor, mask);
        }
        bool negative = false;
        for (int i = 0; i < nf; i++)
        {
            long rowBase = at + i * sf;
            for (int j = 0; j < nd; j++)
            {
                float v = stored[(int)(rowBase + _sortedToFile[j] * sd)];
                if (mask.IsMissing(v)) v = float.NaN;
                negative |= v < 0;
                destination[i * nd + j] = v * factor;
            }
        }
        return !negative;
    }

    /// <summary>
    /// Copies <paramref name="rows"/> rows of <paramref name="width"/> values, each row <paramref name="rowStride"/> apart
    /// in the source and <paramref name="width"/> apart in the target, by the given moves (target, source offsets within
    /// a row): whole vectors, then single values. Each value is multiplied by <paramref name="factor"/> (not when it is 1,
    /// which changes no value), NaN where the mask says missing (its first two fills and its range: the caller leaves
    /// masks with more fills to the scalar path); returns true when a value (not missing) is negative. No calls inside,
    /// so that the mask stays in registers.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static bool CopyRows(ref float source, long rowStride, int rows, ref float target, int width, int[] vectorMoves, int[] scalarMoves,
        float factor, StoredFloatMask mask)
    {
        var fill0 = mask.Fill0; var fill1 = mask.Fill1; var min = mask.Min; var max = mask.Max;
        float fill0s = fill0[0], fill1s = fill1[0], mins = min[0], maxs = max[0];
        var f = new Vector<float>(factor);
        bool scale = factor != 1;
        var nan = new Vector<float>(float.NaN);
        var negative = Vector<int>.Zero;
        bool any = false;
        for (int i = 0; i < rows; i++)
        {
            ref float from = ref Unsafe.Add(ref source, (nint)(i * rowStride));
            ref float to = ref Unsafe.Add(ref target, i * width);
            for (int m = 0; m < vectorMoves.Length; m += 2)
            {
                var v = Vector.LoadUnsafe(ref from, (nuint)vectorMoves[m + 1]);
                var missing = StoredFloatMask.Missing(v, fill0, fill1, min, max);
                negative |= Vector.AndNot(Vector.LessThan(v, Vector<float>.Zero), missing);
                Vector.ConditionalSelect(missing, nan, scale ? v * f : v).StoreUnsafe(ref to, (nuint)vectorMoves[m]);
            }
            for (int m = 0; m < scalarMoves.Length; m += 2)
            {
                float v = Unsafe.Add(ref from, scalarMoves[m + 1]);
                if (v == fill0s || v == fill1s || v < mins || v > maxs) v = float.NaN;
                any |= v < 0;
                Unsafe.Add(ref to, scalarMoves[m]) = scale ? v * factor : v;
            }
        }
        return any || negative != Vector<int>.Zero;
    }

    /// <summary>
    /// The moves that copy runs (target, source, length) a vector at a time, a run's last vector overlapping the one
    /// before: (target, source) offset pairs; runs shorter than a vector go to <paramref name="scalar"/> value by value.
    /// </summary>
    private static int[] VectorMoves(IEnumerable<(int To, int From, int Length)> runs, List<int> scalar)
    {
        int width = Vector<float>.Count;
        var moves = new List<int>();
        foreach (var (to, from, length) in runs)
        {
            if (length < width)
            {
                for (int m = 0; m < length; m++) { scalar.Add(to + m); scalar.Add(from + m); }
                continue;
            }
            for (int j = 0; ; j += width)
            {
                if (j > length - width) j = length - width;
                moves.Add(to + j);
                moves.Add(from + j);
                if (j == length - width) break;
            }
        }
        return [.. moves];
    }

    /// <summary>
    /// The error for a spectrum <see cref="TryDecodeSpectrum"/> refused: the station, the time and the first frequency
    /// with a negative density, and the most negative value there.
    /// </summary>
    public HindcastFormatException NegativeDensity(ReadOnlySpan<float> stored, int timeStart, int timeCount, int step, int station)
    {
        int nf = FrequenciesHz.Length, nd = Math.Max(DirectionsFrom.Length, 1);
        var (st, ss, sf, sd) = Strides(timeCount);
        for (int i = 0; i < nf; i++)
        {
            float smallest = 0;
            for (int j = 0; j < nd; j++)
            {
                float v = stored[(int)(step * st + station * ss + i * sf + j * sd)];
                if (!_storedMask.IsMissing(v) && v < smallest) smallest = v;
            }
            if (smallest < 0)
                return new HindcastFormatException(Path, _density.Name,
                    $"has a negative density {smallest} at station '{Stations[station].Name}', {CfTime.Iso(TimesUtc[timeStart + step])}, " +
                    $"frequency {FrequenciesHz[i]:0.#####} Hz; a variance density cannot be negative");
        }
        throw new InvalidOperationException($"station {station} at step {timeStart + step} has no negative density");
    }

    /// <summary>Strides of step, station, frequency and direction in a stored block of <paramref name="timeCount"/> steps (0 for an absent axis).</summary>
    private (long Step, long Station, long Frequency, long Direction) Strides(int timeCount)
    {
        long step = 0, station = 0, frequency = 0, direction = 0, stride = 1;
        for (int a = _density.Rank - 1; a >= 0; a--)
        {
            if (a == _timeAxis) step = stride;
            else if (a == _stationAxis) station = stride;
            else if (a == _frequencyAxis) frequency = stride;
            else if (a == _directionAxis) direction = stride;
            stride *= a == _timeAxis ? timeCount : _density.Dimensions[a].Length;
        }
        return (step, station, frequency, direction);
    }

    /// <summary>The sorted order as runs of consecutive file indices: (sorted position, file index, length).</summary>
    private static (int To, int From, int Length)[] Runs(int[] order)
    {
        var runs = new List<(int, int, int)>();
        for (int j = 0; j < order.Length;)
        {
            int length = 1;
            while (j + length < order.Length && order[j + length] == order[j] + length) length++;
            runs.Add((j, order[j], length));
            j += length;
        }
        return [.. runs];
    }

    public void Dispose()
    {
        _file.Dispose();
        if (_raw.Length > 0) ArrayPool<float>.Shared.Return(_raw);
        _raw = [];
    }

    private static NetCdfVariable? FindSpectrum(NetCdfFile file, VariableMapping? mapping)
    {
        if (mapping?.Spectrum is { } name)
            return file.FindVariable(name) ?? throw new HindcastFormatException(file.Path, name,
                $"the mapping '{mapping.Source}' names it as the spectrum, but the file has no such variable");
        return file.Variables.FirstOrDefault(v => v.TextAttribute("standard_name") == DirectionalStandardName)
            ?? file.Variables.FirstOrDefault(v => v.TextAttribute("standard_name") == FrequencyStandardName);
    }

    private static int IndexOf(NetCdfVariable variable, NetCdfDimension dimension)
    {
        for (int a = 0; a < variable.Rank; a++) if (variable.Dimensions[a] == dimension) return a;
        throw new InvalidOperationException($"'{dimension.Name}' is not a dimension of '{variable.Name}'");
    }

    private static NetCdfVariable FindCoordinate(NetCdfFile file, NetCdfVariable density, string? mapped, string[] standardNames, string[] names, string role)
    {
        bool Along(NetCdfVariable v) => v.Rank == 1 && density.Dimensions.Contains(v.Dimensions[0]);
        if (mapped is not null)
        {
            var v = file.FindVariable(mapped) ?? throw new HindcastFormatException(file.Path, mapped, $"the mapping names it as the {role}, but the file has no such variable");
            if (!Along(v)) throw new HindcastFormatException(file.Path, mapped, $"is not a 1-D {role} coordinate along a dimension of '{density.Name}'");
            return v;
        }
        return file.Variables.FirstOrDefault(v => Along(v) && standardNames.Contains(v.TextAttribute("standard_name")))
            ?? file.Variables.FirstOrDefault(v => Along(v) && names.Contains(v.Name, StringComparer.OrdinalIgnoreCase))
            ?? throw new HindcastFormatException(file.Path, density.Name,
                $"has no {role} coordinate: no 1-D variable along one of its dimensions ({string.Join(", ", density.Dimensions.Select(d => d.Name))}) " +
                $"has standard_name {string.Join(" or ", standardNames)} or is named {string.Join(", ", names)}");
    }

    private static double[] ReadFrequencies(NetCdfFile file, NetCdfVariable frequency, List<string> notes)
    {
        string? units = frequency.TextAttribute("units");
        if (units is not null && units.Contains("rad", StringComparison.OrdinalIgnoreCase))
            throw new HindcastFormatException(file.Path, frequency.Name,
                $"has units \"{units}\": an angular frequency axis is not read (its density would be per rad/s); give the frequency in Hz");
        if (!UnitConversion.TryToSi(units, PhysicalQuantity.Frequency, out var conversion))
            throw new HindcastFormatException(file.Path, frequency.Name,
                units is null ? "has no units attribute; a frequency needs one such as \"s-1\" or \"Hz\"" : $"has units \"{units}\", which are not a frequency");
        var values = file.ReadAll<double>(frequency).Select(v => v * conversion.Factor + conversion.Offset).ToArray();
        for (int i = 0; i < values.Length; i++)
        {
            if (!(values[i] > 0) || !double.IsFinite(values[i]))
                throw new HindcastFormatException(file.Path, frequency.Name, $"value {i} is {values[i]} Hz; frequencies must be positive");
            if (i > 0 && !(values[i] > values[i - 1]))
                throw new HindcastFormatException(file.Path, frequency.Name,
                    $"value {i} ({values[i]:0.######} Hz) does not increase on value {i - 1} ({values[i - 1]:0.######} Hz); frequencies must increase");
        }
        if (values.Length < 2) throw new HindcastFormatException(file.Path, frequency.Name, $"has {values.Length} frequency; a spectrum needs at least two");
        double ratio = values[1] / values[0];
        bool geometric = values.Length > 2 && Enumerable.Range(1, values.Length - 1).All(i => Math.Abs(values[i] / values[i - 1] / ratio - 1) < 1e-3);
        notes.Add($"frequencies '{frequency.Name}': {values.Length} from {values[0]:0.#####} to {values[^1]:0.#####} Hz" +
            (geometric ? $", geometric (ratio {ratio:0.####})" : "") + (conversion.IsIdentity ? "" : $", converted from {units}") +
            "; integrated with the trapezoidal rule over the given frequencies, no tail added");
        return values;
    }

    private static (double[] Sorted, int[] Order) ReadDirections(NetCdfFile file, NetCdfVariable direction, VariableMapping? mapping, List<string> notes)
    {
        string? standard = direction.TextAttribute("standard_name");
        bool towards;
        string how;
        if (mapping?.SpectrumDirection == direction.Name) { towards = mapping.SpectrumDirectionIsTowards; how = $"as the mapping '{mapping.Source}' says"; }
        else if (standard == CfStandardNames.ToDirection) { towards = true; how = "by its standard name"; }
        else if (standard == CfStandardNames.FromDirection) { towards = false; how = "by its standard name"; }
        else
            throw new HindcastFormatException(file.Path, direction.Name,
                $"has no standard_name saying whether the waves come from or travel to its directions ({CfStandardNames.FromDirection} or " +
                $"{CfStandardNames.ToDirection}); add it, or map the variable with \"spectrum_direction\" or \"spectrum_direction_to\"");
        string? units = direction.TextAttribute("units");
        if (!UnitConversion.TryToSi(units, PhysicalQuantity.Angle, out var conversion))
            throw new HindcastFormatException(file.Path, direction.Name,
                units is null ? "has no units attribute; a direction needs one such as \"degree\"" : $"has units \"{units}\", which are not an angle");
        var values = file.ReadAll<double>(direction);
        var from = new double[values.Length];
        for (int j = 0; j < values.Length; j++)
        {
            double d = values[j] * conversion.Factor + conversion.Offset;
            if (!double.IsFinite(d)) throw new HindcastFormatException(file.Path, direction.Name, $"value {j} is {values[j]}; directions must be finite");
            if (towards) d += 180;
            d %= 360;
            if (d < 0) d += 360;
            if (d >= 360 - 1e-9) d = 0;
            from[j] = d;
        }
        var order = Enumerable.Range(0, from.Length).OrderBy(j => from[j]).ToArray();
        var sorted = order.Select(j => from[j]).ToArray();
        CheckCircle(file, direction, sorted);
        notes.Add($"directions '{direction.Name}': {sorted.Length} bins of {360.0 / sorted.Length:0.###} degrees, waves {(towards ? "travelling to" : "coming from")} " +
            $"({how}){(towards ? ", turned to coming from" : "")}{(conversion.IsIdentity ? "" : $", converted from {units}")}");
        return (sorted, order);
    }

    /// <summary>Bins must cover the whole circle in equal steps: the direction integral is a sum times one bin width.</summary>
    private static void CheckCircle(NetCdfFile file, NetCdfVariable direction, double[] sorted)
    {
        int n = sorted.Length;
        if (n < 3) throw new HindcastFormatException(file.Path, direction.Name, $"has {n} directions; a directional spectrum needs at least three around the circle");
        double width = 360.0 / n;
        for (int j = 0; j < n; j++)
        {
            double step = (j + 1 < n ? sorted[j + 1] : sorted[0] + 360) - sorted[j];
            if (Math.Abs(step - width) > 1e-3 * width)
                throw new HindcastFormatException(file.Path, direction.Name,
                    $"its {n} directions do not cover the circle in equal steps of {width:0.###} degrees: {sorted[j]:0.###} is followed by " +
                    $"{(j + 1 < n ? sorted[j + 1] : sorted[0]):0.###} degrees (coming from)");
        }
    }

    private IReadOnlyList<SpectralStation> ReadStations(NetCdfFile file, NetCdfDimension? station, NetCdfDimension time, VariableMapping? mapping, List<string> notes)
    {
        int count = station is null ? 1 : (int)station.Length;
        if (count == 0) throw new HindcastFormatException(file.Path, _density.Name, $"has no stations: dimension '{station!.Name}' is empty");
        bool PerStation(NetCdfVariable v) => v.Type.IsNumeric() && v.Dimensions.All(d => d == station || d == time) && (station is null || v.Dimensions.Contains(station));
        NetCdfVariable? Position(string standard, string[] names) =>
            file.Variables.FirstOrDefault(v => PerStation(v) && v.TextAttribute("standard_name") == standard)
            ?? file.Variables.FirstOrDefault(v => PerStation(v) && names.Contains(v.Name, StringComparer.OrdinalIgnoreCase));
        var latitudeVariable = Position("latitude", LatitudeNames);
        var longitudeVariable = Position("longitude", LongitudeNames);
        if (latitudeVariable is null || longitudeVariable is null)
            throw new HindcastFormatException(file.Path, _density.Name,
                $"its stations have no coordinates: no {(latitudeVariable is null ? "latitude" : "longitude")} variable (standard_name " +
                $"{(latitudeVariable is null ? "latitude" : "longitude")}) runs along {(station is null ? "no dimension" : $"'{station.Name}'")}");
        var latitudes = FixedPerStation(file, latitudeVariable, station, count);
        var longitudes = FixedPerStation(file, longitudeVariable, station, count);

        string[] names;
        var labels = file.Variables.FirstOrDefault(v => v.TextAttribute("cf_role") == "timeseries_id" && (station is null || v.Dimensions.FirstOrDefault() == station));
        if (labels is not null)
        {
            names = file.ReadStrings(labels);
            if (names.Length != count) throw new HindcastFormatException(file.Path, labels.Name, $"gives {names.Length} names for {count} stations");
            for (int s = 0; s < count; s++) if (names[s].Length == 0) names[s] = $"station {s + 1}";
            var repeated = names.GroupBy(n => n).FirstOrDefault(g => g.Count() > 1);
            if (repeated is not null) throw new HindcastFormatException(file.Path, labels.Name, $"names two stations '{repeated.Key}'; station names must differ");
            notes.Add($"station names from '{labels.Name}' (cf_role timeseries_id)");
        }
        else
        {
            names = Enumerable.Range(1, count).Select(s => $"station {s}").ToArray();
            notes.Add($"no variable has cf_role timeseries_id: the stations are named station 1 to station {count} in file order");
        }

        var depths = ReadDepths(file, station, time, count, notes);
        if (mapping is not null && mapping.StationDepths.Count > 0)
        {
            foreach (var (name, depth) in mapping.StationDepths)
            {
                int s = Array.IndexOf(names, name);
                if (s < 0) throw new HindcastFormatException(mapping.Source, $"station_depths_m.{name}", $"names no station of {System.IO.Path.GetFileName(file.Path)} (its stations: {string.Join(", ", names)})");
                depths[s] = depth;
            }
            notes.Add($"depths of {mapping.StationDepths.Count} station(s) from the mapping '{mapping.Source}'");
        }
        int deep = depths.Count(double.IsNaN);
        if (deep > 0) notes.Add($"no depth for {deep} station(s) ({string.Join(", ", names.Where((_, s) => double.IsNaN(depths[s])))}): deep water assumed there");
        return Enumerable.Range(0, count).Select(s => new SpectralStation(names[s], latitudes[s], HindcastGrid.NormaliseLongitude(longitudes[s]), depths[s])).ToArray();
    }

    /// <summary>A per-station value, read from a (station) or (time, station) variable; a station that moves is refused.</summary>
    private static double[] FixedPerStation(NetCdfFile file, NetCdfVariable variable, NetCdfDimension? station, int count)
    {
        var values = file.ReadAll<double>(variable);
        double? fill = variable.NumberAttribute("_FillValue");
        bool timeFirst = variable.Rank == 2 && variable.Dimensions[0] != station;
        int steps = values.Length / count;
        var result = new double[count];
        for (int s = 0; s < count; s++)
        {
            double first = double.NaN;
            for (int t = 0; t < steps; t++)
            {
                double v = timeFirst || station is null ? values[t * count + s] : values[s * steps + t];
                if (v == fill || !double.IsFinite(v)) continue;
                if (double.IsNaN(first)) first = v;
                else if (Math.Abs(v - first) > 1e-4)
                    throw new HindcastFormatException(file.Path, variable.Name, $"station {s + 1} moves from {first} to {v}; only fixed output points are read");
            }
            if (double.IsNaN(first)) throw new HindcastFormatException(file.Path, variable.Name, $"station {s + 1} has no coordinate (every value is missing)");
            result[s] = first;
        }
        return result;
    }

    private double[] ReadDepths(NetCdfFile file, NetCdfDimension? station, NetCdfDimension time, int count, List<string> notes)
    {
        bool Candidate(NetCdfVariable v) => v.Type.IsNumeric() && v != _density && v.Dimensions.All(d => d == station || d == time)
            && (station is null || v.Dimensions.Contains(station));
        var variable = file.Variables.FirstOrDefault(v => Candidate(v) && CfStandardNames.DepthPositiveDown.Contains(v.TextAttribute("standard_name") ?? ""))
            ?? file.Variables.FirstOrDefault(v => Candidate(v) && v.TextAttribute("standard_name") == CfStandardNames.Depth)
            ?? file.Variables.FirstOrDefault(v => Candidate(v) && v.TextAttribute("standard_name") is null
                && CfStandardNames.WaterDepthNames.Contains(v.Name, StringComparer.OrdinalIgnoreCase));
        var depths = new double[count];
        Array.Fill(depths, double.NaN);
        if (variable is null) return depths;
        CfValueDecoder decoder;
        try
        {
            decoder = CfValueDecoder.Create(variable, PhysicalQuantity.Length,
                negate: string.Equals(variable.TextAttribute("positive"), "up", StringComparison.OrdinalIgnoreCase));
        }
        catch (FormatException e)
        {
            throw new HindcastFormatException(file.Path, variable.Name, e.Message, e);
        }
        var raw = file.ReadAll<float>(variable);
        decoder.DecodeInPlace(raw);
        bool timeFirst = variable.Rank == 2 && variable.Dimensions[0] != station;
        int steps = raw.Length / count;
        for (int s = 0; s < count; s++)
        {
            double sum = 0;
            int valid = 0;
            for (int t = 0; t < steps; t++)
            {
                float v = timeFirst || station is null ? raw[t * count + s] : raw[s * steps + t];
                if (float.IsNaN(v)) continue;
                sum += v;
                valid++;
            }
            if (valid > 0)
            {
                double depth = sum / valid;
                if (!(depth > 0))
                    throw new HindcastFormatException(file.Path, variable.Name, $"gives station {s + 1} a depth of {depth:0.###} m; an output point at sea needs a positive depth");
                depths[s] = depth;
            }
        }
        notes.Add(steps > 1
            ? $"depth per station from '{variable.Name}', the mean of its {steps} steps"
            : $"depth per station from '{variable.Name}'");
        return depths;
    }
}
