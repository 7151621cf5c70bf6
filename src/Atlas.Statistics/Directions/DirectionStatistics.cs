using System.Text.Json.Serialization;

namespace Atlas.Statistics.Directions;

/// <summary>
/// Power-weighted direction statistics of one period, over the steps with both power and a mean direction.
/// </summary>
/// <param name="Mean">Circular mean of the direction the waves come from, weighted by power, degrees 0..360; NaN when no step counts.</param>
/// <param name="Spread">Power-weighted circular spread of the step directions, sqrt(2 (1 - R)) in degrees (the wave convention); NaN when no step counts.</param>
/// <param name="Count">Steps with both power and direction.</param>
/// <param name="Coverage">Count over expected steps.</param>
/// <param name="PowerRose">Fraction of the energy flux coming from each of <see cref="Sectors"/> sectors of 22.5 degrees, sector 0 centred on north, clockwise; empty when no step counts or the power is all zero.</param>
/// <param name="DirectionalityCoefficient">The period's directionality coefficient (IEC TS 62600-101): the largest
/// period-mean directionally resolved power J_theta over the period-mean omnidirectional power, 1/pi..1. From gridded
/// fields each step's directional distribution is modelled (cosine-2s about the mean direction, s from the spread);
/// NaN (null) without spread or direction.</param>
/// <param name="MaxPowerFromDeg">The direction theta of that largest J_theta, waves coming from, degrees true 0..360; NaN (null) with the coefficient.</param>
public sealed record DirectionStatistics(
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double Mean,
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double Spread,
    long Count,
    double Coverage,
    [property: JsonConverter(typeof(DataPrecisionListJsonConverter))] IReadOnlyList<double> PowerRose,
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double DirectionalityCoefficient = double.NaN,
    [property: JsonConverter(typeof(DataPrecisionJsonConverter))] double MaxPowerFromDeg = double.NaN)
{
    /// <summary>Number of sectors of the power rose.</summary>
    public const int Sectors = 16;

    /// <summary>Width of a rose sector, degrees.</summary>
    public const double SectorWidthDegrees = 360.0 / Sectors;

    /// <summary>Nothing to report.</summary>
    public static DirectionStatistics Empty { get; } = new(double.NaN, double.NaN, 0, 0, []);
}
