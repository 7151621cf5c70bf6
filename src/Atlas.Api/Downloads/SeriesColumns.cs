using Atlas.WavePhysics;
using Atlas.Ingest.Spectra;

namespace Atlas.Api.Downloads;

/// <summary>One column of a point's series download: its name, units, CF names and values per step.</summary>
public sealed record SeriesColumn(string Name, string Units, string? StandardName, string LongName, float[] Values, string CsvPattern, int JsonDigits);

/// <summary>
/// The columns of a point's series download: hs, te, tp, dir, spread and j at every point; at an output point of a spectral
/// hindcast j is the power integrated from its spectra, and the spectral values follow (j_parametric, directionality,
/// max_power_from_deg, spectral_width).
/// </summary>
public static class SeriesColumns
{
    public static (IReadOnlyList<SeriesColumn> Columns, bool TeFromTp) Of(PointSeries s, SpectrumShape spectrum, AlignedStationSteps? spectral)
    {
        var (te, power, teFromTp) = s.Derived(spectrum);
        float[] Absent() { var a = new float[s.Times.Length]; Array.Fill(a, float.NaN); return a; }
        var columns = new List<SeriesColumn>
        {
            new("hs", "m", "sea_surface_wave_significant_height", "spectral significant wave height Hm0", s.Hs, "0.###", 3),
            new("te", "s", "sea_surface_wave_mean_period_from_variance_spectral_density_inverse_frequency_moment", "energy period Tm-1,0", te, "0.###", 3),
            new("tp", "s", "sea_surface_wave_period_at_variance_spectral_density_maximum", "peak period", s.HasTp ? s.Tp : Absent(), "0.##", 2),
            new("dir", "degree", "sea_surface_wave_from_direction", "mean direction the waves come from, degrees true", s.HasDir ? s.Dir : Absent(), "0.##", 2),
            new("spread", "degree", "sea_surface_wave_directional_spread", "directional spread", s.HasSpread ? s.Spread : Absent(), "0.##", 2),
        };
        if (spectral is null)
        {
            columns.Add(new("j", "kW m-1", null, "omnidirectional wave power from Hm0 and Te at the cell depth", power, "0.###", 3));
            return (columns, teFromTp);
        }
        columns.Add(new("j", "kW m-1", null, "omnidirectional wave power integrated from the spectrum at the station depth", spectral[SpectralProduct.Power], "0.###", 3));
        columns.Add(new("j_parametric", "kW m-1", null, "wave power from Hm0 and Te alone at the station depth, for comparison",
            spectral[SpectralProduct.ParametricPower], "0.###", 3));
        columns.Add(new("directionality", "1", null, "directionality coefficient: largest directionally resolved power over the omnidirectional power",
            spectral[SpectralProduct.Directionality], "0.####", 4));
        columns.Add(new("max_power_from_deg", "degree", null, "direction of the largest directionally resolved power, waves coming from, degrees true",
            spectral[SpectralProduct.MaximumPowerFrom], "0.##", 2));
        columns.Add(new("spectral_width", "1", null, "spectral width eps0 = sqrt(m0 m-2 / m-1^2 - 1)", spectral[SpectralProduct.SpectralWidth], "0.####", 4));
        return (columns, teFromTp);
    }

    /// <summary>The units of every column, in one line.</summary>
    public static string UnitsLine(IReadOnlyList<SeriesColumn> columns) =>
        "time UTC (ISO 8601); " + string.Join("; ", columns.Select(c => $"{c.Name} {(c.Units == "kW m-1" ? "kW/m" : c.Units)}"));
}
