using System.Security.Cryptography;
using Atlas.Hindcast;
using Atlas.Hindcast.Spectra;
using Atlas.Ingest.Spectra;

namespace Atlas.Ingest.Ingestion;

/// <summary>
/// An opened hindcast file with its checksum and time line (Unix seconds): a gridded or mesh file of wave fields, or a
/// file of spectra at output points, whose spectra are integrated on opening (<see cref="IntegratedSpectra"/>) and then
/// read as fields of stations.
/// </summary>
public sealed class SourceFile : IDisposable
{
    private readonly VariableMapping? _mapping;
    private IStepReader? _file;

    private SourceFile(HindcastFile file, VariableMapping? mapping, Task<string>? checksum, long sizeBytes, IReadOnlyDictionary<string, string> attributes,
        DepthLookalike? depthLookalike)
        : this(file.Path, file.Grid, file.TimesUtc, mapping, checksum, sizeBytes, attributes)
    {
        DepthLookalike = depthLookalike;
        Sources = WaveParameterGroups.HindcastFields.Where(file.Has).ToDictionary(v => v, v =>
        {
            var resolved = file.Source(v)!;
            return new VariableSource(resolved.Name, resolved.HowFound, resolved.DescribeConversion(file.DecoderOf(v)!));
        });
        Variables = WaveParameterGroups.HindcastFields.Where(file.Has).ToHashSet();
        _file = file;
    }

    private SourceFile(IntegratedSpectra spectra, VariableMapping? mapping, Task<string>? checksum, long sizeBytes, IReadOnlyDictionary<string, string> attributes,
        string path)
        : this(path, spectra.Grid, spectra.TimesUtc, mapping, checksum, sizeBytes, attributes)
    {
        Spectra = spectra;
        var fields = WaveParameterGroups.SeriesFields.Where(v => spectra.Axes.IsDirectional || v is not (WaveParameter.Dir or WaveParameter.Spread)).ToList();
        if (spectra.HasDepth) fields.Add(WaveParameter.Depth);
        Variables = fields.ToHashSet();
        Sources = fields.ToDictionary(v => v, v => v == WaveParameter.Depth
            ? new VariableSource(spectra.SpectrumVariable, "the output points' depths", string.Join("; ", spectra.Notes.Where(n => n.StartsWith("depth") || n.StartsWith("no depth"))))
            : new VariableSource(spectra.SpectrumVariable, "integrated from the spectrum", "none"));
        _file = spectra;
    }

    private SourceFile(string path, HindcastGrid grid, IReadOnlyList<DateTime> times, VariableMapping? mapping, Task<string>? checksum, long sizeBytes,
        IReadOnlyDictionary<string, string> attributes)
    {
        Attributes = attributes;
        _mapping = mapping;
        Path = path;
        Grid = grid;
        _checksum = checksum;
        SizeBytes = sizeBytes;
        Times = times.Select(t => new DateTimeOffset(DateTime.SpecifyKind(t, DateTimeKind.Utc)).ToUnixTimeSeconds()).ToArray();
        Variables = new HashSet<WaveParameter>();
        Sources = new Dictionary<WaveParameter, VariableSource>();
    }

    /// <summary>
    /// The open file, opened again on demand after <see cref="Release"/>. Files are released as soon as the ingest
    /// is done with them, so that netCDF-C's per-variable chunk caches of many files never pile up in memory.
    /// Integrated spectra stay: they are what the products' writer stores after the series.
    /// </summary>
    public IStepReader File => _file ??= HindcastFile.Open(Path, _mapping);

    /// <summary>The integrated spectra of a point file; null for a file of fields.</summary>
    public IntegratedSpectra? Spectra { get; }

