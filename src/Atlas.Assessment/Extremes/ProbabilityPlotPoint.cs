namespace Atlas.Assessment.Extremes;

/// <summary>
/// One point of the fit diagnostics, for a probability plot (<see cref="EmpiricalProbability"/> against
/// <see cref="FittedProbability"/>) and a quantile plot (<see cref="FittedQuantile"/> against <see cref="Value"/>).
/// </summary>
/// <param name="Value">The i-th smallest data value (an annual maximum, or a storm peak).</param>
/// <param name="EmpiricalProbability">Plotting position i/(n + 1) (Weibull; as in Coles 2001, §3.3.3).</param>
/// <param name="FittedProbability">The fitted distribution's non-exceedance probability at <see cref="Value"/>
/// (for peaks over a threshold: conditional on exceeding it).</param>
/// <param name="FittedQuantile">The fitted quantile at <see cref="EmpiricalProbability"/>.</param>
public sealed record ProbabilityPlotPoint(double Value, double EmpiricalProbability, double FittedProbability, double FittedQuantile);
