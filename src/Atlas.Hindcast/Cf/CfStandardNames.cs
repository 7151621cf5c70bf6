namespace Atlas.Hindcast;

/// <summary>The CF standard names that identify each wave variable, and the look-alikes that must not be taken for them.</summary>
public static class CfStandardNames
{
    public const string SignificantHeight = "sea_surface_wave_significant_height";
    public const string EnergyPeriod = "sea_surface_wave_mean_period_from_variance_spectral_density_inverse_frequency_moment";
    public const string PeakPeriod = "sea_surface_wave_period_at_variance_spectral_density_maximum";
    public const string FromDirection = "sea_surface_wave_from_direction";
    public const string ToDirection = "sea_surface_wave_to_direction";
    public const string DirectionalSpread = "sea_surface_wave_directional_spread";

    /// <summary>
    /// Peak frequency as spectral-model output names it (fp = 1 / Tp). Not in the CF standard-name table as far as we
    /// recall (from memory); taken because it says unambiguously what the variable is.
    /// </summary>
    public const string PeakFrequency = "sea_surface_wave_peak_frequency";

    /// <summary>The CF-style long form of the peak frequency name (from memory, by analogy with the peak period name).</summary>
    public const string PeakFrequencyAtSpectralMaximum = "sea_surface_wave_frequency_at_variance_spectral_density_maximum";

    /// <summary>
    /// CF "depth": distance below the surface, positive down by definition, but files that write it for the water
    /// depth sometimes say positive = "up", and that attribute is honoured (the value is negated).
    /// </summary>
    public const string Depth = "depth";

    /// <summary>Peak-frequency names: a variable carrying one becomes Tp by its reciprocal.</summary>
    public static readonly IReadOnlyList<string> PeakFrequencies = [PeakFrequency, PeakFrequencyAtSpectralMaximum];

    /// <summary>
    /// Names spectral models and ocean models give the water depth (common practice). A horizontal field with a length
    /// unit and one of these names, and no standard_name saying otherwise, is taken as the depth, and the ingest summary
    /// says it was matched by its name.
    /// </summary>
    public static readonly IReadOnlyList<string> WaterDepthNames = ["dpt", "depth", "wdepth", "deptho"];

    /// <summary>Depth names, positive down by their CF definition.</summary>
    public static readonly IReadOnlyList<string> DepthPositiveDown =
    [
        "sea_floor_depth_below_sea_surface",
        "sea_floor_depth_below_mean_sea_level",
        "sea_floor_depth_below_geoid",
        "sea_floor_depth_below_reference_ellipsoid",
    ];

    /// <summary>
    /// Elevation names, positive up: bathymetry grids store the sea floor as a negative altitude, so depth = -value
    /// and land (positive altitude) becomes a negative depth, hence dry.
    /// </summary>
    public static readonly IReadOnlyList<string> ElevationPositiveUp =
    [
        "altitude",
        "surface_altitude",
        "height_above_mean_sea_level",
        "height_above_geoid",
        "height_above_reference_ellipsoid",
    ];

    /// <summary>
    /// Wave periods that are not Te or Tp. They are never taken for either (Tm01 and Tm02 differ from Te by
    /// a spectrum-shape dependent ratio); they are named in the error when neither Te nor Tp is present.
    /// </summary>
    public static readonly IReadOnlyDictionary<string, string> OtherPeriods = new Dictionary<string, string>
    {
        ["sea_surface_wave_mean_period_from_variance_spectral_density_first_frequency_moment"] = "Tm01",
        ["sea_surface_wave_mean_period_from_variance_spectral_density_second_frequency_moment"] = "Tm02",
        ["sea_surface_wave_zero_upcrossing_period"] = "Tz",
        ["sea_surface_wave_mean_period"] = "an unspecified mean period",
        ["sea_surface_wave_significant_period"] = "T1/3",
        ["sea_surface_wave_period_of_highest_wave"] = "Tmax",
    };

    /// <summary>The standard names accepted for <paramref name="variable"/>.</summary>
    public static IReadOnlyList<string> For(WaveParameter variable) => variable switch
    {
        WaveParameter.Hs => [SignificantHeight],
        WaveParameter.Te => [EnergyPeriod],
        WaveParameter.Tp => [PeakPeriod, .. PeakFrequencies],
        WaveParameter.Dir => [FromDirection, ToDirection],
        WaveParameter.Spread => [DirectionalSpread],
        _ => [.. DepthPositiveDown, .. ElevationPositiveUp, Depth],
    };

    /// <summary>The wave variable a standard name identifies, or null.</summary>
    public static WaveParameter? Identify(string? standardName)
    {
        if (string.IsNullOrEmpty(standardName)) return null;
        foreach (var v in WaveParameterGroups.HindcastFields)
            if (For(v).Contains(standardName)) return v;
        return null;
    }

    /// <summary>Conventional names that suggest a variable in error hints only; they are never matched silently.</summary>
    internal static IReadOnlyList<string> NameHints(WaveParameter variable) => variable switch
    {
        WaveParameter.Hs => ["hs", "swh", "hm0", "vhm0", "hsig", "hsign"],
        WaveParameter.Te => ["te", "tm10", "tm_10", "tmm10", "t0m1", "vtm10"],
        WaveParameter.Tp => ["tp", "tpeak", "vtpk", "tpk", "fp", "fpeak"],
        WaveParameter.Dir => ["dir", "mwd", "vmdr", "dirm", "mdir", "theta"],
        WaveParameter.Spread => ["spr", "dspr", "spread", "vspr"],
        _ => ["depth", "dpt", "bathymetry", "deptho", "wdepth"],
    };

    /// <summary>The quantity a wave variable carries.</summary>
    public static PhysicalQuantity QuantityOf(WaveParameter variable) => variable switch
    {
        WaveParameter.Hs or WaveParameter.Depth => PhysicalQuantity.Length,
        WaveParameter.Te or WaveParameter.Tp => PhysicalQuantity.Time,
        _ => PhysicalQuantity.Angle,
    };
}
