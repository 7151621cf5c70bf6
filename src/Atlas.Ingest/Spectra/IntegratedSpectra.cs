using System.Buffers;
using System.Runtime.CompilerServices;
using Atlas.Hindcast;
using Atlas.Hindcast.Spectra;
using Atlas.WavePhysics;

namespace Atlas.Ingest.Spectra;

/// <summary>
/// Every spectrum of a point file integrated once (<see cref="SpectralIntegrator"/>, at each station's depth) and kept
/// in memory: the per-step parameters the series store (Hs, Te, Tp, mean direction, spread), the per-step spectral
/// products (<see cref="SpectralProduct"/>), and the monthly sums of each station's frequency spectrum and direction-bin
/// powers, from which the period means are built. Serves the ingest's reads as a gridded file would
/// (<see cref="IStepReader"/>), so point files go through the same plan, checks, shared-step rules and COPY as grids.
/// </summary>
public sealed class IntegratedSpectra : IStepReader
{
    /// <summary>Values read from the file at a time: about 2 MB, so that a block stays in the processor's cache from its
    /// read to its integration.</summary>
    private const long BlockValues = 512 << 10;

    /// <summary>The most values of a block of whole chunks (128 MB): files with longer chunks are read across them.</summary>
    private const long MaxBlockValues = 32 << 20;

    private readonly Dictionary<WaveParameter, float[]> _series = [];   // [station * steps + step]
    private readonly float[][] _products;                                // per product, [station * steps + step]
    private readonly int[] _monthOfStep;                                 // step -> index into Months
    private readonly MonthSums[] _monthSums;                             // per index into Months
    private string? _path;                                               // to read steps again (SpectraOf)
    private VariableMapping? _mapping;

    private IntegratedSpectra(PointSpectraFile file, IReadOnlyList<string> notes)
    {
        Stations = file.Stations;
        Grid = file.Grid;
        Axes = new SpectralAxes(file.FrequenciesHz, file.DirectionsFrom);
        TimesUtc = file.TimesUtc;
        Notes = notes;
        SpectrumVariable = file.SpectrumVariable;
        int stations = Stations.Count, steps = TimesUtc.Count;
        foreach (var parameter in WaveParameterGroups.SeriesFields) _series[parameter] = new float[stations * steps];
        _products = new float[SpectralProducts.Count][];
        for (int k = 0; k < _products.Length; k++) _products[k] = new float[stations * steps];
        // One slot per calendar month the file's steps fall in (UTC).
        _monthOfStep = new int[steps];
        var months = new List<(int Year, int Month)>();
        var slots = new Dictionary<(int Year, int Month), int>();
        for (int t = 0; t < steps; t++)
        {
            var month = (TimesUtc[t].Year, TimesUtc[t].Month);
            if (!slots.TryGetValue(month, out int slot)) { slots[month] = slot = months.Count; months.Add(month); }
            _monthOfStep[t] = slot;
        }
        Months = months;
        _monthSums = months.Select(_ => new MonthSums(stations, Axes.FrequencyCount, Axes.DirectionCount)).ToArray();
    }

    /// <summary>Sums over one calendar month of the file's steps with a spectrum, per station: S(f), each direction bin's power, the steps.</summary>
    private sealed class MonthSums(int stations, int frequencies, int directions)
    {
        public readonly double[] Frequency = new double[stations * frequencies];
        public readonly double[] Direction = new double[stations * directions];
        public readonly int[] Steps = new int[stations];
    }

    public IReadOnlyList<SpectralStation> Stations { get; }

    public StationGrid Grid { get; }

    public SpectralAxes Axes { get; }

    public IReadOnlyList<DateTime> TimesUtc { get; }

    public string SpectrumVariable { get; }

    /// <summary>What was converted and assumed, in words: the reader's notes and the integration rule.</summary>
    public IReadOnlyList<string> Notes { get; }

    /// <summary>The calendar months (UTC) the file's steps fall in, in order.</summary>
    public IReadOnlyList<(int Year, int Month)> Months { get; }

    /// <summary>
    /// The sums over month <paramref name="month"/> (an index into <see cref="Months"/>) of one station's steps that have
    /// a spectrum: S(f) in m^2 s, each direction bin's power in kW/m, and the number of steps.
    /// </summary>
    public (ReadOnlyMemory<double> Frequency, ReadOnlyMemory<double> Direction, int Steps) MonthSum(int month, int station)
    {
        var sums = _monthSums[month];
        int nf = Axes.FrequencyCount, nd = Axes.DirectionCount;
        return (sums.Frequency.AsMemory(station * nf, nf), sums.Direction.AsMemory(station * nd, nd), sums.Steps[station]);
    }

