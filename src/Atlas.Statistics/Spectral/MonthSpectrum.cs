namespace Atlas.Statistics.Spectral;

/// <summary>Sums over the steps of one station-month of a spectral output point.</summary>
/// <param name="Year">Calendar year (UTC).</param>
/// <param name="Month">Calendar month 1..12.</param>
/// <param name="Steps">Steps summed.</param>
/// <param name="FrequencySum">Sum of S(f) over the steps, m^2 s, one value per frequency.</param>
/// <param name="DirectionSum">Sum of each direction bin's power over the steps, kW/m, one value per direction (empty for S(f)).</param>
public sealed record MonthSpectrum(int Year, int Month, int Steps, double[] FrequencySum, double[] DirectionSum);
