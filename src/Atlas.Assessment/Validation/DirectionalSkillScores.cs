namespace Atlas.Assessment.Validation;

/// <summary>
/// Agreement between modelled and observed directions (degrees), computed on the circle from the
/// signed smallest angle d = model - observed in (-180, 180] (positive: model clockwise of observed).
/// </summary>
/// <param name="Count">N, the number of pairs used.</param>
/// <param name="CircularMeanObservedDegrees">Circular mean of the observed directions, [0, 360); NaN when they cancel out.</param>
/// <param name="CircularMeanModelledDegrees">Circular mean of the modelled directions, [0, 360); NaN when they cancel out.</param>
/// <param name="CircularBiasDegrees">Circular mean of d: atan2(mean sin d, mean cos d), in (-180, 180].</param>
/// <param name="CircularRmseDegrees">sqrt(mean(d^2)).</param>
/// <param name="MeanAbsoluteDifferenceDegrees">mean(|d|).</param>
public sealed record DirectionalSkillScores(
    int Count,
    double CircularMeanObservedDegrees,
    double CircularMeanModelledDegrees,
    double CircularBiasDegrees,
    double CircularRmseDegrees,
    double MeanAbsoluteDifferenceDegrees);
