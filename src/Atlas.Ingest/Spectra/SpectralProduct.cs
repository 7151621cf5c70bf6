namespace Atlas.Ingest.Spectra;

/// <summary>The per-step values of a spectral output point kept beside its series, in the order they are stored.</summary>
public enum SpectralProduct
{
    /// <summary>J integrated from the spectrum with each frequency's group velocity at the station depth, kW/m.</summary>
    Power,
    /// <summary>J from Hm0 and Te alone (the gridded fields' formula), kW/m, for comparison.</summary>
    ParametricPower,
    /// <summary>d = J_theta,max / J of the step.</summary>
    Directionality,
    /// <summary>Direction of the step's largest resolved power, degrees, waves coming from.</summary>
    MaximumPowerFrom,
    /// <summary>Spectral width eps0.</summary>
    SpectralWidth,
}

/// <summary>Facts about <see cref="SpectralProduct"/>.</summary>
public static class SpectralProducts
{
    public const int Count = 5;

    public static IReadOnlyList<SpectralProduct> All { get; } = Enum.GetValues<SpectralProduct>();

    /// <summary>The name of a product in JSON, CSV columns and NetCDF variables.</summary>
    public static string Name(this SpectralProduct product) => product switch
    {
        SpectralProduct.Power => "j_spectral",
        SpectralProduct.ParametricPower => "j_parametric",
        SpectralProduct.Directionality => "directionality",
        SpectralProduct.MaximumPowerFrom => "max_power_from_deg",
        SpectralProduct.SpectralWidth => "spectral_width",
        _ => throw new ArgumentOutOfRangeException(nameof(product)),
    };

    public static string Units(this SpectralProduct product) => product switch
    {
        SpectralProduct.Power or SpectralProduct.ParametricPower => "kW m-1",
        SpectralProduct.MaximumPowerFrom => "degree",
        _ => "1",
    };
}
