namespace Atlas.Demo;

/// <summary>
/// An invented device's power matrix: electrical power (kW) by Hs bin centre (rows) and Te bin
/// centre (columns). The shape follows how a resonant point absorber behaves: absorbed power is
/// the deep-water wave power J = 0.4906 Hs^2 Te kW/m (IEC TS 62600-101, from memory) times a
/// capture width that peaks at the device's resonance period and falls off on either side (faster
/// towards short periods), and the power take-off saturates smoothly at the rating,
/// P = rated tanh(J w / rated), so no cell exceeds the rating. Values are rounded to whole kW.
/// </summary>
public sealed class DevicePowerMatrix
{
    /// <summary>Deep-water power coefficient rho g^2 / (64 pi) with rho 1025 kg/m3, g 9.81 m/s2, in kW/m per m2 s.</summary>
    public const double DeepWaterPowerCoefficient = 1025.0 * 9.81 * 9.81 / (64.0 * Math.PI) / 1000.0;

    /// <summary>Name of the device.</summary>
    public string DeviceName { get; }

    /// <summary>Rated (maximum) electrical power, kW.</summary>
    public double RatedKilowatts { get; }

    /// <summary>Hs bin centres, m, ascending.</summary>
    public double[] HsCentres { get; }

    /// <summary>Te bin centres, s, ascending.</summary>
    public double[] TeCentres { get; }

    /// <summary>Power, kW, <c>[hs index, te index]</c>.</summary>
    public double[,] Kilowatts { get; }

    private DevicePowerMatrix(string name, double rated, double[] hs, double[] te, double[,] kw)
    {
        DeviceName = name;
        RatedKilowatts = rated;
        HsCentres = hs;
        TeCentres = te;
        Kilowatts = kw;
    }

    /// <summary>
    /// The matrix of a point absorber rated <paramref name="ratedKilowatts"/> whose capture width
    /// peaks at <paramref name="peakCaptureWidthMetres"/> at <paramref name="resonancePeriodSeconds"/>,
    /// on Hs bins centred 0.25..6.75 m by 0.5 m and Te bins centred 4.5..16.5 s by 1 s.
    /// </summary>
    public static DevicePowerMatrix PointAbsorber(string name, double ratedKilowatts, double resonancePeriodSeconds, double peakCaptureWidthMetres)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(name);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(ratedKilowatts);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(resonancePeriodSeconds);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(peakCaptureWidthMetres);
        double[] hs = [.. Enumerable.Range(0, 14).Select(i => 0.25 + 0.5 * i)];
        double[] te = [.. Enumerable.Range(0, 13).Select(i => 4.5 + i)];
        var kw = new double[hs.Length, te.Length];
        for (int j = 0; j < te.Length; j++)
        {
            // Narrower response below resonance than above it.
            double width = te[j] < resonancePeriodSeconds ? 2.2 : 3.5;
            double offset = (te[j] - resonancePeriodSeconds) / width;
            double captureWidth = peakCaptureWidthMetres * Math.Exp(-0.5 * offset * offset);
            for (int i = 0; i < hs.Length; i++)
            {
                double absorbed = DeepWaterPowerCoefficient * hs[i] * hs[i] * te[j] * captureWidth;
                kw[i, j] = Math.Round(ratedKilowatts * Math.Tanh(absorbed / ratedKilowatts));
            }
        }
        return new DevicePowerMatrix(name, ratedKilowatts, hs, te, kw);
    }
}
