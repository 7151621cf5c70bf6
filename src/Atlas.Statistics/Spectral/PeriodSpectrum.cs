using System.Text.Json.Serialization;
using Atlas.Statistics.Serialization;

namespace Atlas.Statistics.Spectral;

/// <summary>The mean spectrum and mean directionally resolved power of one period at a spectral output point.</summary>
/// <param name="Period">The period.</param>
/// <param name="Steps">Steps averaged.</param>
/// <param name="DirectionalityCoefficient">max over theta of the period-mean J_theta over the period-mean J (IEC TS 62600-101); null without directions.</param>
/// <param name="MaxPowerFromDeg">The direction of that largest period-mean J_theta, waves coming from, degrees; null without directions.</param>
/// <param name="MeanPowerFromSpectra">The period-mean J, kW/m: the sum of <paramref name="DirectionPower"/> (null without directions).</param>
/// <param name="FrequencySpectrum">Period-mean S(f), m^2 s (m^2/Hz), on the dataset's frequencies.</param>
/// <param name="DirectionPower">Period-mean power of each direction bin, kW/m, on the dataset's directions (waves coming from).</param>
public sealed record PeriodSpectrum(
    AtlasPeriod Period,
    long Steps,
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double DirectionalityCoefficient,
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double MaxPowerFromDeg,
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double MeanPowerFromSpectra,
    [property: JsonConverter(typeof(DataPrecisionListJsonConverter))] IReadOnlyList<double> FrequencySpectrum,
    [property: JsonConverter(typeof(DataPrecisionListJsonConverter))] IReadOnlyList<double> DirectionPower);