    public string Path { get; }
    public HindcastGrid Grid { get; }
    public IReadOnlySet<WaveParameter> Variables { get; private init; }
    public bool Has(WaveParameter variable) => Variables.Contains(variable);
    public string Name => System.IO.Path.GetFileName(Path);
    /// <summary>
    /// The checksum of the file's bytes as provenance records it (<see cref="FileChecksum"/>: <c>blake3:…</c>). Opened
    /// for a load, the file computes it beside the decoding and the load, and it is waited for where first needed (files
    /// alike, an append, the record of the sources); opened for a part of an ingest in parts or for queueing one, it is
    /// computed only where asked for (the part that records the sources). A read error of the file surfaces there.
    /// </summary>
    public string Checksum => (_checksum ??= Task.FromResult(FileChecksum.Of(Path))).GetAwaiter().GetResult();

    /// <summary>The checksum by <paramref name="algorithm"/>: <see cref="Checksum"/>, or computed now for another one.</summary>
    public string ChecksumBy(string algorithm) => algorithm == FileChecksum.Blake3 ? Checksum : FileChecksum.Of(Path, algorithm);

    /// <summary>The checksum's computation, done when the file has been read through for it (at once when none runs).</summary>
    public Task Checksummed => _checksum ?? Task.CompletedTask;

    private Task<string>? _checksum;
    public long SizeBytes { get; }
    public long[] Times { get; }

    /// <summary>The file's global text attributes (title, institution, source, history, license, ...).</summary>
    public IReadOnlyDictionary<string, string> Attributes { get; }

    public string? Attribute(string name) => Attributes.GetValueOrDefault(name);

    /// <summary>The file variable behind each wave variable the file has, how it was found and how it is converted.</summary>
    public IReadOnlyDictionary<WaveParameter, VariableSource> Sources { get; private init; }

    /// <summary>A variable named like the water depth that was not taken for it, and why; null when there is none.</summary>
    public DepthLookalike? DepthLookalike { get; private init; }

    /// <summary>The most files opened at once by <see cref="OpenAll"/>, whatever the processor count: each holds its read buffers.</summary>
    private const int MaxOpenAtOnce = 4;

    /// <summary>
    /// Opens <paramref name="paths"/> as <see cref="Open"/> does, one file per processor at a time (each file's checksum
    /// and, for spectra, its integration run beside the other files'), and returns them in the given order, released
    /// (<see cref="Release"/>). When a file fails, no further file is started, those started are finished and disposed,
    /// and the error of the first failing file in the given order is thrown, as opening them one after another would.
    /// </summary>
    /// <remarks>
    /// The files are opened on the thread pool's threads, never on threads started for the purpose: the HDF5 library
    /// frees a thread's error stack when the thread ends, which crashes the process after a refused file (seen with HDF5
    /// 1.10 built thread-safe), and the pool's threads live on.
    /// </remarks>
    /// <param name="opened">Called with the number of files opened so far, one call at a time.</param>
    /// <param name="checksumNow">Whether each file computes its checksum from its opening on (see <see cref="Checksum"/>).</param>
    public static async Task<List<SourceFile>> OpenAllAsync(IReadOnlyList<string> paths, VariableMapping? mapping, Action<int>? opened = null,
        bool checksumNow = true, CancellationToken cancel = default)
    {
        // Not disposed: a file's checksum gives its slot back after the call may have returned.
        var slots = new SemaphoreSlim(Math.Clamp(Environment.ProcessorCount, 1, MaxOpenAtOnce));
        var tasks = new List<Task<SourceFile>>(paths.Count);
        var report = new object();
        int count = 0, failed = 0;
        try
        {
            foreach (var path in paths)
            {
                await slots.WaitAsync(cancel);
                if (Volatile.Read(ref failed) != 0) { slots.Release(); break; }
                tasks.Add(Task.Run(() =>
                {
                    try
                    {
                        var file = Open(path, mapping, checksumNow);
                        file.Release();
                        lock (report) opened?.Invoke(++count);
                        // The slot stays the file's until its checksum is done, so that no more files than processors
                        // are read at a time; the last files' checksums go on beside the load.
                        file.Checksummed.ContinueWith(_ => slots.Release(), CancellationToken.None, TaskContinuationOptions.ExecuteSynchronously, TaskScheduler.Default);
                        return file;
                    }
                    catch
                    {
                        Volatile.Write(ref failed, 1);
                        slots.Release();
                        throw;
                    }
                }, CancellationToken.None));
            }
        }
        catch
        {
            // Cancelled: the files already opened are closed again, once every file started is finished.
            await Finish(tasks);
            foreach (var task in tasks.Where(t => t.IsCompletedSuccessfully)) task.Result.Dispose();
            throw;
        }
        await Finish(tasks);
        if (tasks.FirstOrDefault(t => t.IsFaulted) is { } first)
        {
            foreach (var task in tasks.Where(t => t.IsCompletedSuccessfully)) task.Result.Dispose();
            System.Runtime.ExceptionServices.ExceptionDispatchInfo.Throw(first.Exception!.InnerException!);
        }
        return tasks.Select(t => t.Result).ToList();
    }