    /// <summary>The month index (into <see cref="Months"/>) of step <paramref name="step"/>.</summary>
    public int MonthOf(int step) => _monthOfStep[step];

    /// <summary>
    /// S(f) and the direction bins' power of the given steps of one station, integrated again from the file (for the
    /// rare steps that another file also gives, whose spectra must not be counted twice in the monthly sums).
    /// </summary>
    public IReadOnlyList<(double[] Frequency, double[] Direction)> SpectraOf(int station, IReadOnlyList<int> steps)
    {
        var path = _path ?? throw new InvalidOperationException("the file these spectra came from is not known");
        using var file = PointSpectraFile.Open(path, _mapping);
        var integrator = new SpectralIntegrator(Axes, Stations[station].DepthMetres);
        var buffer = new float[(long)Stations.Count * file.ValuesPerSpectrum];
        var result = new List<(double[], double[])>(steps.Count);
        foreach (int t in steps)
        {
            file.ReadSteps(t, 1, buffer);
            integrator.Integrate(buffer.AsSpan(station * file.ValuesPerSpectrum, file.ValuesPerSpectrum));
            result.Add((integrator.FrequencySpectrum.ToArray(), integrator.DirectionPowers.ToArray()));
        }
        return result;
    }

    /// <summary>One product of one station, per step.</summary>
    public ReadOnlySpan<float> Product(SpectralProduct product, int station) =>
        _products[(int)product].AsSpan(station * TimesUtc.Count, TimesUtc.Count);

    /// <summary>One series parameter of one station, per step.</summary>
    public ReadOnlySpan<float> Series(WaveParameter parameter, int station) =>
        _series[parameter].AsSpan(station * TimesUtc.Count, TimesUtc.Count);

    /// <summary>Reads and integrates every step of <paramref name="file"/>.</summary>
    /// <param name="mapping">The mapping the file was opened with, kept to read steps again (<see cref="SpectraOf"/>).</param>
    public static IntegratedSpectra Integrate(PointSpectraFile file, VariableMapping? mapping = null)
    {
        var notes = file.Notes.Append(
            "per step: Hm0 = 4 sqrt(m0), Te = m-1/m0, Tp = 1/f at the largest density (no fitting between frequencies), " +
            "J = rho g sum cg(f, h) S(f) df with each frequency's group velocity at the station depth (rho 1025 kg/m3, g 9.81 m/s2), " +
            "mean direction and spread from the first circular moment, directionality from the largest directionally resolved power, " +
            "spectral width eps0; frequency integrals by the trapezoidal rule over the given frequencies").ToList();
        var result = new IntegratedSpectra(file, notes) { _path = file.Path, _mapping = mapping };
        result.Fill(file);
        return result;
    }

    private void Fill(PointSpectraFile file)
    {
        int stations = Stations.Count, steps = TimesUtc.Count, perSpectrum = file.ValuesPerSpectrum;
        var integrators = Stations.Select(s => new SpectralIntegrator(Axes, s.DepthMetres)).ToArray();
        int block = file.PlanBlocks(BlockValues, MaxBlockValues);
        // Two buffers: the file reads the next block as stored (netCDF calls stay on one thread at a time) while this one
        // is decoded and integrated, station by station, each spectrum decoded into one scratch spectrum.
        int length = checked(block * stations * perSpectrum);
        var buffers = new[] { ArrayPool<float>.Shared.Rent(length), ArrayPool<float>.Shared.Rent(length) };
        var spectrum = new float[perSpectrum];
        var refused = new int[stations];   // per station, the first step of the block whose density is negative, or -1
        Task? reading = steps > 0 ? Task.Run(() => file.ReadStoredSteps(0, Math.Min(block, steps), buffers[0])) : null;
        try
        {
            for (int t0 = 0, turn = 0; t0 < steps; t0 += block, turn ^= 1)
            {
                int n = Math.Min(block, steps - t0);
                reading!.GetAwaiter().GetResult();
                var buffer = buffers[turn];
                int next = t0 + block, nextCount = Math.Min(block, steps - next);
                var nextBuffer = buffers[turn ^ 1];
                reading = next < steps ? Task.Run(() => file.ReadStoredSteps(next, nextCount, nextBuffer)) : Task.CompletedTask;
                // Station after station on this thread: files are integrated beside each other and beside their
                // checksums (SourceFile.OpenAllAsync), which keeps the processors busy without splitting a block.
                for (int s = 0; s < stations; s++) refused[s] = IntegrateStation(file, integrators[s], spectrum, s, t0, n, buffer);
                // The first refused spectrum in step-then-station order, as reading the steps one after another meets it.
                int badStation = -1;
                for (int s = 0; s < stations; s++)
                    if (refused[s] >= 0 && (badStation < 0 || refused[s] < refused[badStation])) badStation = s;
                if (badStation >= 0) throw file.NegativeDensity(buffer, t0, n, refused[badStation], badStation);
            }
        }
        finally
        {
            // A read still under way ends before the file can be closed (and its buffer returned).
            try { reading?.Wait(); } catch (AggregateException) { }
            foreach (var buffer in buffers) ArrayPool<float>.Shared.Return(buffer);
        }
    }

