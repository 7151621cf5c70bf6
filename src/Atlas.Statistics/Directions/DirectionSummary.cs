namespace Atlas.Statistics.Directions;

/// <summary>
/// <see cref="DirectionStatistics"/> without its power rose, which the caller keeps (the form the layer pass reads, with
/// nothing allocated per period).
/// </summary>
/// <param name="Mean">Power-weighted circular mean direction, degrees; NaN when no step counts.</param>
/// <param name="Spread">Power-weighted circular spread, degrees; NaN when no step counts.</param>
/// <param name="Count">Steps with both power and direction.</param>
/// <param name="Coverage">Count over expected steps.</param>
/// <param name="HasRose">True when the power rose was written (some step counts and the power is not all zero).</param>
public readonly record struct DirectionSummary(double Mean, double Spread, long Count, double Coverage, bool HasRose)
{
    /// <summary>Nothing to report.</summary>
    public static DirectionSummary Empty { get; } = new(double.NaN, double.NaN, 0, 0, false);

    /// <summary>As <see cref="DirectionStatistics"/>, with the rose the summary was made with.</summary>
    public DirectionStatistics ToStatistics(ReadOnlySpan<double> rose, double directionalityCoefficient = double.NaN, double maxPowerFromDeg = double.NaN) =>
        new(Mean, Spread, Count, Coverage, HasRose ? rose[..DirectionStatistics.Sectors].ToArray() : DirectionStatistics.Empty.PowerRose,
            directionalityCoefficient, maxPowerFromDeg);
}
