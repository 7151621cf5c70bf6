namespace Atlas.WavePhysics;

/// <summary>
/// A linear (Airy) wave of one period at one depth, as solved by <see cref="DispersionRelation.Solve"/>.
/// </summary>
/// <param name="PeriodSeconds">Wave period T, s.</param>
/// <param name="DepthMetres">Still-water depth h, m; +infinity for deep water.</param>
/// <param name="WaveNumber">k = 2 pi / L, rad/m.</param>
/// <param name="Wavelength">L, m.</param>
/// <param name="PhaseSpeed">c = omega / k, m/s.</param>
/// <param name="GroupVelocity">cg = n c, m/s.</param>
/// <param name="GroupToPhaseSpeedRatio">n = cg / c = (1 + 2kh / sinh 2kh) / 2; 1/2 in deep water, 1 in the shallow limit.</param>
public readonly record struct LinearWave(
    double PeriodSeconds,
    double DepthMetres,
    double WaveNumber,
    double Wavelength,
    double PhaseSpeed,
    double GroupVelocity,
    double GroupToPhaseSpeedRatio)
{
    /// <summary>kh, the relative depth (dimensionless); +infinity in deep water.</summary>
    public double RelativeDepth => WaveNumber * DepthMetres;
}
