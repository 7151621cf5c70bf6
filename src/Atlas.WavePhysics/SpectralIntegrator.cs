using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;

namespace Atlas.WavePhysics;

/// <summary>
/// Integrates the spectra of one output point, step after step: every parameter of <see cref="SpectralSeaState"/> in
/// one pass over S(f, theta), plus the power of each direction bin (the directionally resolved power's components) and
/// the frequency spectrum, which period means are built from.
/// </summary>
/// <remarks>
/// Frequency integrals use the trapezoidal weights of <see cref="SpectralAxes"/>; direction integrals are sums times the
/// bin width. The group velocity of each frequency is solved once at the point's depth (deep water when the depth is
/// unknown). Densities are m^2 s rad^-1 for a directional spectrum, m^2 s for a frequency spectrum; a missing step (any
/// density NaN) gives NaN parameters. Densities must not be negative: the caller checks and names the file.
/// One integrator per point and thread; it keeps scratch buffers.
/// </remarks>
public sealed class SpectralIntegrator
{
    private readonly SpectralAxes _axes;
    private readonly double[] _powerWeights;   // rho g cg(f, h) w(f) / 1000: kW/m per (m^2 s) of density
    private readonly double[] _mMinus1, _mMinus2, _m0;
    private readonly double[] _directionCos, _directionSin;
    private readonly ResolvedPowerSweep? _sweep;
    private readonly double[] _frequencySpectrum;
    private readonly double[] _directionPowers;
    private readonly double[] _directionEnergy;

    // The parametric power from Hm0 and Te, as the gridded layers compute it: the group velocity at Te from the table
    // (relative error below 1e-7, under the float the value is stored in) instead of solving the dispersion relation at
    // every step, which took a tenth of an ingest of spectra.
    private readonly GroupVelocityTable _parametric;

    /// <param name="axes">The spectrum's axes.</param>
    /// <param name="depthMetres">The point's depth, m; NaN or +infinity means deep water.</param>
    public SpectralIntegrator(SpectralAxes axes, double depthMetres)
    {
        _axes = axes;
        DispersionRelation.CheckDepth(depthMetres);
        DepthMetres = depthMetres;
        _parametric = new GroupVelocityTable(depthMetres);
        int nf = axes.FrequencyCount, nd = axes.DirectionCount;
        _powerWeights = new double[nf];
        _m0 = new double[nf];
        _mMinus1 = new double[nf];
        _mMinus2 = new double[nf];
        var f = axes.Frequencies;
        var w = axes.FrequencyWeights;
        double rhoG = PhysicalConstants.SeawaterDensity * PhysicalConstants.Gravity / 1000.0;
        for (int i = 0; i < nf; i++)
        {
            _m0[i] = w[i];
            _mMinus1[i] = w[i] / f[i];
            _mMinus2[i] = w[i] / (f[i] * f[i]);
            _powerWeights[i] = rhoG * DispersionRelation.GroupVelocity(1 / f[i], depthMetres) * w[i];
        }
        _directionCos = new double[nd];
        _directionSin = new double[nd];
        for (int j = 0; j < nd; j++)
            (_directionSin[j], _directionCos[j]) = Math.SinCos(axes.DirectionsFrom[j] * Math.PI / 180);
        _sweep = nd > 0 ? new ResolvedPowerSweep(axes.DirectionsFrom) : null;
        _frequencySpectrum = new double[nf];
        _directionPowers = new double[nd];
        _directionEnergy = new double[nd];
    }

    public SpectralAxes Axes => _axes;

    public double DepthMetres { get; }

    /// <summary>S(f) of the last step integrated, m^2 s (m^2/Hz).</summary>
    public ReadOnlySpan<double> FrequencySpectrum => _frequencySpectrum;

    /// <summary>The power of each direction bin of the last step, kW/m (empty for a frequency spectrum).</summary>
    public ReadOnlySpan<double> DirectionPowers => _directionPowers;