    /// <summary>Waits for every file started, so that no read of a file outlives the call (their faults are looked at after).</summary>
    private static Task Finish(List<Task<SourceFile>> tasks) => Task.WhenAll(tasks).ContinueWith(_ => { }, TaskScheduler.Default);

    /// <summary>Opens and decodes a file, and checksums its bytes (<see cref="FileChecksum"/>).</summary>
    public static SourceFile Open(string path, VariableMapping? mapping, bool checksumNow = true)
    {
        if (!System.IO.File.Exists(path)) throw new IngestException($"{path}: no such file.");
        // The checksum reads the file once more: it runs beside the decoding (and a spectral file's integration), and
        // on beside the load; the file, once disposed, waits for it.
        var checksum = checksumNow ? Task.Run(() => FileChecksum.Of(path)) : null;
        try
        {
            return OpenDecoded(path, mapping, checksum);
        }
        catch
        {
            // A failed decoding still waits for the checksum, so that no read of the file outlives the call.
            try { checksum?.Wait(); } catch (AggregateException) { }
            throw;
        }
    }

    private static SourceFile OpenDecoded(string path, VariableMapping? mapping, Task<string>? checksum)
    {
        Dictionary<string, string> attributes;
        bool spectral;
        using (var raw = NetCdfFile.Open(path))
        {
            attributes = raw.GlobalAttributes.Where(a => a.IsText).ToDictionary(a => a.Name, a => a.Text!, StringComparer.OrdinalIgnoreCase);
            spectral = PointSpectraFile.HoldsSpectra(raw, mapping);
        }
        if (spectral)
        {
            using var points = PointSpectraFile.Open(path, mapping);
            if (points.TimesUtc.Count == 0) throw new IngestException($"{System.IO.Path.GetFileName(path)}: the time axis is empty; there is nothing to load.");
            var integrated = IntegratedSpectra.Integrate(points, mapping);
            return new SourceFile(integrated, mapping, checksum, new FileInfo(path).Length, attributes, path);
        }
        var file = HindcastFile.Open(path, mapping);
        DepthLookalike? lookalike = null;
        if (!file.Has(WaveParameter.Depth))
            using (var raw = NetCdfFile.Open(path)) lookalike = CfDecoder.WaterDepthLookalike(raw);
        if (file.TimesUtc.Count == 0)
        {
            file.Dispose();
            throw new IngestException($"{System.IO.Path.GetFileName(path)}: the time axis is empty; there is nothing to load.");
        }
        return new SourceFile(file, mapping, checksum, new FileInfo(path).Length, attributes, lookalike);
    }

    /// <summary>Closes the file (and frees its caches) until it is next needed.</summary>
    public void Release()
    {
        if (Spectra is not null) return;
        _file?.Dispose();
        _file = null;
    }

    /// <summary>Closes the file, once its checksum is done: no read of the file outlives it.</summary>
    public void Dispose()
    {
        Release();
        try { _checksum?.Wait(); } catch (AggregateException) { }
    }
}
