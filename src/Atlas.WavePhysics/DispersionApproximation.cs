namespace Atlas.WavePhysics;

/// <summary>
/// Explicit approximations to the linear dispersion relation. The exact solver starts from one of them; the
/// tests hold the solver against both as independent references.
/// </summary>
public static class DispersionApproximation
{
    /// <summary>
    /// Fenton and McKee (1990): L = L0 tanh((2 pi h / L0)^(3/4))^(2/3), written for the relative depth:
    /// k h = k0 h / tanh((k0 h)^(3/4))^(2/3). Its largest error is about 1.7 % (at k0 h near 0.3).
    /// </summary>
    /// <param name="deepWaterDepthParameter">k0 h = omega^2 h / g, positive.</param>
    /// <returns>An approximation to k h.</returns>
    public static double FentonMcKeeRelativeDepth(double deepWaterDepthParameter)
    {
        double y = deepWaterDepthParameter;
        return y / Math.Pow(Math.Tanh(Math.Pow(y, 0.75)), 2.0 / 3.0);
    }

    /// <summary>Fenton and McKee (1990) wavelength L = L0 tanh((2 pi h / L0)^(3/4))^(2/3), m.</summary>
    /// <param name="periodSeconds">Period, s.</param>
    /// <param name="depthMetres">Depth, m, positive; NaN or +infinity means deep water.</param>
    public static double FentonMcKeeWavelength(double periodSeconds, double depthMetres)
    {
        DispersionRelation.CheckDepth(depthMetres);
        double l0 = DispersionRelation.DeepWaterWavelength(periodSeconds);
        if (DispersionRelation.IsDeepWater(depthMetres)) return l0;
        return l0 * Math.Pow(Math.Tanh(Math.Pow(2 * Math.PI * depthMetres / l0, 0.75)), 2.0 / 3.0);
    }

    /// <summary>
    /// Hunt (1979) Pade approximation: (k h)^2 = y^2 + y / (1 + sum d_n y^n), n = 1..6, with y = k0 h.
    /// Accurate to about 0.2 % in k.
    /// </summary>
    /// <param name="deepWaterDepthParameter">k0 h = omega^2 h / g, positive.</param>
    /// <returns>An approximation to k h.</returns>
    public static double HuntRelativeDepth(double deepWaterDepthParameter)
    {
        double y = deepWaterDepthParameter;
        double polynomial = 1 + y * (0.6666666667 + y * (0.3555555556 + y * (0.1608465608
                          + y * (0.0632098765 + y * (0.0217540484 + y * 0.0065407983)))));
        return Math.Sqrt(y * y + y / polynomial);
    }
}
