namespace Atlas.Demo;

/// <summary>
/// One buoy record row as written: values already rounded to the instrument's resolution.
/// NaN marks a value the buoy did not deliver (only on flagged rows).
/// </summary>
/// <param name="Time">Instant of the record (UTC).</param>
/// <param name="Hs">Significant wave height, m.</param>
/// <param name="Tp">Peak period, s.</param>
/// <param name="Te">Energy period, s.</param>
/// <param name="FromDegrees">Mean direction (coming from), degrees true.</param>
/// <param name="Quality">Quality flag: 0 good, 1 suspect (a spike), 2 bad (a dropout).</param>
public readonly record struct BuoyObservation(DateTime Time, double Hs, double Tp, double Te, double FromDegrees, int Quality);