    /// <summary>Integrates one step.</summary>
    /// <param name="density">
    /// S(f, theta) frequency-major (density[i * directions + j]) in m^2 s rad^-1, or S(f) in m^2 s when the axes have no
    /// directions.
    /// </param>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public SpectralSeaState Integrate(ReadOnlySpan<float> density)
    {
        int nf = _axes.FrequencyCount, nd = _axes.DirectionCount;
        int perFrequency = Math.Max(nd, 1);
        if (density.Length != nf * perFrequency)
            throw new ArgumentException($"A step has {density.Length} densities; {nf} frequencies x {perFrequency} directions need {nf * perFrequency}.", nameof(density));

        double binWidth = _axes.DirectionBinRadians;
        bool missing = false;
        if (nd == 0)
        {
            for (int i = 0; i < nf; i++)
            {
                float s = density[i];
                if (float.IsNaN(s)) missing = true;
                _frequencySpectrum[i] = s;
            }
        }
        else
        {
            Array.Clear(_directionPowers);
            Array.Clear(_directionEnergy);
            var powers = _directionPowers.AsSpan(0, nd);
            var energy = _directionEnergy.AsSpan(0, nd);
            Accumulate(density, nf, nd, powers, energy);
            for (int i = 0; i < nf; i++)
            {
                double sum = _frequencySpectrum[i];
                if (double.IsNaN(sum)) { missing = true; break; }
                _frequencySpectrum[i] = sum * binWidth;
            }
            for (int j = 0; j < nd; j++) _directionPowers[j] *= binWidth;
        }
        if (missing) return Missing();

        double m0 = 0, mMinus1 = 0, mMinus2 = 0, power = 0, peakDensity = -1;
        int peak = 0;
        for (int i = 0; i < nf; i++)
        {
            double s = _frequencySpectrum[i];
            m0 += _m0[i] * s;
            mMinus1 += _mMinus1[i] * s;
            mMinus2 += _mMinus2[i] * s;
            power += _powerWeights[i] * s;
            if (s > peakDensity) { peakDensity = s; peak = i; }
        }
        if (!(m0 > 0))
            return new SpectralSeaState(0, double.NaN, double.NaN, 0, 0, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN);

        double hm0 = 4 * Math.Sqrt(m0);
        double te = mMinus1 / m0;
        double width = Math.Sqrt(Math.Max(0, m0 * mMinus2 / (mMinus1 * mMinus1) - 1));
        double parametric = _parametric.Power(hm0, te);

        double meanFrom = double.NaN, spread = double.NaN, d = double.NaN, maxFrom = double.NaN;
        if (nd > 0)
        {
            // Energy per direction bin: sum_i w_i S(f_i, theta_j) dtheta; its first circular moment gives the mean
            // direction and the spread sqrt(2 (1 - r1)).
            double a1 = 0, b1 = 0, energy = 0;
            for (int j = 0; j < nd; j++)
            {
                double e = _directionEnergy[j];
                a1 += e * _directionCos[j];
                b1 += e * _directionSin[j];
                energy += e;
            }
            double r1 = Math.Sqrt(a1 * a1 + b1 * b1) / energy;
            meanFrom = Degrees(Math.Atan2(b1, a1));
            spread = Math.Sqrt(Math.Max(0, 2 * (1 - r1))) * 180 / Math.PI;
            var resolved = _sweep!.Maximum(_directionPowers);
            d = resolved.Coefficient;
            maxFrom = resolved.DirectionOfMaximumDegrees;
        }
        return new SpectralSeaState(hm0, te, 1 / _axes.Frequencies[peak], power, parametric, width, meanFrom, spread, d, maxFrom);
    }

    /// <summary>
    /// One pass over S(f, theta): each direction bin's power (rows weighted by rho g cg w) into <paramref name="powers"/>,
    /// its energy (rows weighted by w) into <paramref name="energy"/>, and each frequency's sum over the directions into
    /// the frequency spectrum (not yet times the bin width). Eight directions at a time in registers where the machine
    /// has 256-bit vectors, three such blocks per pass over the frequencies (their twelve sums stay in registers), then
    /// single blocks, then the directions left one by one. Each sum adds its terms in the same order whatever the
    /// grouping: a direction's sums over the frequencies in frequency order, a frequency's sum over the directions
    /// block after block.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void Accumulate(ReadOnlySpan<float> density, int nf, int nd, Span<double> powers, Span<double> energy)
    {
        Array.Clear(_frequencySpectrum);
        int j0 = 0;
        if (Vector256.IsHardwareAccelerated)
        {
            for (; j0 + 24 <= nd; j0 += 24) AccumulateThreeBlocks(density, nf, nd, j0, powers, energy);
            for (; j0 + 8 <= nd; j0 += 8) AccumulateBlock(density, nf, nd, j0, powers, energy);
        }
        for (int i = 0; i < nf; i++)
        {
            var row = density.Slice(i * nd, nd);
            double sum = 0, weight = _powerWeights[i], trapezoid = _m0[i];
            for (int j = j0; j < nd; j++)
            {
                float s = row[j];
                sum += s;
                powers[j] += weight * s;
                energy[j] += trapezoid * s;
            }
            _frequencySpectrum[i] += sum;
        }
    }

