using System.Text.Json.Serialization;

namespace Atlas.Ingest.Spectra;

/// <summary>The exact spectral values of one output point: what its spectra give that gridded fields cannot.</summary>
/// <param name="Dataset">The dataset of output points.</param>
/// <param name="Station">The output point's name.</param>
/// <param name="CellId">Its cell id in that dataset.</param>
/// <param name="DistanceKm">Geodesic distance from the asked position, km; null when the answer is the point's own.</param>
/// <param name="FrequenciesHz">The frequencies of <see cref="SpectralPeriod.FrequencySpectrum"/>; null (left out) when the spectra were not asked for.</param>
/// <param name="DirectionsFromDeg">The direction bins of <see cref="SpectralPeriod.DirectionPower"/>, waves coming from; null (left out) when the spectra were not asked for.</param>
/// <param name="Periods">One entry per period with steps.</param>
/// <param name="Method">How every value was computed, in words.</param>
public sealed record SpectralPointAnswer(
    string Dataset,
    string Station,
    int CellId,
    double Lat,
    double Lon,
    double? DepthM,
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double? DistanceKm,
    [property: JsonIgnore(Condition = JsonIgnoreCondition.WhenWritingNull)] IReadOnlyList<double>? FrequenciesHz,
    [property: JsonIgnore(Condition = JsonIgnoreCondition.WhenWritingNull)] IReadOnlyList<double>? DirectionsFromDeg,
    IReadOnlyList<SpectralPeriod> Periods,
    string Method)
{
    /// <summary>
    /// The answer with its period summaries alone: the period-mean frequency spectra, direction powers and their axes
    /// left out (for a client that did not ask for them; they are chart data, several hundred numbers).
    /// </summary>
    public SpectralPointAnswer WithoutSpectra() => this with
    {
        FrequenciesHz = null,
        DirectionsFromDeg = null,
        Periods = [.. Periods.Select(p => p with { FrequencySpectrum = null, DirectionPower = null })],
    };
}

/// <summary>One period at an output point.</summary>
/// <param name="MeanPowerSpectral">Mean J integrated from the spectra, kW/m (month-balanced like every period mean).</param>
/// <param name="MeanPowerParametric">Mean J from Hm0 and Te alone at the same depth, kW/m, for comparison.</param>
/// <param name="ParametricOverSpectral">MeanPowerParametric / MeanPowerSpectral.</param>
/// <param name="DirectionalityCoefficient">From the period-mean J_theta of the spectra (IEC TS 62600-101).</param>
/// <param name="MaxPowerFromDeg">Direction of the largest period-mean J_theta, waves coming from, degrees.</param>
/// <param name="MeanSpectralWidth">Mean eps0 over the period's steps.</param>
/// <param name="FrequencySpectrum">Period-mean S(f), m^2/Hz; null (left out) when the spectra were not asked for.</param>
/// <param name="DirectionPower">Period-mean power per direction bin, kW/m; null (left out) when the spectra were not asked for.</param>
public sealed record SpectralPeriod(
    AtlasPeriod Period,
    long Steps,
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double MeanPowerSpectral,
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double MeanPowerParametric,
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double ParametricOverSpectral,
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double DirectionalityCoefficient,
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double MaxPowerFromDeg,
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double MeanSpectralWidth,
    [property: JsonConverter(typeof(DataPrecisionListJsonConverter)), JsonIgnore(Condition = JsonIgnoreCondition.WhenWritingNull)] IReadOnlyList<double>? FrequencySpectrum,
    [property: JsonConverter(typeof(DataPrecisionListJsonConverter)), JsonIgnore(Condition = JsonIgnoreCondition.WhenWritingNull)] IReadOnlyList<double>? DirectionPower);
