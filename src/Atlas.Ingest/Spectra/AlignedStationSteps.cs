namespace Atlas.Ingest.Spectra;

/// <summary>The per-step spectral values of one output point, aligned with its decoded series (NaN where missing).</summary>
public sealed class AlignedStationSteps(float[][] values)
{
    /// <summary>The values of one product, one per step of the series.</summary>
    public float[] this[SpectralProduct product] => values[(int)product];
}
