namespace Atlas.Storage.Spectra;

/// <summary>The per-step spectral values of one station-year, aligned with the year's time line (NaN where missing).</summary>
public sealed record StationStepRecord(int CellId, int Year, float[] PowerSpectral, float[] PowerParametric, float[] Directionality,
    float[] MaximumPowerFrom, float[] SpectralWidth);

/// <summary>Sums over the steps of one station-month: the frequency spectrum (m^2 s) and each direction bin's power (kW/m).</summary>
public sealed record StationMonthSums(int CellId, int Year, int Month, int Steps, double[] FrequencySum, double[] DirectionSum);