    /// <summary>Directions j0 .. j0 + 7 of every frequency (see <see cref="Accumulate"/>).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void AccumulateBlock(ReadOnlySpan<float> density, int nf, int nd, int j0, Span<double> powers, Span<double> energy)
    {
        Vector256<double> powerLow = default, powerHigh = default, energyLow = default, energyHigh = default;
        for (int i = 0; i < nf; i++)
        {
            var (low, high) = Vector256.Widen(Vector256.Create(density.Slice(i * nd + j0, 8)));
            var weight = Vector256.Create(_powerWeights[i]);
            var trapezoid = Vector256.Create(_m0[i]);
            powerLow += weight * low;
            powerHigh += weight * high;
            energyLow += trapezoid * low;
            energyHigh += trapezoid * high;
            _frequencySpectrum[i] += Vector256.Sum(low + high);
        }
        powerLow.CopyTo(powers.Slice(j0, 4));
        powerHigh.CopyTo(powers.Slice(j0 + 4, 4));
        energyLow.CopyTo(energy.Slice(j0, 4));
        energyHigh.CopyTo(energy.Slice(j0 + 4, 4));
    }

    /// <summary>Directions j0 .. j0 + 23 of every frequency, three blocks of eight in one pass (see <see cref="Accumulate"/>).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void AccumulateThreeBlocks(ReadOnlySpan<float> density, int nf, int nd, int j0, Span<double> powers, Span<double> energy)
    {
        if (density.Length < (nf - 1) * nd + j0 + 24 || _powerWeights.Length < nf || _m0.Length < nf || _frequencySpectrum.Length < nf)
            throw new ArgumentException("The spectrum is shorter than its axes say.", nameof(density));
        Vector256<double> p0l = default, p0h = default, e0l = default, e0h = default;
        Vector256<double> p1l = default, p1h = default, e1l = default, e1h = default;
        Vector256<double> p2l = default, p2h = default, e2l = default, e2h = default;
        ref float first = ref Unsafe.Add(ref MemoryMarshal.GetReference(density), j0);
        ref double weights = ref MemoryMarshal.GetArrayDataReference(_powerWeights);
        ref double trapezoids = ref MemoryMarshal.GetArrayDataReference(_m0);
        ref double spectrum = ref MemoryMarshal.GetArrayDataReference(_frequencySpectrum);
        for (int i = 0; i < nf; i++)
        {
            ref float row = ref Unsafe.Add(ref first, i * nd);
            var weight = Vector256.Create(Unsafe.Add(ref weights, i));
            var trapezoid = Vector256.Create(Unsafe.Add(ref trapezoids, i));
            var (l0, h0) = Vector256.Widen(Vector256.LoadUnsafe(ref row));
            var (l1, h1) = Vector256.Widen(Vector256.LoadUnsafe(ref row, 8));
            var (l2, h2) = Vector256.Widen(Vector256.LoadUnsafe(ref row, 16));
            p0l += weight * l0; p0h += weight * h0; e0l += trapezoid * l0; e0h += trapezoid * h0;
            p1l += weight * l1; p1h += weight * h1; e1l += trapezoid * l1; e1h += trapezoid * h1;
            p2l += weight * l2; p2h += weight * h2; e2l += trapezoid * l2; e2h += trapezoid * h2;
            ref double sum = ref Unsafe.Add(ref spectrum, i);
            sum += Vector256.Sum(l0 + h0);
            sum += Vector256.Sum(l1 + h1);
            sum += Vector256.Sum(l2 + h2);
        }
        p0l.CopyTo(powers.Slice(j0, 4)); p0h.CopyTo(powers.Slice(j0 + 4, 4));
        p1l.CopyTo(powers.Slice(j0 + 8, 4)); p1h.CopyTo(powers.Slice(j0 + 12, 4));
        p2l.CopyTo(powers.Slice(j0 + 16, 4)); p2h.CopyTo(powers.Slice(j0 + 20, 4));
        e0l.CopyTo(energy.Slice(j0, 4)); e0h.CopyTo(energy.Slice(j0 + 4, 4));
        e1l.CopyTo(energy.Slice(j0 + 8, 4)); e1h.CopyTo(energy.Slice(j0 + 12, 4));
        e2l.CopyTo(energy.Slice(j0 + 16, 4)); e2h.CopyTo(energy.Slice(j0 + 20, 4));
    }

    private SpectralSeaState Missing()
    {
        Array.Fill(_frequencySpectrum, double.NaN);
        Array.Fill(_directionPowers, double.NaN);
        return new SpectralSeaState(double.NaN, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN);
    }

    private static double Degrees(double radians)
    {
        double d = radians * 180 / Math.PI % 360;
        return d < 0 ? d + 360 : d;
    }
}
