namespace Atlas.Assessment.Validation;

/// <summary>Agreement between modelled and observed values of a scalar variable (NaN where undefined).</summary>
/// <param name="Count">N, the number of pairs used.</param>
/// <param name="MeanObserved">Mean of the observed values.</param>
/// <param name="MeanModelled">Mean of the modelled values.</param>
/// <param name="Bias">mean(model - observed).</param>
/// <param name="Rmse">sqrt(mean((model - observed)^2)).</param>
/// <param name="ScatterIndex">RMSE / mean(observed); NaN when the observed mean is 0.</param>
/// <param name="BiasCorrectedScatterIndex">std(model - observed) / mean(observed), with the population
/// standard deviation (divisor N), so that RMSE^2 = bias^2 + std^2.</param>
/// <param name="PearsonR">Pearson correlation coefficient; NaN with fewer than two pairs or no variance.</param>
/// <param name="SymmetricSlope">sqrt(sum(model^2) / sum(observed^2)): the slope of a line through the
/// origin that treats both series alike; 1 when the two agree in magnitude.</param>
/// <param name="RegressionSlope">Ordinary least-squares slope b of model = a + b observed.</param>
/// <param name="RegressionIntercept">Ordinary least-squares intercept a of model = a + b observed.</param>
public sealed record SkillScores(
    int Count,
    double MeanObserved,
    double MeanModelled,
    double Bias,
    double Rmse,
    double ScatterIndex,
    double BiasCorrectedScatterIndex,
    double PearsonR,
    double SymmetricSlope,
    double RegressionSlope,
    double RegressionIntercept);