    /// <summary>
    /// Decodes and integrates steps t0..t0+n of station <paramref name="s"/> from a block of n steps as the file stores
    /// them; returns the first step of the block whose density is negative (nothing of it summed), or -1.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private int IntegrateStation(PointSpectraFile file, SpectralIntegrator integrator, float[] spectrum, int s, int t0, int n, float[] buffer)
    {
        int steps = TimesUtc.Count, nf = Axes.FrequencyCount, nd = Axes.DirectionCount;
        var hs = _series[WaveParameter.Hs]; var te = _series[WaveParameter.Te]; var tp = _series[WaveParameter.Tp];
        var dir = _series[WaveParameter.Dir]; var spread = _series[WaveParameter.Spread];
        for (int k = 0; k < n; k++)
        {
            int t = t0 + k;
            if (!file.TryDecodeSpectrum(buffer, n, k, s, spectrum)) return k;
            var state = integrator.Integrate(spectrum);
            int at = s * steps + t;
            hs[at] = (float)state.Hm0;
            te[at] = (float)state.EnergyPeriod;
            tp[at] = (float)state.PeakPeriod;
            dir[at] = (float)state.MeanDirectionFrom;
            spread[at] = (float)state.DirectionalSpread;
            _products[(int)SpectralProduct.Power][at] = (float)state.Power;
            _products[(int)SpectralProduct.ParametricPower][at] = (float)state.ParametricPower;
            _products[(int)SpectralProduct.Directionality][at] = (float)state.Directionality;
            _products[(int)SpectralProduct.MaximumPowerFrom][at] = (float)state.MaximumPowerFrom;
            _products[(int)SpectralProduct.SpectralWidth][at] = (float)state.SpectralWidth;
            if (float.IsNaN(hs[at])) continue;
            var sums = _monthSums[_monthOfStep[t]];
            var frequencySpectrum = integrator.FrequencySpectrum;
            var frequency = sums.Frequency.AsSpan(s * nf, nf);
            for (int i = 0; i < nf; i++) frequency[i] += frequencySpectrum[i];
            var powers = integrator.DirectionPowers;
            var direction = sums.Direction.AsSpan(s * nd, nd);
            for (int j = 0; j < nd; j++) direction[j] += powers[j];
            sums.Steps[s]++;
        }
        return -1;
    }

    public void ReadSteps(WaveParameter variable, int timeStart, int timeCount, int pointStart, int pointCount, Span<float> destination)
    {
        if (!_series.TryGetValue(variable, out var values))
            throw new InvalidOperationException($"a spectral point file gives no {variable.Symbol()} per step");
        int steps = TimesUtc.Count;
        for (int t = 0; t < timeCount; t++)
            for (int p = 0; p < pointCount; p++)
                destination[t * pointCount + p] = values[(pointStart + p) * steps + timeStart + t];
    }

    public DepthField ReadDepthField()
    {
        var metres = Stations.Select(s => (float)s.DepthMetres).ToArray();
        return new DepthField(metres, metres.Select(m => float.IsNaN(m) ? 0 : 1).ToArray(), 1, false);
    }

    /// <summary>True when at least one station has a depth.</summary>
    public bool HasDepth => Stations.Any(s => !double.IsNaN(s.DepthMetres));

    /// <summary>Nothing to release: the integrated values stay with the source file for the products' writer.</summary>
    public void Dispose() { }
}
